/**
 * Diagnostics against R on an open dataset: MASS's `quine` (days absent),
 * Poisson glm() and MASS::glm.nb() of Days ~ Eth + Sex + Age + Lrn.
 * Reference values (test/reference/diagnostics/make-diagnostics.R): expected
 * frequencies as colSums of dpois/dnbinom matrices, observed zeros, per-cell
 * mean and var(), CDF bounds from ppois/pnbinom, and statmod::qresid with the
 * uniforms it drew. Tolerances are those stored in the fixture.
 */
import { describe, expect, it } from 'vitest';
import { countFrequencies, meanVarianceBySite, quantileResiduals, zeroCounts } from '@shared/diagnostics';
import { normalCdf } from './normal-cdf';
import { quineFit, quineRef, quineTable } from './quine-reference';

const tol = quineRef.tolerance;
const models = ['poisson', 'negbin'] as const;

function relClose(actual: number, expected: number, rel: number, abs = 1e-9): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(rel * Math.abs(expected) + abs);
}

describe('the engine fits the same models as R (precondition; MASS::glm.nb, glm)', () => {
  it.each(models)('%s coefficients and theta agree with R', (m) => {
    const fit = quineFit(m);
    const ref = quineRef[m];
    fit.betaNames.forEach((nm, j) => relClose(fit.beta[j], ref.coefficients[nm], tol.coefficients, 1e-7));
    if (m === 'negbin') relClose(fit.theta as number, ref.theta as number, tol.coefficients);
  });
});

describe('expected frequencies (R: colSums of dpois / dnbinom over the fitted means)', () => {
  const fits = models.map((m) => ({ label: m, fit: quineFit(m) }));
  const freq = countFrequencies(fits);

  it('chooses the tail bin from the data and counts the observed frequencies as R tabulates them', () => {
    // quine: largest count 81 > 30, so K is the 95th percentile but at least 30.
    expect(freq.tailFrom).toBeGreaterThanOrEqual(30);
    expect(freq.labels[freq.tailFrom]).toBe(`${freq.tailFrom} or more`);
    const ref = quineRef.observedFrequency;
    for (let k = 0; k < freq.tailFrom; k++) expect(freq.observed[k]).toBe(ref[k]);
    expect(freq.observed[freq.tailFrom]).toBe(ref.slice(freq.tailFrom).reduce((s, v) => s + v, 0));
    expect(freq.rowsByBin.reduce((s, r) => s + r.length, 0)).toBe(146);
  });

  it.each(models)('%s: each bin and the tail match R', (m) => {
    const ours = freq.models.find((x) => x.label === m)!.expected;
    const ref = quineRef[m].expectedFrequency;
    for (let k = 0; k < freq.tailFrom; k++) relClose(ours[k], ref[k], tol.frequency, 1e-8);
    // The tail in R: n minus the bins below K (R's matrix stops at max(Days), so the rest is the tail).
    const below = ref.slice(0, freq.tailFrom).reduce((s, v) => s + v, 0);
    relClose(ours[freq.tailFrom], 146 - below, tol.frequency, 1e-6);
    expect(ours.reduce((s, v) => s + v, 0)).toBeCloseTo(146, 8);
  });

  it('the same bins with a K chosen by the analyst', () => {
    const f5 = countFrequencies(fits, { tailFrom: 5 });
    expect(f5.labels).toEqual(['0', '1', '2', '3', '4', '5 or more']);
    relClose(f5.models[1].expected[3], quineRef.negbin.expectedFrequency[3], tol.frequency);
  });
});

