/**
 * Fixed site effects, absorbed, against the dense dummy-column fit:
 * stats::glm (poisson) and MASS::glm.nb with a site factor (R 4.2.2,
 * MASS 7.3-58.2) on MASS::epil, lme4::grouseticks and a seeded simulated
 * site x season grid; values in test/reference/sites/sites-fixed.json
 * (made by make-sites.R).
 */
import { describe, expect, it } from 'vitest';
import { parseModelSpec } from '@shared/model/spec';
import { fitAbsorbedSites } from '@shared/engine/sites/absorbed';
import { FitCancelled, FitInputError } from '@shared/engine/types';
import { close, dataset, fixedCases, refTheta } from './fixtures';

describe('absorbed fixed site effects against the dense R fit', () => {
  for (const ref of fixedCases.cases) {
    it(`${ref.name} (${ref.source})`, () => {
      const table = dataset(ref.dataset);
      const fit = fitAbsorbedSites(table, parseModelSpec(ref.spec));
      const tol = ref.tolerance;
      expect(fit.summary.converged).toBe(true);
      for (const rc of ref.coefficients) {
        const row = fit.summary.coefficients.find((r) => r.term === rc.term);
        expect(row, rc.term).toBeDefined();
        expect(close(row!.estimate, rc.estimate, tol.estimate), `${rc.term} estimate ${row!.estimate} vs ${rc.estimate}`).toBe(true);
        expect(Math.abs(row!.se / rc.se - 1), `${rc.term} se ${row!.se} vs ${rc.se}`).toBeLessThan(tol.se);
      }
      // The full log-likelihood (constants included) of the dense fit (R's logLik).
      expect(close(fit.summary.logLikelihood!, ref.logLikelihood, tol.logLikelihood), `logLik ${fit.summary.logLikelihood} vs ${ref.logLikelihood}`).toBe(true);
      expect(close(fit.summary.deviance!, ref.deviance!, tol.deviance), `deviance ${fit.summary.deviance} vs ${ref.deviance}`).toBe(true);
      const th = refTheta(ref);
      if (th !== null) expect(Math.abs(fit.theta! / th - 1)).toBeLessThan(tol.theta);
      else expect(fit.theta).toBeNull();
      // The sites R found with only zero counts are the ones named in the warning; their rows stay in nobs.
      const zero = ref.zeroSites!;
      const w = fit.warnings.find((x) => x.code === 'all-zero-site');
      if (zero.length) for (const l of zero) expect(w!.message).toContain(`"${l}"`);
      else expect(w).toBeUndefined();
      expect(fit.summary.nobs).toBe(ref.nobsAll);
      // Site effects are not coefficients.
      expect(fit.summary.coefficients.some((r) => r.term.startsWith('intercept'))).toBe(false);
      expect(fit.siteEffects!.levels.length).toBeGreaterThan(10);
    });
  }
});

