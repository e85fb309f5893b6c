/**
 * The engine's entry point: fits a model spec to a table.
 *
 * poisson, quasipoisson and negbin are fitted here (./count-fit.ts), with
 * fixed site effects as dense dummy columns; zero-inflated and hurdle
 * models go to ./zero/fit-zero.ts; a random site effect to
 * ./sites/random.ts. All return the same FitOutcome.
 */
import type { DataTable } from '../data/table';
import type { ModelSpec } from '../model/spec';
import { hasZeroPart } from '../model/spec';
import { fitCountGlm } from './count-fit';
import { fitRandomSite } from './sites/random';
import type { FitControl, FitOutcome } from './types';
import { fitZeroModel } from './zero/fit-zero';

export function fitModel(table: DataTable, spec: ModelSpec, control: FitControl = {}): FitOutcome {
  if (hasZeroPart(spec.distribution)) return fitZeroModel(table, spec, control);
  if (spec.site?.effect === 'random') return fitRandomSite(table, spec, control);
  return fitCountGlm(table, spec, control);
}
