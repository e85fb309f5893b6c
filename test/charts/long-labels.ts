/**
 * Model labels as long as the app writes them (invented), and the
 * frequency chart of MASS's quine data (test/diagnostics/quine-reference.ts)
 * with the first few of them, for the layout tests.
 */
import { frequencyChart, type ChartOption } from '@shared/charts';
import { countFrequencies } from '@shared/diagnostics';
import { quineFit } from '../diagnostics/quine-reference';

export const LONG_LABELS = [
  'Poisson, site fixed, season annual',
  'Negative binomial, site fixed, season annual',
  'Zero-inflated Poisson, site random, season linear',
  'Zero-inflated negative binomial, site random, season annual',
  'Hurdle negative binomial, site fixed, season annual',
  'Negative binomial, site random, season smooth (3 df)',
];

/** Quine's Poisson and negative-binomial fits in turn, under the first `models` labels. */
export function labelledFits(models: number) {
  return LONG_LABELS.slice(0, models).map((label, k) => ({ label, fit: quineFit(k % 2 ? 'negbin' : 'poisson') }));
}

export function frequenciesOf(models: number): ChartOption {
  return frequencyChart(countFrequencies(labelledFits(models), { tailFrom: 12 }));
}
