import type { ModelSpec } from './spec';

/**
 * Whether the spec's time column is already a main-effect predictor (a
 * smooth curve, a factor or a number). The engine then adds no season term
 * of its own (src-shared/engine/model-terms.ts), so neither do the written
 * model and the model's name.
 */
export function timeIsPredictor(spec: ModelSpec): boolean {
  const time = spec.time;
  return !!time && spec.predictors.some((t) => t.type !== 'interaction' && t.column === time.column);
}
