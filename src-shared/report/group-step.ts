/**
 * One group's (species') step of the programme report: its trend with the
 * chosen model, the decision flags, and the comparison, diagnostics and data
 * summary (the chosen fit reused). Runs in this thread or, whole, in a fit
 * worker (groupStepMethods), so that the species' fits share the workers
 * with the composite's bootstrap.
 */
import type { DataTable } from '../data/table';
import { FitCancelled, type FitOutcome } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import { decisionFlags } from '../trend/flags';
import { analyseTrend } from '../trend/trend-analysis';
import type { CallContext } from '../worker/port';
import { groupReportParts, type GroupParts, type LabelledSpec } from './group-parts';
import type { GroupTrend } from './group-section';

/** One group (species) of the report: its rows and the model chosen for it. */
export interface PlannedGroup {
  /** The value of the group column ("common_toad"), or '' for a single table. */
  readonly group: string;
  readonly label?: string;
  readonly table: DataTable;
  readonly spec: ModelSpec;
  /** The chosen model's name (the comparison and diagnostics name it). */
  readonly model?: string;
  /** The other models of the group, compared with the chosen one on the same rows. */
  readonly others?: readonly LabelledSpec[];
  /** Rows whose offsets cannot be logged were left out of `table` (the report history records it with the model). */
  readonly dropBadOffsetRows?: boolean;
}

export interface GroupStepResult {
  readonly trend: GroupTrend;
  /** Cautions for the report (the comparison or diagnostics that could not be made). */
  readonly cautions: readonly string[];
}

export interface GroupStepOptions {
  readonly signal?: { readonly aborted: boolean };
  readonly onProgress?: (done: number, total: number, stage: string) => void;
}

/** Runs group steps somewhere (this thread, or a worker pool); rejects with FitCancelled when cancelled. */
export type GroupStepRunner = (group: PlannedGroup, options?: GroupStepOptions) => Promise<GroupStepResult>;

/** The group's spec, model comparison, diagnostics and data summary (without the diagnostics, and said so, when they fail). */
function partsOf(g: PlannedGroup, signal: GroupStepOptions['signal'], cautions: string[], chosenFit?: FitOutcome): Partial<GroupParts> & { spec: ModelSpec } {
  try {
    return groupReportParts(g.table, { label: g.model ?? 'The chosen model', spec: g.spec }, g.others ?? [], { control: { signal }, chosenFit });
  } catch (err) {
    if (err instanceof FitCancelled || signal?.aborted) throw new FitCancelled();
    cautions.push(`The comparison and diagnostics of ${g.label ?? g.group} could not be made: ${(err as Error).message}`);
    return { spec: g.spec };
  }
}

/** The step in this thread: a group that cannot be fitted gets its error, cancelling throws FitCancelled. */
export const groupStep: GroupStepRunner = async (g, options = {}) => {
  const { signal } = options;
  const onProgress = options.onProgress ?? (() => {});
  const cautions: string[] = [];
  try {
    let chosenFit: FitOutcome | undefined;
    const result = await analyseTrend(g.table, g.spec, { signal, onProgress, onMainFit: (fit, spec) => (chosenFit = spec === g.spec ? fit : undefined) });
    onProgress(0, 1, g.others?.length ? 'comparison and diagnostics' : 'diagnostics');
    return { trend: { group: g.group, label: g.label, result, flags: decisionFlags(result.slope), ...partsOf(g, signal, cautions, chosenFit) }, cautions };
  } catch (err) {
    if (err instanceof FitCancelled || signal?.aborted) throw new FitCancelled();
    return { trend: { group: g.group, label: g.label, spec: g.spec, error: (err as Error).message }, cautions };
  }
};

/** What a fit worker serves for the report's group steps. */
export const groupStepMethods = {
  groupStep: ([g]: readonly [PlannedGroup], ctx: CallContext): Promise<GroupStepResult> =>
    groupStep(g, { signal: ctx.signal, onProgress: (d, n, stage) => ctx.onProgress(n > 0 ? d / n : 0, stage) }),
};

export type GroupStepMethods = typeof groupStepMethods;
