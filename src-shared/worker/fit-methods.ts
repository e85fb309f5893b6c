import type { DataTable } from '../data/table';
import { fitModel } from '../engine/fit';
import type { FitOutcome } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import type { CallContext } from './port';

/**
 * What a fit worker serves. The context is the engine's FitControl
 * (progress out, cancel flag in), so a fit needs no wrapping.
 */
export const fitMethods = {
  fit: ([table, spec]: readonly [DataTable, ModelSpec], ctx: CallContext): FitOutcome => fitModel(table, spec, ctx),
};

export type FitMethods = typeof fitMethods;
