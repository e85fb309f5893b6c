/**
 * The hanging rootogram (Kleiber, C. & Zeileis, A. 2016, "Visualizing count
 * data regressions using rootograms", The American Statistician 70(3):
 * 296-303): the square root of the expected frequency drawn as a curve, and
 * from it a bar of height sqrt(observed) hanging down, so that the bar's
 * bottom, sqrt(expected) - sqrt(observed), shows the misfit against the zero
 * line: below zero the model under-predicts that count, above it over-predicts.
 */
import type { CountFrequencies } from './count-frequencies';
import { DiagnosticsInputError } from './fitted-distribution';

export interface RootogramBin {
  readonly label: string;
  readonly sqrtExpected: number;
  readonly sqrtObserved: number;
  /** Top of the hanging bar: sqrt(expected). */
  readonly top: number;
  /** Bottom of the hanging bar: sqrt(expected) - sqrt(observed). */
  readonly bottom: number;
}

export interface HangingRootogram {
  readonly model: string;
  readonly bins: RootogramBin[];
  /** Table rows per bin (as in the frequencies). */
  readonly rowsByBin: number[][];
}

/** The rootogram of one model (by its label; default the first) of a frequency table. */
export function hangingRootogram(freq: CountFrequencies, model?: string): HangingRootogram {
  const m = model === undefined ? freq.models[0] : freq.models.find((x) => x.label === model);
  if (!m) {
    const known = freq.models.map((x) => `"${x.label}"`).join(', ');
    throw new DiagnosticsInputError('unknown-model', `There is no model "${model}" among the frequencies; the models are ${known}.`);
  }
  const bins = freq.labels.map((label, k) => {
    const sqrtExpected = Math.sqrt(m.expected[k]);
    const sqrtObserved = Math.sqrt(freq.observed[k]);
    return { label, sqrtExpected, sqrtObserved, top: sqrtExpected, bottom: sqrtExpected - sqrtObserved };
  });
  return { model: m.label, bins, rowsByBin: freq.rowsByBin };
}
