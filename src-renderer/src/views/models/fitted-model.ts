import type { DataTable } from '@shared/data/table';
import type { FitOutcome } from '@shared/engine/types';
import type { ModelSpec } from '@shared/model/spec';

/** One fitted model of one species, as the page keeps it. */
export interface FittedModel {
  /** species + spec: fitting the same spec again replaces the model. */
  readonly id: string;
  readonly species: string;
  readonly spec: ModelSpec;
  readonly label: string;
  /** The species' rows the model was fitted to (outcome.rows index into it). */
  readonly table: DataTable;
  readonly outcome: FitOutcome;
  /** Key of the cleaned data at fitting time (see dataKey). */
  readonly dataKey: string;
  readonly fittedAt: number;
  /** Rows whose offsets could not be logged were left out (the analyst's choice). */
  readonly dropBadOffsetRows: boolean;
}

export function modelId(species: string, spec: ModelSpec): string {
  return `${species}\u0000${JSON.stringify(spec)}`;
}

/** Adds the new models, each replacing one of the same species and spec. */
export function withModels(models: readonly FittedModel[], added: readonly FittedModel[]): FittedModel[] {
  const ids = new Set(added.map((m) => m.id));
  return [...models.filter((m) => !ids.has(m.id)), ...added];
}

export function modelsOf(models: readonly FittedModel[], species: string): FittedModel[] {
  return models.filter((m) => m.species === species);
}

/**
 * Names for the charts, where long labels crowd the axis: the distribution
 * alone when each model of the species has its own, else the full label.
 */
export function chartLabels(models: readonly FittedModel[], nameOf: (m: FittedModel) => string): string[] {
  const short = models.map(nameOf);
  return new Set(short).size === short.length ? short : models.map((m) => m.label);
}
