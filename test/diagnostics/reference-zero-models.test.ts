/**
 * Expected frequencies and zeros of zero-inflated and hurdle fits against
 * pscl (test/reference/diagnostics/zero-fixtures.json, made by
 * make-diagnostics.R): pscl's bioChemists, zeroinfl / hurdle of
 * art ~ fem + mar + kid5 + phd + ment with the same terms in the zero part,
 * expected frequencies colSums(predict(fit, type = "prob")).
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { tableFromTexts } from '@shared/data/table';
import { countFrequencies, zeroCounts } from '@shared/diagnostics';
import { fitModel } from '@shared/engine';
import { parseModelSpec } from '@shared/model/spec';

const DIR = resolve(__dirname, '../reference/diagnostics');
interface ZeroRef {
  R: string;
  packages: Record<string, string>;
  tolerance: { frequency: number };
  predictors: string[];
  observedFrequency: number[];
  fits: Record<'zip' | 'zinb' | 'hurdle-negbin', { theta: number | null; logLik: number; expectedFrequency: number[] }>;
}
const ref = JSON.parse(readFileSync(resolve(DIR, 'zero-fixtures.json'), 'utf8')) as ZeroRef;
const lines = readFileSync(resolve(DIR, 'bioChemists.csv'), 'utf8').trim().split(/\r?\n/);
const table = tableFromTexts(lines[0].split(','), lines.slice(1).map((l) => l.split(',')));
const terms = ref.predictors.map((c) => (c === 'fem' || c === 'mar' ? { column: c, type: 'factor' as const } : { column: c, type: 'numeric' as const }));

describe.each(['zip', 'zinb', 'hurdle-negbin'] as const)('%s (pscl)', (distribution) => {
  const fit = fitModel(table, parseModelSpec({ response: 'art', distribution, predictors: terms, zeroPredictors: terms }));
  const r = ref.fits[distribution];

  it('the engine reaches pscl\'s log-likelihood (precondition)', () => {
    expect(Math.abs((fit.summary.logLikelihood as number) - r.logLik)).toBeLessThan(1e-5 * Math.abs(r.logLik));
  });

  it('expected frequencies per count and in the tail match colSums(predict(type = "prob"))', () => {
    const f = countFrequencies([{ label: distribution, fit }], { tailFrom: 12 });
    const e = f.models[0].expected;
    for (let k = 0; k < 12; k++) expect(Math.abs(e[k] - r.expectedFrequency[k])).toBeLessThan(ref.tolerance.frequency * r.expectedFrequency[k] + 1e-6);
    // The tail in R: the number of records minus the bins below 12 (pscl's matrix stops at max(art) = 19).
    const below = r.expectedFrequency.slice(0, 12).reduce((a, v) => a + v, 0);
    expect(Math.abs(e[12] - (fit.y.length - below))).toBeLessThan(ref.tolerance.frequency * (fit.y.length - below) + 1e-6);
    expect(fit.y.length).toBe(915);
    expect(f.observed.slice(0, 12)).toEqual(ref.observedFrequency.slice(0, 12));
  });

  it('expected zeros match the first column', () => {
    const z = zeroCounts([{ label: distribution, fit }]);
    expect(z.observed).toBe(ref.observedFrequency[0]);
    expect(Math.abs(z.models[0].expected - r.expectedFrequency[0])).toBeLessThan(ref.tolerance.frequency * r.expectedFrequency[0]);
  });
});
