/**
 * Outlier tail probabilities P(Y >= y) far in the upper tail, where
 * 1 - F(y - 1) has no digits left, against R's ppois / pnbinom with
 * lower.tail = FALSE (test/reference/diagnostics/far-tails.json, made by
 * make-far-tails.R): Poisson, negative binomial and zero-inflated Poisson.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { outlierFlags, type FitForDiagnostics } from '@shared/diagnostics';

interface Case {
  y: number;
  mu: number;
  theta?: number;
  pi?: number;
  upper: number;
}

const ref = JSON.parse(readFileSync(resolve(__dirname, '../reference/diagnostics/far-tails.json'), 'utf8')) as { poisson: Case[]; negbin: Case[]; zip: Case[] };

function fitOf(distribution: 'poisson' | 'negbin' | 'zip', cases: Case[]): FitForDiagnostics {
  const n = cases.length;
  return {
    distribution,
    rows: Int32Array.from({ length: n }, (_, i) => i),
    y: Float64Array.from(cases, (c) => c.y),
    mu: Float64Array.from(cases, (c) => c.mu),
    theta: distribution === 'negbin' ? cases[0].theta! : null,
    zeroProb: distribution === 'zip' ? Float64Array.from(cases, (c) => c.pi!) : undefined,
    expected: Float64Array.from(cases, (c) => (1 - (c.pi ?? 0)) * c.mu),
  } as FitForDiagnostics;
}

describe('far upper tails (R, lower.tail = FALSE)', () => {
  it.each([['poisson'], ['zip']] as const)('%s: every tail to 1e-9 relative', (distribution) => {
    const cases = ref[distribution];
    const out = outlierFlags(fitOf(distribution, cases), { threshold: 0.49 });
    expect(out.flags).toHaveLength(cases.length);
    for (const f of out.flags) expect(Math.abs(f.probability / cases[f.row].upper - 1)).toBeLessThan(1e-9);
  });

  it('negative binomial (one theta per fit): every tail to 1e-9 relative', () => {
    for (const c of ref.negbin) {
      const [flag] = outlierFlags(fitOf('negbin', [c]), { threshold: 0.49 }).flags;
      expect(Math.abs(flag.probability / c.upper - 1)).toBeLessThan(1e-9);
    }
  });
});
