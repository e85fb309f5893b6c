/**
 * The engine's entry point: fits a model spec to a table.
 *
 * poisson, quasipoisson and negbin are fitted by ./count-fit.ts, or with
 * fixed site effects absorbed (no dummy columns) by ./sites/absorbed.ts;
 * zero-inflated and hurdle models go to ./zero/fit-zero.ts; a random site
 * effect to ./sites/random.ts. All return the same FitOutcome.
 */
import type { DataTable } from '../data/table';
import type { ModelSpec } from '../model/spec';
import { hasZeroPart } from '../model/spec';
import { fitCountGlm } from './count-fit';
import { fitAbsorbedSites } from './sites/absorbed';
import { fitRandomSite } from './sites/random';
import type { FitControl, FitOutcome } from './types';
import { fitZeroModel } from './zero/fit-zero';

export function fitModel(table: DataTable, spec: ModelSpec, control: FitControl = {}): FitOutcome {
  if (hasZeroPart(spec.distribution)) return fitZeroModel(table, spec, control);
  if (spec.site?.effect === 'random') return fitRandomSite(table, spec, control);
  if (spec.site?.effect === 'fixed' && spec.robust !== 'site') return fitAbsorbedSites(table, spec, control);
  return fitCountGlm(table, spec, control);
}
