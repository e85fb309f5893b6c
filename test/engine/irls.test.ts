import { describe, expect, it } from 'vitest';
import { poissonFamily } from '@shared/engine/families/poisson';
import { irls } from '@shared/engine/irls';
import { FitCancelled, FitInputError } from '@shared/engine/types';

// A small Poisson regression: y on an intercept and x.
const x1 = [0, 1, 2, 3, 4, 5, 6, 7];
const y = Float64Array.from([1, 0, 2, 3, 2, 5, 6, 9]);
const X = Float64Array.from([...x1.map(() => 1), ...x1]);
const base = { x: X, n: 8, p: 2, y, offset: null, family: poissonFamily };

function scoreNorm(beta: Float64Array): number {
  let s0 = 0;
  let s1 = 0;
  for (let i = 0; i < 8; i++) {
    const r = y[i] - Math.exp(beta[0] + beta[1] * x1[i]);
    s0 += r;
    s1 += r * x1[i];
  }
  return Math.hypot(s0, s1);
}

describe('irls', () => {
  it('converges to a zero of the Poisson score equations X\'(y - mu) = 0', () => {
    const fit = irls(base);
    expect(fit.converged).toBe(true);
    expect(scoreNorm(fit.beta)).toBeLessThan(1e-7);
    expect(fit.warnings).toEqual([]);
    expect(fit.halvings).toBe(0);
  });

  it('halves a step that raises the deviance and still converges from a poor start', () => {
    // From beta = (-2, -0.8) the first full step overshoots (mu explodes); halving brings it back.
    const fit = irls({ ...base, startBeta: Float64Array.from([-2, -0.8]) });
    expect(fit.halvings).toBeGreaterThan(0);
    expect(fit.converged).toBe(true);
    expect(scoreNorm(fit.beta)).toBeLessThan(1e-7);
  });

  it('refuses a start whose deviance is not finite', () => {
    expect(() => irls({ ...base, startBeta: Float64Array.from([NaN, 0]) })).toThrow(FitInputError);
    expect(() => irls({ ...base, startBeta: Float64Array.from([800, 0]) })).toThrow(/starting values give a non-finite deviance/);
  });

  it('reports non-convergence as a not-converged warning saying what was tried', () => {
    const fit = irls({ ...base, control: { maxIterations: 2 } });
    expect(fit.converged).toBe(false);
    expect(fit.warnings).toHaveLength(1);
    expect(fit.warnings[0].code).toBe('not-converged');
    expect(fit.warnings[0].message).toMatch(/2 iterations of reweighted least squares/);
  });

  it('can be cancelled between iterations', () => {
    expect(() => irls({ ...base, control: { signal: { aborted: true } } })).toThrow(FitCancelled);
  });

  it('reports progress', () => {
    const seen: string[] = [];
    irls({ ...base, control: { onProgress: (_f, stage) => seen.push(stage) } });
    expect(seen.length).toBeGreaterThan(0);
    expect(seen.every((s) => s === 'irls')).toBe(true);
  });
});
