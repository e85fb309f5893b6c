/**
 * Seeded simulations (invented site x season data): the absorbed fit equals
 * the dense dummy-column fit of the engine's own negative-binomial IRLS,
 * and the random-intercept fit recovers the simulated parameters.
 */
import { describe, expect, it } from 'vitest';
import { columnFromNumbers, columnFromTexts } from '@shared/data/table';
import type { DataTable } from '@shared/data/table';
import { createRng } from '@shared/demo/prng';
import { sampleNegBinomial, sampleNormal, samplePoisson } from '@shared/demo/samplers';
import { buildDesign } from '@shared/engine/design/build';
import { fitNegbin } from '@shared/engine/negbin/fit';
import { fitAbsorbedSites } from '@shared/engine/sites/absorbed';
import { fitRandomSite } from '@shared/engine/sites/random';
import { parseModelSpec } from '@shared/model/spec';

const TRUE = { intercept: 0.6, slope: 0.05, cover: -0.5, sd: 0.7, theta: 3 };

function simulate(seed: number, sites: number, seasons: number, poisson = false): DataTable {
  const rng = createRng(seed);
  const site: string[] = [];
  const season: number[] = [];
  const cover: number[] = [];
  const effort: number[] = [];
  const count: number[] = [];
  for (let s = 0; s < sites; s++) {
    const a = sampleNormal(rng, 0, TRUE.sd);
    for (let t = 0; t < seasons; t++) {
      if (rng.uniform() < 0.15) continue;
      const c = rng.uniform();
      const e = 0.5 + 2 * rng.uniform();
      const mu = Math.exp(TRUE.intercept + a + TRUE.slope * t + TRUE.cover * c + Math.log(e));
      site.push(`W${s + 1}`);
      season.push(t);
      cover.push(c);
      effort.push(e);
      count.push(poisson ? samplePoisson(rng, mu) : sampleNegBinomial(rng, mu, TRUE.theta));
    }
  }
  return {
    nrows: count.length,
    columns: [columnFromNumbers('count', count), columnFromNumbers('season', season), columnFromNumbers('cover', cover), columnFromNumbers('effort', effort), columnFromTexts('site', site)],
  };
}

const table = simulate(20261201, 80, 8);
const base = {
  response: 'count',
  distribution: 'negbin',
  predictors: [
    { column: 'season', type: 'numeric' },
    { column: 'cover', type: 'numeric' },
  ],
  offsets: [{ column: 'effort', log: true }],
};

describe('seeded simulation', () => {
  it('absorbed NB fit equals the dense dummy-column NB fit (estimates, SEs, log-likelihood, theta)', () => {
    const abs = fitAbsorbedSites(table, parseModelSpec({ ...base, site: { column: 'site', effect: 'fixed' } }));
    const terms = [...parseModelSpec(base).predictors, { column: 'site', type: 'factor' as const }];
    const dense = buildDesign(table, terms, { intercept: true });
    const offset = Float64Array.from(table.columns[3].values, Math.log);
    const y = table.columns[0].values;
    const nb = fitNegbin({ x: dense.design.data, n: dense.design.n, p: dense.design.p, y, offset, control: { tolerance: 1e-10, maxIterations: 100 } });
    const pd = dense.design.p;
    for (const name of ['season', 'cover']) {
      const jd = dense.design.names.indexOf(name);
      const ja = abs.betaNames.indexOf(name);
      expect(abs.beta[ja]).toBeCloseTo(nb.irls.beta[jd], 5);
      const seDense = Math.sqrt(nb.irls.xtwxInverse[jd * pd + jd]);
      expect(abs.summary.coefficients[ja].se / seDense).toBeCloseTo(1, 4);
    }
    expect(abs.summary.logLikelihood!).toBeCloseTo(nb.logLik, 4);
    expect(abs.theta! / nb.theta!).toBeCloseTo(1, 4);
    // Same fitted means row by row.
    for (let k = 0; k < abs.rows.length; k += 23) expect(abs.mu[k] / nb.irls.mu[abs.rows[k]]).toBeCloseTo(1, 4);
  });

  it('random-intercept NB fit recovers the simulated parameters within 3 standard errors', () => {
    const fit = fitRandomSite(table, parseModelSpec({ ...base, site: { column: 'site', effect: 'random', quadraturePoints: 5 } }));
    expect(fit.summary.converged).toBe(true);
    const truth: Record<string, number> = { intercept: TRUE.intercept, season: TRUE.slope, cover: TRUE.cover };
    for (const row of fit.summary.coefficients) expect(Math.abs(row.estimate - truth[row.term]), row.term).toBeLessThan(3 * row.se);
    expect(fit.summary.random!.sd).toBeGreaterThan(0.5 * TRUE.sd);
    expect(fit.summary.random!.sd).toBeLessThan(1.5 * TRUE.sd);
    expect(fit.theta!).toBeGreaterThan(0.5 * TRUE.theta);
    expect(fit.theta!).toBeLessThan(2 * TRUE.theta);
  });

  it('Poisson counts: the NB size runs to its bound and the fit falls back to Poisson with a boundary-theta warning', () => {
    const pois = simulate(99, 60, 8, true);
    const spec = { ...base, site: { column: 'site', effect: 'fixed' } };
    const nb = fitAbsorbedSites(pois, parseModelSpec(spec));
    const pz = fitAbsorbedSites(pois, parseModelSpec({ ...spec, distribution: 'poisson' }));
    expect(nb.theta).toBeNull();
    expect(nb.warnings.some((w) => w.code === 'boundary-theta')).toBe(true);
    expect(nb.summary.logLikelihood!).toBeCloseTo(pz.summary.logLikelihood!, 6);
    expect(nb.summary.df).toBe(pz.summary.df);
  });
});
