/**
 * Hanging rootogram geometry (Kleiber & Zeileis 2016: bars of height
 * sqrt(observed) hang from the curve sqrt(expected), so bottom =
 * sqrt(e) - sqrt(o)), outlier tail probabilities against R's ppois and
 * pnbinom (fixture),
 * per-effort moments, and the messages for bad input.
 */
import { describe, expect, it } from 'vitest';
import { columnFromNumbers, columnFromTexts } from '@shared/data/table';
import type { DataTable } from '@shared/data/table';
import { countFrequencies, hangingRootogram, meanVarianceBySite, outlierFlags, QUASI_POISSON_NOTE, zeroCounts } from '@shared/diagnostics';
import { fitModel } from '@shared/engine';
import { quineFit, quineRef, quineSpec, quineTable } from './quine-reference';

describe('hanging rootogram', () => {
  const freq = countFrequencies([
    { label: 'Poisson', fit: quineFit('poisson') },
    { label: 'Negative binomial', fit: quineFit('negbin') },
  ]);

  it('bars hang from the curve: top = sqrt(e), bottom = sqrt(e) - sqrt(o), with R\'s expected frequencies', () => {
    const root = hangingRootogram(freq, 'Negative binomial');
    expect(root.model).toBe('Negative binomial');
    expect(root.bins).toHaveLength(freq.tailFrom + 1);
    root.bins.forEach((b, k) => {
      expect(b.top).toBe(b.sqrtExpected);
      expect(b.top - b.bottom).toBeCloseTo(b.sqrtObserved, 12);
      expect(b.sqrtObserved).toBeCloseTo(Math.sqrt(freq.observed[k]), 12);
      if (k < freq.tailFrom) expect(b.sqrtExpected).toBeCloseTo(Math.sqrt(quineRef.negbin.expectedFrequency[k]), 4);
    });
    // Zeros: 9 observed; the Poisson expects almost none, so its bar hangs far below zero.
    expect(hangingRootogram(freq).bins[0].bottom).toBeLessThan(-2.5);
  });

  it('names the models there are when asked for another', () => {
    expect(() => hangingRootogram(freq, 'ZIP')).toThrow(/no model "ZIP".*"Poisson", "Negative binomial"/);
  });
});

describe('expected frequencies for models fitted to different records', () => {
  it('are refused with a sentence naming both models', () => {
    const t = quineTable();
    const few = fitModel({ nrows: 100, columns: t.columns.map((c) => ({ ...c, texts: c.texts.slice(0, 100), values: c.values.slice(0, 100) })) }, quineSpec('poisson'));
    expect(() => countFrequencies([{ label: 'all', fit: quineFit('poisson') }, { label: 'first 100', fit: few }])).toThrow(/"all" and "first 100" were fitted to different records/);
    expect(() => zeroCounts([])).toThrow(/at least one fitted model/);
    expect(() => countFrequencies([{ label: 'a', fit: few }], { tailFrom: 0 })).toThrow(/whole number of 1 or more/);
  });

  it('a quasi-Poisson fit is read as Poisson, with a note', () => {
    const qp = fitModel(quineTable(), quineSpec('quasipoisson'));
    const f = countFrequencies([{ label: 'qp', fit: qp }], { tailFrom: 5 });
    expect(f.models[0].note).toBe(QUASI_POISSON_NOTE);
    expect(f.models[0].expected[2]).toBeCloseTo(quineRef.poisson.expectedFrequency[2], 4);
  });
});

describe('outlier flags (R: 1 - ppois(y - 1, mu) from the fixture)', () => {
  const fit = quineFit('poisson');
  it('flags exactly the records whose upper tail is below the threshold, most extreme first, and removes nothing', () => {
    const before = Float64Array.from(fit.y);
    const out = outlierFlags(fit, { threshold: 1e-6 });
    const refTail = quineRef.poisson.cdfLower.map((f) => 1 - f);
    const expectRows = refTail.map((p, i) => (p < 1e-6 ? i : -1)).filter((i) => i >= 0);
    expect(out.flags.map((f) => f.row).sort((a, b) => a - b)).toEqual(expectRows);
    for (const f of out.flags) {
      expect(f.tail).toBe('upper');
      expect(f.y).toBe(fit.y[f.row]);
      expect(f.expected).toBe(fit.expected[f.row]);
      if (refTail[f.row] > 1e-12) expect(Math.abs(f.probability - refTail[f.row])).toBeLessThan(1e-4 * refTail[f.row]);
    }
    expect(out.flags.every((f, k) => k === 0 || f.probability >= out.flags[k - 1].probability)).toBe(true);
    expect(Array.from(fit.y)).toEqual(Array.from(before));
    expect(out.expectedByChance).toBeCloseTo(146e-6, 12);
  });

  it('the lower tail only when asked, and P(Y <= y) as R gives it', () => {
    const upperOnly = outlierFlags(fit, { threshold: 1e-3 });
    expect(upperOnly.flags.some((f) => f.tail === 'lower')).toBe(false);
    const both = outlierFlags(fit, { threshold: 1e-3, lowerTail: true });
    const lower = both.flags.filter((f) => f.tail === 'lower');
    expect(lower.length).toBeGreaterThan(0);
    for (const f of lower) expect(Math.abs(f.probability - quineRef.poisson.cdfUpper[f.row])).toBeLessThan(1e-4 * quineRef.poisson.cdfUpper[f.row]);
    expect(() => outlierFlags(fit, { threshold: 0.7 })).toThrow(/between 0 and 0.5/);
  });
});

