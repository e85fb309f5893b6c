import { afterAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeBrowser, openApp } from './harness';
import { openDemoModels } from './demo-models';
import { fitDistribution as fit, leaveOutRowsWithoutOffset } from './models-steps';
import { chartBox, seriesOf } from './chart-probe';
import { gridRows, linkedLabel } from './records-probe';
import { DEMO_TRUTH } from '@shared/demo/truth';

// The diagnostic charts from the keyboard alone, in Chromium on the demo
// project with the real fit and diagnostics workers (a negative binomial
// for the common toad): a chart is reached with Tab, the arrow keys pick
// out a point (checked against the series echarts holds), Enter opens the
// Records stage on the visit records behind it, and the chart carries its
// title as its name and a summary in words.

afterAll(closeBrowser);

const toad = DEMO_TRUTH.species.find((s) => s.key === 'common_toad')!;

/** The test id of the chart that holds the focus (its figure's), or '' when the focus is elsewhere. */
function focusedChart(page: Page): Promise<string> {
  return page.evaluate(() => {
    const el = document.activeElement;
    return el?.classList.contains('chart-box') ? (el.closest('figure')?.getAttribute('data-testid') ?? '') : '';
  });
}

function activePoint(page: Page, id: string): Promise<string | null> {
  return chartBox(page, id).getAttribute('data-active-point');
}

describe('the diagnostic charts from the keyboard', () => {
  it('Tab reaches a chart, arrows choose a point, Enter shows its records', async () => {
    const app = await openApp({ width: 1366, height: 768 });
    const { page } = app;
    try {
      await openDemoModels(app, toad.label);
      await leaveOutRowsWithoutOffset(page);
      await fit(page, 'negbin', 1);
      const residuals = (await seriesOf(page, 'residuals'))[0].data as number[][];
      expect(residuals.length).toBeGreaterThan(100);

      // The chart has its title as its name and a summary in words; a chart without links to records is not a Tab stop.
      const box = chartBox(page, 'residuals');
      await expect.poll(() => box.getAttribute('aria-label')).toBe('Is anything left over? Residuals against fitted values');
      const summary = await box.evaluate((el) => document.getElementById(el.getAttribute('aria-describedby') ?? '')?.textContent ?? '');
      expect(summary).toContain(`(${residuals.length} points)`);
      expect(summary).toContain('Arrow keys move between points');
      await expect.poll(() => chartBox(page, 'frequencies').getAttribute('tabindex')).toBeNull();

      // From the last control of the chart before it, Tab lands on the residual chart.
      await page.getByTestId('chart-rootogram').getByRole('button', { name: 'Save SVG' }).focus();
      await page.keyboard.press('Tab');
      await expect.poll(() => focusedChart(page)).toBe('chart-residuals');
      const said = page.getByTestId('chart-residuals').getByTestId('chart-point');
      await expect.poll(() => said.textContent()).toBe('Choose a point with the arrow keys; Enter shows its records.');

      // Up from no point chosen picks the largest residual: the point echarts holds at that index is the top one.
      await page.keyboard.press('ArrowUp');
      await expect.poll(() => activePoint(page, 'residuals')).toMatch(/^residuals:\d+$/);
      const top = Number((await activePoint(page, 'residuals'))!.split(':')[1]);
      expect(residuals[top][1]).toBe(Math.max(...residuals.map((p) => p[1])));
      // Right moves on along the fitted values, Left comes back to the same point.
      await page.keyboard.press('ArrowRight');
      await expect.poll(() => activePoint(page, 'residuals')).not.toBe(`residuals:${top}`);
      const right = Number((await activePoint(page, 'residuals'))!.split(':')[1]);
      expect(residuals[right][0]).toBeGreaterThanOrEqual(residuals[top][0]);
      await page.keyboard.press('ArrowLeft');
      await expect.poll(() => activePoint(page, 'residuals')).toBe(`residuals:${top}`);
      // The chosen point is said in words under the chart, and its tooltip is up.
      await expect.poll(() => said.textContent()).toMatch(/^Common toad at .+, season \d{4}: .*Enter shows its records\.$/);
      const m = /^Common toad at (.+), season (\d{4}):/.exec((await said.textContent()) ?? '')!;
      await expect.poll(() => page.getByTestId('chart-residuals').locator('.chart-box > div').filter({ hasText: 'Negative binomial' }).count()).toBeGreaterThan(0);
      await said.scrollIntoViewIfNeeded();
      await expect.poll(() => focusedChart(page)).toBe('chart-residuals');
      await app.screenshot('models-diagnostics-keyboard-point');

      // Enter shows the visit records of that site and season on the Records stage.
      await page.keyboard.press('Enter');
      const label = await linkedLabel(page);
      expect(label).toContain(`Common toad at ${m[1]}, season ${m[2]}`);
      const rows = await gridRows(page);
      expect(rows.length).toBeGreaterThanOrEqual(1);
      for (const r of rows) expect(r).toEqual({ site: m[1], season: m[2], species: toad.label });
      await expect.poll(() => page.getByTestId('records-shown').textContent()).toMatch(new RegExp(`^Showing ${rows.length} of`));
      await app.screenshot('models-diagnostics-keyboard-records');

      // Influence by site: from the chart before it, Tab, then End picks the last site's bar; Enter shows that site's records.
      await page.getByRole('button', { name: 'Models' }).click();
      const bars = (await seriesOf(page, 'influence'))[0].data as { value: number | null; site: string }[];
      await page.getByTestId('chart-mean-variance').getByRole('button', { name: 'Save SVG' }).focus();
      await page.keyboard.press('Tab');
      await expect.poll(() => focusedChart(page)).toBe('chart-influence');
      await page.keyboard.press('End');
      const last = bars.reduce((k, b, i) => (b.value !== null ? i : k), -1);
      await expect.poll(() => activePoint(page, 'influence')).toBe(`change:${last}`);
      // Escape lets the bar go; Home then picks the first.
      await page.keyboard.press('Escape');
      await expect.poll(() => activePoint(page, 'influence')).toBeNull();
      await page.keyboard.press('End');
      await expect.poll(() => activePoint(page, 'influence')).toBe(`change:${last}`);
      await page.keyboard.press('Enter');
      await expect(linkedLabel(page)).resolves.toContain(`Common toad at ${bars[last].site},`);
      const siteRows = await gridRows(page);
      expect(new Set(siteRows.map((r) => r.site))).toEqual(new Set([bars[last].site]));
      expect(new Set(siteRows.map((r) => r.season)).size).toBeGreaterThan(1);
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
  });
});
