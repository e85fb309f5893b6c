import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { tableFromTexts } from '@shared/data/table';
import { createRng } from '@shared/demo/prng';
import { FitCancelled } from '@shared/engine/types';
import { parseModelSpec } from '@shared/model/spec';
import { resampleSites, rowsBySite } from '@shared/trend/resample-sites';
import { analyseTrend } from '@shared/trend/trend-analysis';

// Site-block bootstrap (Davison & Hinkley 1997, section 3.8: resample
// clusters). The data are the overdispersed negative-binomial grid written
// by test/reference/trend/make-trend.R (R set.seed(4711), theta 2.2). A
// Poisson fit's Wald limits ignore the overdispersion; resampling whole
// sites does not, so its limits come out wider, near the site-clustered
// sandwich limits of the same Poisson estimator (sandwich::vcovCL in the
// fixture) — both estimate its variance between sites (common practice).
const ref = JSON.parse(readFileSync(join(resolve(__dirname, '../..'), 'test/reference/trend/trend-fixtures.json'), 'utf8'));
const cols = ref.simulated.data as Record<string, (string | number)[]>;
const names = Object.keys(cols);
const sim = tableFromTexts(names, cols.count.map((_, i) => names.map((n) => String(cols[n][i]))));
const spec = parseModelSpec({ response: 'count', distribution: 'poisson', offsets: [{ column: 'effort', log: true }], site: { column: 'site', effect: 'fixed' }, time: { column: 'season', trend: 'annual' } });
const width = (s: { lower: number; upper: number }) => Math.log1p(s.upper) - Math.log1p(s.lower);

describe('site-block bootstrap limits', () => {
  it('resampling keeps whole sites and relabels repeats as separate sites', () => {
    const groups = rowsBySite(sim, 'site');
    const t = resampleSites(sim, 'site', groups, createRng(3));
    const site = t.columns.find((c) => c.name === 'site')!;
    const labels = new Set(site.texts);
    expect(labels.size).toBe(groups.sites.length);
    for (const l of labels) {
      const original = l.split('~')[0];
      const n = site.texts.filter((x) => x === l).length;
      expect(n).toBe(groups.rows[groups.sites.indexOf(original)].length);
    }
  });

  it('for overdispersed counts, Poisson bootstrap limits widen to about the site-robust sandwich limits', async () => {
    const wald = await analyseTrend(sim, spec);
    const boot = await analyseTrend(sim, spec, { limits: 'bootstrap', replicates: 60, seed: 9 });
    expect(boot.slope.perYear).toBe(wald.slope.perYear);
    expect(width(boot.slope)).toBeGreaterThan(1.3 * width(wald.slope));
    const robustWidth = width(ref.simulated.poisson.robustSlope);
    expect(width(boot.slope) / robustWidth).toBeGreaterThan(0.75);
    expect(width(boot.slope) / robustWidth).toBeLessThan(1.33);
    expect(boot.indices[0]).toMatchObject({ index: 100, lower: 100, upper: 100 });
    expect(boot.method).toMatchObject({ replicates: 60, seed: 9 });
    expect(boot.method!.indices).toMatch(/bootstrap/);
  });

  it('the same seed gives the same limits; a raised signal cancels', async () => {
    const a = await analyseTrend(sim, spec, { limits: 'bootstrap', replicates: 20, seed: 4 });
    const b = await analyseTrend(sim, spec, { limits: 'bootstrap', replicates: 20, seed: 4 });
    expect(b.indices).toEqual(a.indices);
    let calls = 0;
    const signal = { get aborted() { return ++calls > 3; } };
    await expect(analyseTrend(sim, spec, { limits: 'bootstrap', replicates: 20, seed: 4, signal })).rejects.toBeInstanceOf(FitCancelled);
  });

  it('bootstrap without a site column is refused with the fix', async () => {
    const noSite = parseModelSpec({ response: 'count', distribution: 'poisson', time: { column: 'season', trend: 'annual' } });
    await expect(analyseTrend(sim, noSite, { limits: 'bootstrap', replicates: 20 })).rejects.toThrow(/add "site"/);
  });
});

describe('the base season of the spec', () => {
  it('a numeric base matches the season cells; an absent one is named with the seasons there are', async () => {
    const based = parseModelSpec({ ...spec, time: { column: 'season', trend: 'annual', base: 2013 } });
    const r = await analyseTrend(sim, based);
    expect(r.indices.find((x) => x.time === 2013)).toMatchObject({ index: 100, lower: 100, upper: 100 });
    const wrong = parseModelSpec({ ...spec, time: { column: 'season', trend: 'annual', base: 1999 } });
    await expect(analyseTrend(sim, wrong)).rejects.toThrow(/1999/);
  });
});
