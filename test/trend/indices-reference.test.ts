import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { tableFromTexts, type DataTable } from '@shared/data/table';
import { parseModelSpec, type ModelSpecInput } from '@shared/model/spec';
import { analyseTrend } from '@shared/trend/trend-analysis';
import type { IndexRow } from '@shared/trend/interval';

// Trend indices, delta-method limits, slopes, period change and the spline
// trend against R 4.2.2: MASS::glm.nb and stats::glm (site as a fixed factor),
// lme4::glmer (random site, nAGQ = 9), splines::ns, on a seeded simulated grid
// written by R, and on MASS::ships (open dataset) — all made by
// test/reference/trend/make-trend.R into trend-fixtures.json.

interface RefSlope { b: number; se: number; perYear: number; lower: number; upper: number }
type RefIndex = IndexRow & { logSe: number };
const root = resolve(__dirname, '../..');
const ref = JSON.parse(readFileSync(join(root, 'test/reference/trend/trend-fixtures.json'), 'utf8'));
const tol = ref.tolerance as Record<string, number>;

function table(cols: Record<string, (string | number)[]>): DataTable {
  const names = Object.keys(cols);
  const n = cols[names[0]].length;
  return tableFromTexts(names, Array.from({ length: n }, (_, i) => names.map((c) => String(cols[c][i]))));
}
const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1, Math.abs(b));

function expectIndices(got: IndexRow[], want: RefIndex[], tIndex: number, tLimit: number): void {
  expect(got.map((r) => r.time)).toEqual(want.map((r) => r.time));
  got.forEach((g, i) => {
    expect(rel(g.index, want[i].index), `index ${g.time}`).toBeLessThanOrEqual(tIndex);
    expect(rel(g.lower, want[i].lower), `lower ${g.time}`).toBeLessThanOrEqual(tLimit);
    expect(rel(g.upper, want[i].upper), `upper ${g.time}`).toBeLessThanOrEqual(tLimit);
  });
}
function expectSlope(got: { perYear: number; lower: number; upper: number }, want: RefSlope, t: number): void {
  expect(Math.abs(got.perYear - want.perYear)).toBeLessThanOrEqual(t);
  expect(Math.abs(got.lower - want.lower)).toBeLessThanOrEqual(t);
  expect(Math.abs(got.upper - want.upper)).toBeLessThanOrEqual(t);
}

const sim = table(ref.simulated.data);
const simSpec = (d: ModelSpecInput['distribution'], effect: 'fixed' | 'random' = 'fixed') =>
  parseModelSpec({ response: 'count', distribution: d, offsets: [{ column: 'effort', log: true }], site: { column: 'site', effect }, time: { column: 'season', trend: 'annual' } });

describe('annual indices and slope against R on the simulated grid', () => {
  it('negative binomial, fixed sites: indices, limits and slope match MASS::glm.nb', async () => {
    const r = await analyseTrend(sim, simSpec('negbin'));
    expect(rel(r.fit.theta!, ref.simulated.negbin.theta)).toBeLessThanOrEqual(tol.theta);
    expectIndices(r.indices, ref.simulated.negbin.indices, tol.index, tol.limit);
    expectSlope(r.slope, ref.simulated.negbin.slope, tol.slope);
    expect(Object.keys(r).slice(0, 3)).toEqual(['fit', 'indices', 'slope']);
  });
  it('rescaled to base 2014 (--base) matches the contrasts against 2014 in R', async () => {
    const r = await analyseTrend(sim, simSpec('negbin'), { base: 2014 });
    expectIndices(r.indices, ref.simulated.negbin.indicesBase2014, tol.index, tol.limit);
  });
  it('period change 2010-2011 : 2016-2018 matches the contrast of mean log effects in R', async () => {
    const r = await analyseTrend(sim, simSpec('negbin'), { change: [{ first: 2010, last: 2011 }, { first: 2016, last: 2018 }] });
    const want = ref.simulated.negbin.change;
    expect(rel(r.change!.ratio, want.ratio)).toBeLessThanOrEqual(tol.index);
    expect(rel(r.change!.lower, want.lower)).toBeLessThanOrEqual(tol.limit);
    expect(rel(r.change!.upper, want.upper)).toBeLessThanOrEqual(tol.limit);
  });
  it('natural-spline trend (df 3) with pointwise limits matches splines::ns in MASS::glm.nb', async () => {
    const r = await analyseTrend(sim, simSpec('negbin'), { smoothDf: 3 });
    expectIndices(r.smooth!.indices, ref.simulated.negbin.smooth, 1e-3, 1e-3);
  });
  it('Poisson, fixed sites: matches stats::glm', async () => {
    const r = await analyseTrend(sim, simSpec('poisson'));
    expectIndices(r.indices, ref.simulated.poisson.indices, tol.index, tol.limit);
    expectSlope(r.slope, ref.simulated.poisson.slope, tol.slope);
  });
  it('Poisson, random site intercept (9 quadrature points): matches lme4::glmer nAGQ = 9', async () => {
    const r = await analyseTrend(sim, simSpec('poisson', 'random'));
    expectIndices(r.indices, ref.simulated.randomPoisson.indices, tol.randomIndex, tol.randomLimit);
    expectSlope(r.slope, ref.simulated.randomPoisson.slope, tol.randomSlope);
  });
});

