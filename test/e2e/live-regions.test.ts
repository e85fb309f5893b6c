import { afterAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeBrowser, openApp } from './harness';
import { openDemoModels } from './demo-models';
import { leaveOutRowsWithoutOffset } from './models-steps';
import { chartBox, seriesOf } from './chart-probe';
import { DEMO_TRUTH } from '@shared/demo/truth';

// What a screen reader is told without asking, in Chromium on the demo
// project: the stage is not a live region (a change of stage, a table or a
// chart is not read out whole), while the status lines are: the fit's
// progress and its summary, each point chosen on a chart. A live region
// holds a short message, never a table, grid or chart. The line under a
// chart that says the chosen point keeps its height, so nothing below moves.

afterAll(closeBrowser);

const toad = DEMO_TRUTH.species.find((s) => s.key === 'common_toad')!;
const LIVE = '[aria-live], [role="status"], [role="alert"], [role="log"]';

interface Region {
  what: string;
  text: number;
  holdsContent: boolean;
}

/** Every live region on the page: what it is, how long its text is, and whether it holds a table, grid or chart. */
function liveRegions(page: Page): Promise<Region[]> {
  return page.evaluate(
    (live) =>
      [...document.querySelectorAll(live)].map((el) => ({
        what: `${el.tagName.toLowerCase()}[${el.getAttribute('role') ?? `aria-live=${el.getAttribute('aria-live')}`}] ${el.getAttribute('data-testid') ?? ''}`,
        text: (el.textContent ?? '').trim().length,
        holdsContent: !!el.querySelector('table, canvas, figure, [role="grid"], [role="table"], main, section'),
      })),
    LIVE,
  );
}

/** The live region around an element of the stage, if any. */
function liveAround(page: Page, testId: string): Promise<string | null> {
  return page.getByTestId(testId).evaluate((el, live) => el.closest(live)?.outerHTML.slice(0, 80) ?? null, LIVE);
}

describe('live regions', () => {
  it('the stage is not live; progress, the fit summary and a chosen point are', async () => {
    const app = await openApp({ width: 1366, height: 768 });
    const { page } = app;
    try {
      await openDemoModels(app, toad.label);
      await expect.poll(() => page.locator('#workspace').getAttribute('aria-live')).toBeNull();
      await leaveOutRowsWithoutOffset(page);
      await page.getByLabel('Distribution').selectOption('negbin');
      await page.getByTestId('fit-button').click();
      // The fit's progress is a status line while it runs (or its summary once done, on a fast machine).
      await expect.poll(async () => (await liveRegions(page)).some((r) => /fit-progress|models-note/.test(r.what))).toBe(true);
      await page.getByTestId('comparison').locator('tbody tr').first().waitFor({ timeout: 120_000 });
      await expect.poll(() => page.getByTestId('models-note').getAttribute('role')).toBe('status');
      await expect.poll(() => page.getByTestId('models-note').textContent()).toContain('Fitted');
      await seriesOf(page, 'residuals');

      // The comparison table and the charts sit in no live region.
      await expect(liveAround(page, 'comparison')).resolves.toBeNull();
      await expect(liveAround(page, 'chart-residuals')).resolves.toBeNull();
      const regions = await liveRegions(page);
      expect(regions.filter((r) => r.holdsContent)).toEqual([]);
      for (const r of regions) expect(r.text, r.what).toBeLessThan(400);
      // Each chart with points to choose has its own status line.
      expect(regions.filter((r) => r.what.includes('chart-point')).length).toBeGreaterThan(0);

      // A point chosen from the keyboard is said in the chart's status line, which keeps its height (and so does the chart).
      const figure = page.getByTestId('chart-residuals');
      const heights = async () => ({ figure: (await figure.boundingBox())!.height, caption: (await figure.locator('figcaption').boundingBox())!.height });
      await figure.scrollIntoViewIfNeeded();
      const before = await heights();
      await chartBox(page, 'residuals').focus();
      await page.keyboard.press('ArrowUp');
      await expect.poll(() => chartBox(page, 'residuals').getAttribute('data-active-point')).toMatch(/^residuals:\d+$/);
      const said = figure.getByRole('status');
      await expect.poll(() => said.textContent()).toMatch(/^Common toad at .+, season \d{4}: .+ Point \d+ of \d+ from the left; Enter shows its records\.$/);
      expect(await said.getAttribute('data-testid')).toBe('chart-point');
      expect(await heights()).toEqual(before);
      await app.screenshot('live-regions-chosen-point');
      await page.keyboard.press('Escape');

      // Going to another stage changes the stage without a live region around it.
      await page.getByRole('navigation', { name: 'Work stages' }).getByRole('button', { name: /Records/ }).click();
      await page.getByTestId('records-grid').waitFor();
      await expect(liveAround(page, 'records-grid')).resolves.toBeNull();
      expect((await liveRegions(page)).filter((r) => r.holdsContent)).toEqual([]);
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
  });
});
