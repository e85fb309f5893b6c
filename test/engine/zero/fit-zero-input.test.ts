/**
 * fitZeroModel on awkward input: plain errors naming the column and the fix,
 * cancellation, progress, the non-convergence sentence, and the shape of
 * the outcome (per-row arrays, covariance size).
 */
import { describe, expect, it } from 'vitest';
import { columnFromNumbers, columnFromTexts } from '@shared/data/table';
import type { DataTable } from '@shared/data/table';
import { FitCancelled, FitInputError } from '@shared/engine/types';
import { fitZeroModel } from '@shared/engine/zero/fit-zero';
import type { ModelSpecInput } from '@shared/model/spec';
import { parseModelSpec } from '@shared/model/spec';
import { createRng } from '@shared/demo/prng';
import { samplePoisson } from '@shared/demo/samplers';
import { bioChemists, referenceFit } from './reference-data';

const table = bioChemists();
const zinbSpec = parseModelSpec(referenceFit('zinb').spec);

function small(counts: number[]): DataTable {
  return { nrows: counts.length, columns: [columnFromNumbers('n', counts), columnFromNumbers('x', counts.map((_, i) => i / counts.length))] };
}

function fitError(t: DataTable, s: ModelSpecInput): FitInputError {
  try {
    fitZeroModel(t, parseModelSpec(s));
  } catch (e) {
    if (e instanceof FitInputError) return e;
    throw e;
  }
  throw new Error('expected a FitInputError');
}

describe('bad input gets a plain message', () => {
  it('no zero counts: names the response and suggests poisson/negbin', () => {
    const e = fitError(small([1, 2, 3, 1, 4]), { response: 'n', distribution: 'zip' });
    expect(e.code).toBe('no-zero-counts');
    expect(e.message).toMatch(/"n"/);
    expect(e.message).toMatch(/poisson/);
  });
  it('hurdle with every non-zero count 1: the truncated count part has nothing to estimate', () => {
    const e = fitError(small([0, 1, 0, 1, 1, 0]), { response: 'n', distribution: 'hurdle-negbin' });
    expect(e.code).toBe('no-count-part');
    expect(e.message).toMatch(/presence\/absence/);
  });
  it('every count zero', () => {
    expect(fitError(small([0, 0, 0]), { response: 'n', distribution: 'hurdle-poisson' }).code).toBe('all-zero-response');
  });
  it('a random site effect is refused with the way out', () => {
    const e = fitError(table, { ...referenceFit('zip').spec, site: { column: 'site_invented', effect: 'random' } });
    expect(e.code).toBe('unsupported-site');
    expect(e.message).toMatch(/"effect": "fixed"/);
  });
  it('robust SEs without a site column are refused', () => {
    expect(fitError(table, { ...referenceFit('zip').spec, robust: 'site' }).code).toBe('robust-needs-site');
  });
  it('a distribution without a zero part is refused', () => {
    expect(fitError(table, { response: 'art', distribution: 'poisson' }).code).toBe('wrong-distribution');
  });
  it('a non-count response and a non-positive offset name the rows (shared model frame)', () => {
    const e = fitError(small([0, 1.5, 2]), { response: 'n', distribution: 'zip' });
    expect(e.message).toMatch(/row 2/);
    const t = { ...small([0, 1, 2]), columns: [...small([0, 1, 2]).columns, columnFromNumbers('effort', [1, 0, 2])] };
    const e2 = fitError(t, { response: 'n', distribution: 'zip', offsets: [{ column: 'effort', log: true }] });
    expect(e2.message).toMatch(/"effort"/);
  });
});

describe('control', () => {
  it('an aborted signal throws FitCancelled', () => {
    expect(() => fitZeroModel(table, zinbSpec, { signal: { aborted: true } })).toThrow(FitCancelled);
  });
  it('a signal aborted part-way through stops the fit', () => {
    let checks = 0;
    const signal = {
      get aborted() {
        checks++;
        return checks > 3;
      },
    };
    expect(() => fitZeroModel(table, zinbSpec, { signal })).toThrow(FitCancelled);
  });
  it('progress goes from 0 to 1 and never backwards', () => {
    const seen: number[] = [];
    fitZeroModel(table, zinbSpec, { onProgress: (f) => seen.push(f) });
    expect(seen[0]).toBe(0);
    expect(seen[seen.length - 1]).toBe(1);
    for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThanOrEqual(seen[i - 1]);
  });
  it('too few iterations: not converged, with a sentence saying what was tried', () => {
    const out = fitZeroModel(table, zinbSpec, { maxIterations: 1 });
    expect(out.summary.converged).toBe(false);
    const w = out.warnings.find((x) => x.code === 'not-converged');
    expect(w?.message).toMatch(/did not converge: the iteration limit \(1\) was reached after 1 Newton steps/);
    expect(out.summary.warnings).toContain(w!.message);
  });
  it('fixed sites with only zero counts are left out with a warning naming them; few sites are flagged for robust SEs', () => {
    const y = [0, 0, 0, 0, 2, 0, 1, 3, 0, 5, 0, 1];
    const site = ['a', 'a', 'a', 'b', 'b', 'b', 'c', 'c', 'c', 'd', 'd', 'd'];
    const t = { nrows: 12, columns: [columnFromNumbers('n', y), columnFromTexts('site', site)] };
    const out = fitZeroModel(t, parseModelSpec({ response: 'n', distribution: 'zip', site: { column: 'site', effect: 'fixed' }, robust: 'site' }));
    expect(out.warnings.find((w) => w.code === 'all-zero-site')?.message).toMatch(/site "a" \(3 rows\) is zero/);
    expect(out.siteEffects!.levels).toEqual(['b', 'c', 'd']);
    expect(Array.from(out.rows)).toEqual([3, 4, 5, 6, 7, 8, 9, 10, 11]);
    expect(out.warnings.map((w) => w.code)).toContain('few-sites');
    expect(out.summary.coefficients).toEqual([]);
  });
});

