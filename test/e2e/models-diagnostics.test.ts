import { afterAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { closeBrowser, openApp } from './harness';
import { openDemoModels } from './demo-models';
import { fitDistribution as fit, leaveOutRowsWithoutOffset } from './models-steps';
import { categoriesOf, clickAt, seriesOf } from './chart-probe';
import { gridRows, linkedLabel } from './records-probe';
import { DEMO_TRUTH } from '@shared/demo/truth';

// The diagnostic charts of the Models stage in Chromium, on the demo
// project with the real fit and diagnostics workers: Poisson and negative
// binomial for the common toad, the negative binomial shown. Each chart is
// read through its echarts instance (series and point counts), a residual
// point and an influence bar are clicked and must land on their records in
// the cleaning grid, and charts are saved as PNG and SVG.

afterAll(closeBrowser);

const toad = DEMO_TRUTH.species.find((s) => s.key === 'common_toad')!;
const seasons = DEMO_TRUTH.lastSeason - DEMO_TRUTH.firstSeason + 1;


describe('the diagnostic charts', () => {
  it('draws every chart with its series, links points to records, and saves PNG and SVG', async () => {
    const app = await openApp({ width: 1366, height: 768 });
    const { page } = app;
    try {
      await openDemoModels(app, toad.label);
      await leaveOutRowsWithoutOffset(page);
      await fit(page, 'poisson', 1);
      await fit(page, 'negbin', 2);

      // Residuals against fitted values: one point per analysis row of the model.
      const residuals = await seriesOf(page, 'residuals');
      expect(residuals.map((s) => s.id)).toEqual(['residuals']);
      const n = residuals[0].data.length;
      expect(n).toBeGreaterThan(100);
      // Against season: the same points and a median per season (the demo's seasons, firstSeason..lastSeason).
      const bySeason = await seriesOf(page, 'residuals-season');
      expect(bySeason.map((s) => s.id)).toEqual(['residuals', 'median']);
      expect(bySeason[0].data).toHaveLength(n);
      expect(bySeason[1].data).toHaveLength(seasons);
      await expect(categoriesOf(page, 'residuals-season')).resolves.toEqual(Array.from({ length: seasons }, (_, k) => String(DEMO_TRUTH.firstSeason + k)));
      // Against site: a median per site on the axis.
      const sites = await categoriesOf(page, 'residuals-site');
      expect(sites.length).toBeGreaterThan(5);
      const bySite = await seriesOf(page, 'residuals-site');
      expect(bySite[0].data).toHaveLength(n);
      expect(bySite[1].data).toHaveLength(sites.length);
      // QQ: the envelope band, y = x, and every residual either inside or outside the envelope.
      const qq = await seriesOf(page, 'qq');
      expect(qq.map((s) => s.id).slice(-3)).toEqual(['identity', 'inside', 'outside']);
      expect(qq.find((s) => s.id === 'inside')!.data.length + qq.find((s) => s.id === 'outside')!.data.length).toBe(n);
      // Mean–variance by site with the Poisson line and the fitted NB curve.
      const mv = await seriesOf(page, 'mean-variance');
      expect(mv.map((s) => s.id)).toEqual(['sites', 'poisson', 'negbin']);
      expect(mv[0].data.length).toBeGreaterThan(3);
      expect(mv[0].data.length).toBeLessThanOrEqual(sites.length);
      // Influence by site: one bar per site of the residual chart.
      const influence = await seriesOf(page, 'influence');
      expect(influence.map((s) => s.id)).toEqual(['change']);
      await expect(categoriesOf(page, 'influence')).resolves.toEqual(sites);
      for (const id of ['frequencies', 'rootogram', 'zeros']) await expect.poll(() => page.getByTestId(`chart-${id}`).locator('canvas').count()).toBeGreaterThan(0);

      await page.getByTestId('chart-residuals-site').scrollIntoViewIfNeeded();
      await app.screenshot('models-diagnostics-residuals');
      await page.getByTestId('chart-influence').scrollIntoViewIfNeeded();
      await app.screenshot('models-diagnostics-influence');

      // Saved as PNG (PNG signature) and as SVG (SVG text with the chart's title).
      const [png] = await Promise.all([page.waitForEvent('download'), page.getByTestId('chart-residuals-site').getByRole('button', { name: 'Save PNG' }).click()]);
      expect(png.suggestedFilename()).toBe('common-toad-residuals-site.png');
      expect([...readFileSync(await png.path()).subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
      const [svg] = await Promise.all([page.waitForEvent('download'), page.getByTestId('chart-influence').getByRole('button', { name: 'Save SVG' }).click()]);
      expect(svg.suggestedFilename()).toBe('common-toad-influence.svg');
      const svgText = readFileSync(await svg.path(), 'utf8');
      expect(svgText).toMatch(/^<svg/);
      expect(svgText).toContain('Does one site drive the result?');

      // A click on the largest residual lands on the visit records of its site and season.
      const top = (residuals[0].data as number[][]).reduce((a, p) => (p[1] > a[1] ? p : a));
      await clickAt(page, 'residuals', 'residuals', [top[0], top[1]]);
      const label = await linkedLabel(page);
      const m = /Common toad at (.+), season (\d{4})/.exec(label);
      expect(m, label).not.toBeNull();
      const rows = await gridRows(page);
      expect(rows.length).toBeGreaterThanOrEqual(1);
      expect(rows.length).toBeLessThanOrEqual(8);
      for (const r of rows) expect(r).toEqual({ site: m![1], season: m![2], species: toad.label });
      await expect.poll(() => page.getByTestId('records-shown').textContent()).toMatch(new RegExp(`^Showing ${rows.length} of`));
      await app.screenshot('records-linked-residual');

      // A click on the bar of the most influential site lands on that site's toad records of every season.
      await page.getByRole('button', { name: 'Models' }).click();
      const bars = (await seriesOf(page, 'influence'))[0].data as { value: number | null; site: string }[];
      let k = 0;
      bars.forEach((b, i) => {
        if (Math.abs(b.value ?? 0) > Math.abs(bars[k].value ?? 0)) k = i;
      });
      await clickAt(page, 'influence', 'change', [k, (bars[k].value ?? 0) / 2]);
      await expect(linkedLabel(page)).resolves.toContain(`Common toad at ${bars[k].site},`);
      const siteRows = await gridRows(page);
      expect(new Set(siteRows.map((r) => r.site))).toEqual(new Set([bars[k].site]));
      expect(new Set(siteRows.map((r) => r.species))).toEqual(new Set([toad.label]));
      expect(new Set(siteRows.map((r) => r.season)).size).toBeGreaterThan(1);
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
  });
});