describe('annual indices on MASS::ships (year of construction)', () => {
  const ships = table(ref.ships.data);
  const spec = (d: 'poisson' | 'quasipoisson') => parseModelSpec({ response: 'incidents', distribution: d, offsets: [{ column: 'service', log: true }], site: { column: 'type', effect: 'fixed' }, time: { column: 'year', trend: 'annual' } });
  it('Poisson: indices and slope match stats::glm', async () => {
    const r = await analyseTrend(ships, spec('poisson'));
    expectIndices(r.indices, ref.ships.poisson.indices, tol.index, tol.limit);
    expectSlope(r.slope, ref.ships.poisson.slope, tol.slope);
  });
  it('quasi-Poisson: limits widened by the dispersion as in stats::glm', async () => {
    const r = await analyseTrend(ships, spec('quasipoisson'));
    expectIndices(r.indices, ref.ships.quasipoisson.indices, tol.index, tol.limit);
    expectSlope(r.slope, ref.ships.quasipoisson.slope, tol.slope);
  });
});

describe('site-robust limits and model-based totals against R', () => {
  it('--limits robust: Poisson indices and slope match sandwich::vcovCL (HC1, clustered by site)', async () => {
    const r = await analyseTrend(sim, simSpec('poisson'), { limits: 'robust' });
    expectIndices(r.indices, ref.simulated.poisson.robustIndices, tol.index, tol.limit);
    expectSlope(r.slope, ref.simulated.poisson.robustSlope, tol.slope);
    expect(r.method!.slope).toMatch(/site-robust/);
  });
  it('--totals: observed where surveyed plus predict() at the site mean effort where not (stats::glm poisson)', async () => {
    const r = await analyseTrend(sim, simSpec('poisson'), { totals: { draws: 400 }, seed: 3 });
    const want = ref.simulated.poisson.totals as { time: number; total: number; surveyedSites: number }[];
    r.totals!.totals.forEach((t, i) => {
      expect(t.time).toBe(want[i].time);
      expect(rel(t.total, want[i].total), `total ${t.time}`).toBeLessThanOrEqual(1e-5);
      expect(t.surveyedSites).toBe(want[i].surveyedSites);
      // A fully surveyed season has nothing predicted, so no simulation spread.
      if (t.surveyedSites === t.sites) expect(t.upper - t.lower).toBeLessThan(1e-9);
      else expect(t.lower).toBeLessThan(t.total), expect(t.upper).toBeGreaterThan(t.total);
    });
  });
});

describe('two-part models against pscl (zero part intercept only, counts with planted extra zeros)', () => {
  const zspec = (d: 'zinb' | 'hurdle-poisson') => parseModelSpec({ response: 'countzi', distribution: d, offsets: [{ column: 'effort', log: true }], site: { column: 'site', effect: 'fixed' }, time: { column: 'season', trend: 'annual' } });
  it('zero-inflated negative binomial: count-part indices and slope match pscl::zeroinfl', async () => {
    const r = await analyseTrend(sim, zspec('zinb'));
    expect(rel(r.fit.theta!, ref.simulated.zinb.theta)).toBeLessThanOrEqual(5e-3);
    expectIndices(r.indices, ref.simulated.zinb.indices, tol.twoPartIndex, tol.twoPartLimit);
    expectSlope(r.slope, ref.simulated.zinb.slope, tol.twoPartSlope);
  });
  it('hurdle Poisson: count-part indices and slope match pscl::hurdle', async () => {
    const r = await analyseTrend(sim, zspec('hurdle-poisson'));
    expectIndices(r.indices, ref.simulated.hurdlePoisson.indices, tol.twoPartIndex, tol.twoPartLimit);
    expectSlope(r.slope, ref.simulated.hurdlePoisson.slope, tol.twoPartSlope);
  });
});

describe('every distribution and site effect the engine fits', () => {
  const cases = [
    ['negbin', 'random', 'count'],
    ['quasipoisson', 'fixed', 'count'],
    ['zip', 'fixed', 'countzi'],
    ['hurdle-negbin', 'fixed', 'countzi'],
  ] as const;
  for (const [d, effect, response] of cases) {
    it(`${d} with ${effect} sites: converges, base 100, slope inside the MASS::glm.nb 95% limits on the same grid`, async () => {
      const spec = parseModelSpec({ response, distribution: d, offsets: [{ column: 'effort', log: true }], site: { column: 'site', effect }, time: { column: 'season', trend: 'annual' } });
      const r = await analyseTrend(sim, spec);
      expect(r.fit.converged).toBe(true);
      expect(r.indices[0]).toEqual({ time: 2010, index: 100, lower: 100, upper: 100 });
      const nb = ref.simulated.negbin.slope as RefSlope;
      expect(r.slope.perYear).toBeGreaterThan(nb.lower);
      expect(r.slope.perYear).toBeLessThan(nb.upper);
    });
  }
});
