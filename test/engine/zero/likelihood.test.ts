/**
 * The analytic gradient and Hessian of the zero-inflated and hurdle
 * log-likelihoods against finite differences (common practice: central
 * differences), the log-likelihood against the hand-written one in
 * make-zero.R, and SE(log theta) against pscl's SE.logtheta.
 */
import { describe, expect, it } from 'vitest';
import { evaluateZeroModel, parameterCount, scoreMatrix } from '@shared/engine/zero/likelihood';
import { fitZeroCore } from '@shared/engine/zero/fit-core';
import { logProbabilityMass } from '@shared/engine/zero/pmf';
import type { CountDistribution } from '@shared/engine/zero/pmf';
import { referenceFit, referenceModelData, referenceParameters } from './reference-data';

const ids = ['zip', 'zinb', 'hurdle-poisson', 'hurdle-negbin', 'zip-offset-invented'];

describe.each(ids)('%s likelihood', (id) => {
  const ref = referenceFit(id);
  const m = referenceModelData(ref);
  const k = parameterCount(m);
  // Away from the optimum too, so that the gradient is not ~0: shift every parameter a little.
  const at = referenceParameters(ref).map((v, j) => v + 0.03 * ((j % 3) - 1));

  it('log-likelihood at pscl estimates equals the hand-written one in make-zero.R (1e-8)', () => {
    const v = evaluateZeroModel(m, referenceParameters(ref), 0).value;
    expect(Math.abs(v - ref.hessianCheck.logLikHandWritten)).toBeLessThan(1e-8);
  });

  it('analytic gradient equals central differences of the log-likelihood', () => {
    const g = evaluateZeroModel(m, at, 1).grad!;
    for (let j = 0; j < k; j++) {
      const h = 1e-5;
      const up = Float64Array.from(at);
      const dn = Float64Array.from(at);
      up[j] += h;
      dn[j] -= h;
      const fd = (evaluateZeroModel(m, up, 0).value - evaluateZeroModel(m, dn, 0).value) / (2 * h);
      expect(Math.abs(g[j] - fd), `parameter ${j}`).toBeLessThan(1e-5 * Math.max(1, Math.abs(fd)));
    }
  });

  it('analytic Hessian equals central differences of the analytic gradient and of the log-likelihood', () => {
    const H = evaluateZeroModel(m, at, 2).hess!;
    let scale = 0;
    for (const v of H) scale = Math.max(scale, Math.abs(v));
    const h = 1e-5;
    for (let j = 0; j < k; j++) {
      const up = Float64Array.from(at);
      const dn = Float64Array.from(at);
      up[j] += h;
      dn[j] -= h;
      const gu = evaluateZeroModel(m, up, 1).grad!;
      const gd = evaluateZeroModel(m, dn, 1).grad!;
      for (let i = 0; i < k; i++) {
        const fd = (gu[i] - gd[i]) / (2 * h);
        expect(Math.abs(H[j * k + i] - fd), `H[${i},${j}]`).toBeLessThan(1e-6 * scale);
        expect(H[j * k + i]).toBe(H[i * k + j]);
      }
    }
    // Diagonal from second differences of the value itself (no gradient involved).
    const h2 = 1e-4;
    const f0 = evaluateZeroModel(m, at, 0).value;
    for (let j = 0; j < k; j++) {
      const up = Float64Array.from(at);
      const dn = Float64Array.from(at);
      up[j] += h2;
      dn[j] -= h2;
      const fd = (evaluateZeroModel(m, up, 0).value - 2 * f0 + evaluateZeroModel(m, dn, 0).value) / (h2 * h2);
      expect(Math.abs(H[j * k + j] - fd), `H[${j},${j}]`).toBeLessThan(1e-4 * scale);
    }
  });

  it('the score matrix rows sum to the gradient (common practice: the score is a sum over observations)', () => {
    const g = evaluateZeroModel(m, at, 1).grad!;
    const S = scoreMatrix(m, at);
    const n = m.y.length;
    for (let j = 0; j < k; j++) {
      let sum = 0;
      for (let i = 0; i < n; i++) sum += S[j * n + i];
      expect(Math.abs(sum - g[j])).toBeLessThan(1e-9 * Math.max(1, Math.abs(g[j])));
    }
  });

  it('per-observation log-likelihoods equal log P(y) from pmf.ts', () => {
    const per = new Float64Array(m.y.length);
    evaluateZeroModel(m, at, 0, per);
    const fit = fitZeroCore(m);
    const perFit = fit.perObservation;
    for (let i = 0; i < m.y.length; i += 37) {
      const lp = logProbabilityMass(ref.spec.distribution as CountDistribution, m.y[i], { mu: fit.mu[i], theta: fit.theta, zeroProb: fit.zeroProb[i] });
      expect(perFit[i]).toBeCloseTo(lp, 10);
    }
    expect(per.every(Number.isFinite)).toBe(true);
  });
});

describe.each(['zinb', 'hurdle-negbin', 'zinb-zero-ment', 'hurdle-negbin-offset-invented'])('%s theta', (id) => {
  it("SE of log(theta) matches pscl's SE.logtheta (5e-4, pscl's finite-difference Hessian) and the numerical Hessian (1e-4)", () => {
    const ref = referenceFit(id);
    const fit = fitZeroCore(referenceModelData(ref));
    const k = fit.par.length;
    const se = Math.sqrt(fit.covariance![k * k - 1]);
    expect(Math.abs(se - ref.seLogTheta!) / ref.seLogTheta!).toBeLessThan(5e-4);
    const num = ref.hessianCheck.seNumerical[k - 1];
    expect(Math.abs(se - num) / num).toBeLessThan(1e-4);
  });
});
