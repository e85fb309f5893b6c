/**
 * The optional report parts of one group in one call, from its analysis
 * table, the chosen model and the other models it was compared with:
 * { spec, comparison, diagnostics, data } to spread into a GroupTrend.
 * Each candidate is fitted once here with the engine; the chosen model's fit
 * may be handed in (`chosenFit`: the trend's own fit of the same table and
 * spec) so that it is not fitted twice.
 */
import type { DataTable } from '../data/table';
import { fitModel } from '../engine/fit';
import { FitCancelled, type FitControl, type FitOutcome } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import { comparisonDigest, type ModelComparisonDigest } from './comparison-digest';
import { dataSummary, type DataSummary } from './data-summary';
import { groupDiagnostics, type GroupDiagnostics } from './diagnostics-section';

export interface LabelledSpec {
  readonly label: string;
  readonly spec: ModelSpec;
}

export interface GroupParts {
  readonly spec: ModelSpec;
  readonly comparison?: ModelComparisonDigest;
  readonly diagnostics: GroupDiagnostics;
  readonly data: DataSummary;
}

export interface GroupPartsOptions {
  /** The analyst's words on why the chosen model. */
  readonly reason?: string;
  /** Seed of the residuals' uniforms (default 1). */
  readonly seed?: number;
  readonly control?: FitControl;
  /** The chosen model already fitted to this same table with this same spec (it is not fitted again). */
  readonly chosenFit?: FitOutcome;
}

/**
 * `others` are the models compared with the chosen one (none: no comparison
 * block). A candidate that cannot be fitted is left out of the comparison,
 * its reason added to the comparison's reading; the chosen model must fit.
 */
export function groupReportParts(table: DataTable, chosen: LabelledSpec, others: readonly LabelledSpec[] = [], options: GroupPartsOptions = {}): GroupParts {
  const outcome = options.chosenFit ?? fitModel(table, chosen.spec, options.control);
  const failed: string[] = [];
  const fitted = others.flatMap((o) => {
    try {
      return [{ ...o, outcome: fitModel(table, o.spec, options.control) }];
    } catch (err) {
      if (err instanceof FitCancelled) throw err;
      failed.push(`The model "${o.label}" could not be fitted for the comparison: ${(err as Error).message}`);
      return [];
    }
  });
  const digest = others.length ? comparisonDigest([...fitted, { ...chosen, outcome }], chosen.label, options.reason) : undefined;
  const comparison = digest && failed.length ? { ...digest, reading: [...digest.reading, ...failed] } : digest;
  return {
    spec: chosen.spec,
    ...(comparison ? { comparison } : {}),
    diagnostics: groupDiagnostics(outcome, chosen.label, options.seed ?? 1),
    data: dataSummary(table, chosen.spec),
  };
}
