import { describe, expect, it } from 'vitest';
import { poissonTrendPower } from '@shared/trend/power-analytic';
import { DEFAULT_DESIGN, designProblem, type PowerDesign } from '@shared/trend/power-design';
import { powerStudy, simulateProgramme } from '@shared/trend/power-simulation';

// Simulated power of a log-linear Poisson trend test against the
// normal-approximation Wald power (common practice; Lehmann & Romano 2005,
// ch. 13), the slope's variance from the expected Fisher information.
const poissonDesign: PowerDesign = { sites: 12, seasons: 6, visits: 1, meanCount: 4, theta: null, siteSd: 0, annualChange: -0.06, alpha: 0.05 };

describe('power of a monitoring design', () => {
  it('analytic Poisson power: no change gives alpha; power grows with sites', () => {
    expect(poissonTrendPower({ ...poissonDesign, annualChange: 0 }).power).toBeCloseTo(0.05, 10);
    const a = poissonTrendPower(poissonDesign).power;
    const b = poissonTrendPower({ ...poissonDesign, sites: 48 }).power;
    expect(a).toBeGreaterThan(0.2);
    expect(a).toBeLessThan(0.9);
    expect(b).toBeGreaterThan(a);
  });

  it('simulated Poisson power agrees with the analytic Wald power within 3 Monte-Carlo SEs (200 seeded replicates)', async () => {
    const want = poissonTrendPower(poissonDesign).power;
    const study = await powerStudy(poissonDesign, { sites: [12], seasons: [6] }, { replicates: 200, seed: 31, model: 'poisson' });
    const cell = study.cells[0];
    expect(cell.failed).toBe(0);
    expect(Math.abs(cell.power - want), `simulated ${cell.power} ± ${cell.mcse} vs analytic ${want}`).toBeLessThanOrEqual(3 * Math.sqrt((want * (1 - want)) / 200));
  });

  it('a grid of sites x seasons: more seasons give more power; the same seed gives the same answer', async () => {
    const d = { ...DEFAULT_DESIGN, meanCount: 3, visits: 1 };
    const grid = { sites: [8], seasons: [4, 10] };
    const one = await powerStudy(d, grid, { replicates: 40, seed: 5 });
    const two = await powerStudy(d, grid, { replicates: 40, seed: 5 });
    expect(one.cells.map((c) => [c.sites, c.seasons])).toEqual([[8, 4], [8, 10]]);
    expect(one.cells[1].power).toBeGreaterThan(one.cells[0].power);
    expect(two.cells.map((c) => c.power)).toEqual(one.cells.map((c) => c.power));
  });

  it('simulated programmes have the planned shape and mean (seeded)', () => {
    const d = { ...poissonDesign, sites: 50, seasons: 3, visits: 2, annualChange: 0 };
    const t = simulateProgramme(d, 9);
    expect(t.nrows).toBe(300);
    const y = t.columns.find((c) => c.name === 'count')!.values;
    const mean = y.reduce((a, b) => a + b, 0) / y.length;
    expect(Math.abs(mean - 4)).toBeLessThan(4 * Math.sqrt(4 / 300));
  });

  it('bad design values are named', () => {
    expect(designProblem({ ...DEFAULT_DESIGN, sites: 1 })).toMatch(/sites/);
    expect(designProblem({ ...DEFAULT_DESIGN, annualChange: -1.2 })).toMatch(/annual change/);
    expect(designProblem(DEFAULT_DESIGN)).toBeNull();
  });
});

describe('a design taken from a fit', () => {
  it('reads sites, seasons, theta and the annual change of the seeded R grid as MASS::glm.nb estimates them', async () => {
    const { readFileSync } = await import('node:fs');
    const { join, resolve } = await import('node:path');
    const { tableFromTexts } = await import('@shared/data/table');
    const { parseModelSpec } = await import('@shared/model/spec');
    const { designFromFit } = await import('@shared/trend/power-from-fit');
    // Fixture: test/reference/trend/make-trend.R (R 4.2.2, MASS 7.3.58.2).
    const ref = JSON.parse(readFileSync(join(resolve(__dirname, '../..'), 'test/reference/trend/trend-fixtures.json'), 'utf8'));
    const c = ref.simulated.data as Record<string, (string | number)[]>;
    const names = Object.keys(c);
    const table = tableFromTexts(names, c.count.map((_, i) => names.map((n) => String(c[n][i]))));
    const spec = parseModelSpec({ response: 'count', distribution: 'negbin', offsets: [{ column: 'effort' }], site: { column: 'site', effect: 'fixed' }, time: { column: 'season', trend: 'annual' } });
    const d = designFromFit(table, spec);
    expect(d).toMatchObject({ sites: 18, seasons: 9, visits: 1, alpha: 0.05 });
    expect(Math.abs(d.theta! - ref.simulated.negbin.thetaLinear) / ref.simulated.negbin.thetaLinear).toBeLessThan(1e-3);
    expect(Math.abs(d.annualChange - ref.simulated.negbin.slope.perYear)).toBeLessThan(1e-5);
    expect(d.siteSd).toBeGreaterThan(0.2);
    expect(d.siteSd).toBeLessThan(1.2);
  });
});