describe('outlier flags under a negative binomial (R: 1 - pnbinom(y - 1, size = theta, mu) from the fixture)', () => {
  const fit = quineFit('negbin');
  it('flags the records whose upper tail is below the threshold, with R\'s tail probabilities', () => {
    // The NB tails are heavier than the Poisson's: 0.01 gives a handful of quine's 146 pupils.
    const out = outlierFlags(fit, { threshold: 0.01 });
    const refTail = quineRef.negbin.cdfLower.map((f) => 1 - f);
    const expectRows = refTail.map((p, i) => (p < 0.01 ? i : -1)).filter((i) => i >= 0);
    expect(expectRows.length).toBeGreaterThan(0);
    expect(out.flags.map((f) => f.row).sort((a, b) => a - b)).toEqual(expectRows);
    for (const f of out.flags) expect(Math.abs(f.probability - refTail[f.row])).toBeLessThan(1e-3 * refTail[f.row]);
  });
});

describe('mean and variance per unit effort', () => {
  // Hand-computed (common practice: sample variance with divisor n - 1).
  const table: DataTable = {
    nrows: 5,
    columns: [columnFromTexts('site', ['a', 'a', 'b', 'b', 'c']), columnFromNumbers('n', [2, 6, 0, 3, 4]), columnFromNumbers('hours', [1, 2, 1, 3, 2])],
  };
  const fit = {
    distribution: 'negbin' as const,
    rows: Int32Array.from([0, 1, 2, 3, 4]),
    y: Float64Array.from([2, 6, 0, 3, 4]),
    mu: Float64Array.from([2, 4, 1, 2, 3]),
    expected: Float64Array.from([2, 4, 1, 2, 3]),
    theta: 2,
  };
  it('rates, a single-record site set aside, curves scaled to the mean effort', () => {
    const mv = meanVarianceBySite(table, fit, { siteColumn: 'site', effortColumn: 'hours' });
    expect(mv.sites.map((s) => s.site)).toEqual(['a', 'b']);
    expect(mv.sites[0].mean).toBeCloseTo(2.5, 12); // rates 2, 3
    expect(mv.sites[0].variance).toBeCloseTo(0.5, 12);
    expect(mv.sites[1].mean).toBeCloseTo(0.5, 12); // rates 0, 1
    expect(mv.sites[1].rows).toEqual([2, 3]);
    expect(mv.singleRecordSites).toEqual(['c']);
    expect(mv.meanEffort).toBeCloseTo(9 / 5, 12);
    const p = mv.poisson[mv.poisson.length - 1];
    expect(p.mean).toBeCloseTo(2.5, 12);
    expect(p.variance).toBeCloseTo(2.5 / 1.8, 12);
    expect(mv.negbin![0].variance).toBeCloseTo(0.5 / 1.8 + 0.25 / 2, 12);
  });
  it('names a missing or non-positive effort', () => {
    expect(() => meanVarianceBySite(table, fit, { siteColumn: 'plot' })).toThrow(/no site column "plot"/);
    const bad: DataTable = { ...table, columns: [...table.columns.slice(0, 2), columnFromNumbers('hours', [1, 0, 1, 1, 1])] };
    expect(() => meanVarianceBySite(bad, fit, { siteColumn: 'site', effortColumn: 'hours' })).toThrow(/data row 2/);
  });
});

describe('the tail bin and incomplete fits', () => {
  it('K is the largest count up to 30, else the 95th percentile within 30..60', async () => {
    const { chooseTailFrom, fittedDistribution } = await import('@shared/diagnostics');
    expect(chooseTailFrom([0, 3, 7, 2])).toBe(7);
    expect(chooseTailFrom([0, 0])).toBe(1);
    expect(chooseTailFrom(Array.from({ length: 100 }, (_, i) => (i < 96 ? 5 : 200)))).toBe(30);
    expect(chooseTailFrom(Array.from({ length: 100 }, (_, i) => i * 2))).toBe(60);
    expect(chooseTailFrom(Array.from({ length: 100 }, (_, i) => (i < 90 ? 3 : 45)))).toBe(45);
    const noZeroPart = { distribution: 'zip' as const, rows: Int32Array.from([0]), y: Float64Array.from([1]), mu: Float64Array.from([1]), expected: Float64Array.from([1]), theta: null };
    expect(() => fittedDistribution(noZeroPart)).toThrow(/zip fit carries no zero-part probabilities/);
  });
});