describe('a habitat where the species was never counted (seeded invented data)', () => {
  const rng = createRng(11);
  const hab = Array.from({ length: 300 }, (_, i) => ['reed', 'sedge', 'open'][i % 3]);
  const y = hab.map((h) => (h === 'open' ? 0 : rng.uniform() < 0.3 ? 0 : samplePoisson(rng, h === 'reed' ? 2 : 4)));
  const t = { nrows: 300, columns: [columnFromNumbers('y', y), columnFromTexts('habitat', hab)] };
  const habitat = [{ column: 'habitat', type: 'factor' as const }];
  it.each(['zip', 'zinb', 'hurdle-poisson', 'hurdle-negbin'] as const)('%s: the all-zero reference level is moved and its rows left out, with warnings', (d) => {
    const out = fitZeroModel(t, parseModelSpec({ response: 'y', distribution: d, predictors: habitat, zeroPredictors: habitat }));
    expect(out.summary.converged).toBe(true);
    expect(out.rows.length).toBe(200);
    const codes = out.warnings.map((w) => w.code);
    expect(codes.filter((c) => c === 'all-zero-level').length).toBe(2);
    expect(out.summary.coefficients.map((c) => c.term)).toEqual(['intercept', 'habitat=sedge']);
    expect(out.summary.warnings.join(' ')).not.toMatch(/Very large standard errors/);
  });
});

describe('boundary estimates are flagged (seeded invented data)', () => {
  const rng = createRng(3);
  const x = Array.from({ length: 200 }, () => 2 * rng.uniform() - 1);
  const tableOf = (y: number[]) => ({ nrows: y.length, columns: [columnFromNumbers('n', y), columnFromNumbers('x', x)] });
  const terms = [{ column: 'x', type: 'numeric' as const }];

  it('ZIP on 0/1 counts: no extra zeros, very large zero-part SEs', () => {
    const y = x.map(() => (rng.uniform() < 0.4 ? 1 : 0));
    const out = fitZeroModel(tableOf(y), parseModelSpec({ response: 'n', distribution: 'zip', predictors: terms, zeroPredictors: terms }));
    const text = out.summary.warnings.join(' ');
    expect(text).toMatch(/no zeros beyond those of the count distribution/);
    expect(text).toMatch(/Very large standard errors for zero part "intercept"/);
  });

  it('a zero-part predictor that separates zeros from non-zeros: not converged or flagged, never silent', () => {
    const y = x.map((v) => (v < 0 ? 0 : 1 + samplePoisson(rng, 3)));
    const out = fitZeroModel(tableOf(y), parseModelSpec({ response: 'n', distribution: 'zip', predictors: terms, zeroPredictors: terms }));
    expect(out.summary.warnings.join(' ')).toMatch(/Very large standard errors for zero part "intercept", zero part "x"/);
    expect(JSON.stringify(out.summary)).not.toMatch(/NaN|Infinity/);
  });
});

describe('outcome shape', () => {
  it('per-row arrays, covariance of [beta, gamma] and theta for ZINB', () => {
    const out = fitZeroModel(table, zinbSpec);
    const n = table.nrows;
    expect(out.rows.length).toBe(n);
    expect(out.mu.length).toBe(n);
    expect(out.zeroProb!.length).toBe(n);
    expect(out.expected.length).toBe(n);
    const k = out.beta.length + out.gamma.length;
    expect(out.covariance.length).toBe(k * k);
    expect(out.betaNames).toEqual(out.summary.coefficients.map((c) => c.term));
    expect(out.gammaNames).toEqual(out.summary.zeroCoefficients.map((c) => c.term));
    expect(Math.sqrt(out.covariance[0])).toBeCloseTo(out.summary.coefficients[0].se, 12);
    // ZI mean (1 - pi) mu (common practice)
    for (let i = 0; i < n; i += 50) expect(out.expected[i]).toBeCloseTo((1 - out.zeroProb![i]) * out.mu[i], 12);
    expect(out.theta).toBe(out.summary.theta);
  });
});

describe('time term', () => {
  it('an annual time term enters the count part as a factor (shared model-terms), like the same factor predictor', () => {
    const base = referenceFit('zip').spec;
    const others = (base.predictors ?? []).filter((t) => t.type === 'interaction' || t.column !== 'kid5');
    const viaTime = fitZeroModel(table, parseModelSpec({ ...base, predictors: others, time: { column: 'kid5', trend: 'annual' } }));
    const viaFactor = fitZeroModel(table, parseModelSpec({ ...base, predictors: [...others, { column: 'kid5', type: 'factor' }] }));
    expect(viaTime.betaNames).toContain('kid5=1');
    expect(viaTime.betaNames).toEqual(viaFactor.betaNames);
    expect(viaTime.summary.logLikelihood!).toBeCloseTo(viaFactor.summary.logLikelihood!, 8);
  });
});
