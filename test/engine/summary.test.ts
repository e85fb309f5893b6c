import { describe, expect, it } from 'vitest';
import { sanitizeSummary, warningSentences } from '@shared/engine/summary';
import type { FitSummary } from '@shared/model/fit-result';

const base: FitSummary = {
  converged: true,
  iterations: 4,
  nobs: 10,
  distribution: 'negbin',
  logLikelihood: -20,
  aic: 48,
  bic: 50,
  df: 4,
  deviance: 8,
  nullDeviance: 12,
  dfResidual: 7,
  pearsonChi2: 9,
  dispersion: 9 / 7,
  theta: 2,
  alpha: 0.5,
  coefficients: [{ term: 'intercept', estimate: 1, se: 0.2, z: 5, p: 1e-6, lower: 0.6, upper: 1.4 }],
  zeroCoefficients: [],
  random: null,
  warnings: [],
};

describe('sanitizeSummary', () => {
  it('leaves a finite summary as it is', () => {
    expect(sanitizeSummary(base)).toEqual(base);
  });
  it('turns NaN and Infinity into null and says which terms were affected', () => {
    const s = sanitizeSummary({
      ...base,
      theta: Infinity,
      aic: NaN,
      dispersion: NaN,
      coefficients: [{ term: 'habitat=bog', estimate: -30, se: NaN, z: NaN, p: NaN, lower: -Infinity, upper: Infinity }],
    });
    expect(s.theta).toBeNull();
    expect(s.aic).toBeNull();
    expect(s.dispersion).toBeNull();
    expect(s.coefficients[0].estimate).toBe(-30);
    expect(s.coefficients[0].se).toBeNull();
    expect(s.warnings.join(' ')).toMatch(/"habitat=bog" could not be computed/);
    expect(JSON.stringify(s)).not.toMatch(/NaN|Infinity/);
  });
  it('drops repeated warning sentences', () => {
    expect(warningSentences([{ code: 'a', message: 'x' }, { code: 'b', message: 'x' }, { code: 'c', message: 'y' }])).toEqual(['x', 'y']);
  });
});