describe('zeros per model (R: sum(Days == 0) and colSums(...)[1])', () => {
  it('observed and expected zeros and shares', () => {
    const z = zeroCounts(models.map((m) => ({ label: m, fit: quineFit(m) })));
    expect(z.observed).toBe(quineRef.observedZeros);
    expect(z.observedShare).toBeCloseTo(quineRef.observedZeros / 146, 12);
    expect(z.zeroRows).toHaveLength(quineRef.observedZeros);
    models.forEach((m, k) => {
      relClose(z.models[k].expected, quineRef[m].expectedFrequency[0], tol.frequency);
      relClose(z.models[k].expectedShare, quineRef[m].expectedFrequency[0] / 146, tol.frequency);
    });
    // Poisson predicts almost no zeros for these counts; the negative binomial many more (R's values show it too).
    expect(z.models[0].expected).toBeLessThan(z.models[1].expected);
  });
});

describe('mean and variance by group (R: tapply(Days, cell, mean / var))', () => {
  it('per cell moments and the reference curves', () => {
    const fit = quineFit('negbin');
    const mv = meanVarianceBySite(quineTable(), fit, { siteColumn: 'cell' });
    const ref = quineRef.meanVariance;
    const withVar = ref.cells.filter((_, k) => ref.n[k] > 1);
    expect(mv.sites.map((s) => s.site).sort()).toEqual([...withVar].sort());
    for (const s of mv.sites) {
      const k = ref.cells.indexOf(s.site);
      expect(s.n).toBe(ref.n[k]);
      relClose(s.mean, ref.mean[k], tol.meanVariance);
      relClose(s.variance, ref.variance[k], 1e-10);
    }
    expect(mv.singleRecordSites).toEqual(ref.cells.filter((_, k) => ref.n[k] === 1));
    expect(mv.poisson.every((p) => p.variance === p.mean)).toBe(true);
    const th = fit.theta as number;
    expect(mv.negbin!.every((p) => Math.abs(p.variance - (p.mean + (p.mean * p.mean) / th)) < 1e-9 * p.variance)).toBe(true);
  });
});

describe('randomized quantile residuals against statmod::qresid', () => {
  it.each(models)('%s: CDF bounds match ppois / pnbinom and, with R\'s uniforms, the residuals match qresid', (m) => {
    const fit = quineFit(m);
    const ref = quineRef[m];
    const res = quantileResiduals(fit, { uniforms: ref.qresid.uniforms });
    for (let i = 0; i < 146; i++) {
      relClose(res.lower[i], ref.cdfLower[i], tol.cdf, 1e-12);
      relClose(res.upper[i], ref.cdfUpper[i], tol.cdf, 1e-12);
      // Far in the upper tail (F(y - 1) > 0.999) qresid loses its digits (Inf where F rounds to 1),
      // so there the check is against the same residual from R's upper tails (fixture `accurate`).
      const r = ref.cdfLower[i] > 0.999 ? ref.qresid.accurate[i] : ref.qresid.residuals[i];
      expect(r).not.toBeNull();
      expect(Math.abs(res.residual[i] - (r as number))).toBeLessThan(tol.quantileResidual * (1 + Math.abs(r as number)));
      if (ref.cdfLower[i] <= 0.999) expect(Math.abs(ref.qresid.accurate[i] - (r as number))).toBeLessThan(1e-6 * (1 + Math.abs(r as number)));
    }
    expect(res.residual.every(Number.isFinite)).toBe(true);
    expect(Array.from(res.rows)).toEqual(Array.from({ length: 146 }, (_, i) => i));
  });

  it('seeded residuals are reproducible and lie in their intervals', () => {
    const fit = quineFit('negbin');
    const a = quantileResiduals(fit, { seed: 7 });
    const b = quantileResiduals(fit, { seed: 7 });
    const c = quantileResiduals(fit, { seed: 8 });
    expect(Array.from(a.residual)).toEqual(Array.from(b.residual));
    expect(Array.from(a.residual)).not.toEqual(Array.from(c.residual));
    for (let i = 0; i < 146; i++) {
      const u = normalCdf(a.residual[i]);
      expect(u).toBeGreaterThanOrEqual(a.lower[i] - 1e-7);
      expect(u).toBeLessThanOrEqual(a.upper[i] + 1e-7);
    }
  });
});