describe('absorbed fits: warnings, counting and site effects', () => {
  const gt = fixedCases.cases.find((c) => c.name === 'grouseticks-poisson-fixed')!;
  const table = dataset('grouseticks');

  it('names the sites with only zero counts (standard practice: their effect is -infinity)', () => {
    // The zero sites are found from the data here, independently of the engine.
    const ticks = table.columns.find((c) => c.name === 'TICKS')!;
    const loc = table.columns.find((c) => c.name === 'LOCATION')!;
    const sums = new Map<string, number>();
    loc.texts.forEach((l, i) => sums.set(l, (sums.get(l) ?? 0) + ticks.values[i]));
    const zero = [...sums].filter(([, s]) => s === 0).map(([l]) => l);
    expect(zero.length).toBeGreaterThan(0);
    const fit = fitAbsorbedSites(table, parseModelSpec(gt.spec));
    const w = fit.warnings.find((x) => x.code === 'all-zero-site');
    expect(w).toBeDefined();
    expect(w!.message).toContain(`${zero.length} sites`);
    for (const l of zero) expect(w!.message).toContain(`"${l}"`);
    for (const l of zero) expect(fit.siteEffects!.effect[fit.siteEffects!.levels.indexOf(l)]).toBe(-Infinity);
    // df: 2 year effects + one per site with counts (R's dense fit counts the zero sites too).
    expect(fit.summary.df).toBe(2 + sums.size - zero.length);
    expect(fit.summary.nobs).toBe(table.nrows);
    expect(fit.summary.aic).toBeCloseTo(-2 * fit.summary.logLikelihood! + 2 * fit.summary.df, 8);
  });

  it('drops a covariate that is constant within sites (epil: trt is a subject-level treatment)', () => {
    const ep = fixedCases.cases.find((c) => c.name === 'epil-poisson-fixed')!;
    const fit = fitAbsorbedSites(dataset('epil'), parseModelSpec(ep.spec));
    expect(fit.betaNames).not.toContain('trt=progabide');
    expect(fit.warnings.some((w) => w.code === 'aliased-column' && w.message.includes('trt=progabide'))).toBe(true);
  });

  it('site effects reproduce the fitted means and carry finite SDs', () => {
    const fit = fitAbsorbedSites(table, parseModelSpec(gt.spec));
    const se = fit.siteEffects!;
    const year = table.columns.find((c) => c.name === 'YEAR')!;
    const b = new Map(fit.betaNames.map((n, k) => [n, fit.beta[k]]));
    for (let k = 0; k < fit.rows.length; k += 37) {
      const r = fit.rows[k];
      const a = se.effect[se.siteOfRow[k]];
      const eta = a + (b.get(`YEAR=${year.texts[r]}`) ?? 0);
      expect(fit.mu[k]).toBeCloseTo(Math.exp(eta), 10);
    }
    for (let s = 0; s < se.levels.length; s++) if (Number.isFinite(se.effect[s])) expect(se.sd[s]).toBeGreaterThan(0);
    // Poisson with site effects: the fitted total of each site equals its observed total (score of alpha_s).
    const ticks = table.columns.find((c) => c.name === 'TICKS')!;
    const obs = new Float64Array(se.levels.length);
    const fitted = new Float64Array(se.levels.length);
    for (let k = 0; k < fit.rows.length; k++) {
      obs[se.siteOfRow[k]] += ticks.values[fit.rows[k]];
      fitted[se.siteOfRow[k]] += fit.mu[k];
    }
    for (let s = 0; s < se.levels.length; s++) expect(fitted[s]).toBeCloseTo(obs[s], 6);
  });

  it('quasipoisson scales the Poisson SEs by the root of Pearson chi-square over residual df (common practice)', () => {
    const spec = parseModelSpec({ ...(gt.spec as object), distribution: 'quasipoisson' });
    const q = fitAbsorbedSites(table, spec);
    const pz = fitAbsorbedSites(table, parseModelSpec(gt.spec));
    expect(q.summary.logLikelihood).toBeNull();
    const disp = pz.summary.pearsonChi2 / pz.summary.dfResidual;
    expect(q.summary.dispersion).toBeCloseTo(disp, 10);
    expect(q.summary.coefficients[0].se).toBeCloseTo(pz.summary.coefficients[0].se * Math.sqrt(disp), 10);
  });

  it('reports progress and can be cancelled', () => {
    const seen: number[] = [];
    fitAbsorbedSites(table, parseModelSpec({ ...(gt.spec as object), distribution: 'negbin' }), { onProgress: (f) => seen.push(f) });
    expect(seen.length).toBeGreaterThan(2);
    expect(seen[seen.length - 1]).toBe(1);
    expect(() => fitAbsorbedSites(table, parseModelSpec(gt.spec), { signal: { aborted: true } })).toThrow(FitCancelled);
  });

  it('refuses a spec without a site or with the site among the predictors, naming the fix', () => {
    const noSite = parseModelSpec({ response: 'TICKS', distribution: 'poisson', predictors: [{ column: 'YEAR', type: 'factor' }] });
    expect(() => fitAbsorbedSites(table, noSite)).toThrow(FitInputError);
    const twice = parseModelSpec({ ...(gt.spec as object), predictors: [{ column: 'LOCATION', type: 'factor' }] });
    expect(() => fitAbsorbedSites(table, twice)).toThrow(/also listed among the predictors/);
    const zip = parseModelSpec({ ...(gt.spec as object), distribution: 'zip' });
    expect(() => fitAbsorbedSites(table, zip)).toThrow(/not "zip"/);
  });
});
