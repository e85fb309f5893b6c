/**
 * The whole programme's report run, the same from the command line and the
 * app: the trend of each group (species) with the model chosen for it, the
 * multi-species composite where it can be made, then the report document.
 * Pure: nothing is written here, so a cancelled run leaves nothing behind.
 *
 *   buildProgrammeReport(plan, { signal, onProgress, runner }) -> ReportDocument
 *
 * `onProgress` gets { group, done, total, fraction, stage }: `done` groups
 * of `total` steps finished (the composite is one step more), `fraction` of
 * the current one. Cancelling (signal raised) rejects with FitCancelled.
 */
import type { EditLog } from '../cleaning/edit-entry';
import type { DataTable } from '../data/table';
import { FitCancelled } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import { compositeTrend, type CompositeResult } from '../trend/composite';
import type { FitRunner } from '../trend/fit-runner';
import { decisionFlags } from '../trend/flags';
import { analyseTrend } from '../trend/trend-analysis';
import type { Provenance } from './appendix';
import { buildTrendReport } from './build';
import { groupReportParts, type GroupParts, type LabelledSpec } from './group-parts';
import type { GroupTrend } from './group-section';
import type { ReportDocument } from './model';

export const DEFAULT_COMPOSITE_REPLICATES = 199;

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
}

export interface ProgrammePlan {
  readonly title: string;
  readonly subtitle?: string;
  /** The column the groups are values of ("species"); absent for a single table. */
  readonly groupColumn?: string;
  readonly groups: readonly PlannedGroup[];
  /**
   * The rows of every group together (with the group column), for the
   * composite's joint site bootstrap; absent: no composite.
   */
  readonly compositeTable?: DataTable;
  readonly provenance: Provenance;
  /** Bootstrap replicates of the composite's limits (default 199). */
  readonly replicates?: number;
  /** Seed of the composite bootstrap (default 1). */
  readonly seed?: number;
  /** Cautions beyond the general ones. */
  readonly cautions?: readonly string[];
  /** The cleaning log of the records behind the tables (what cleaning changed, and the audit log sheet). */
  readonly cleaning?: EditLog;
}

export interface ProgrammeProgress {
  /** The group being worked on ('' for a single table; the composite's own name while it runs). */
  readonly group: string;
  readonly done: number;
  readonly total: number;
  /** Fraction (0..1) of the current step. */
  readonly fraction: number;
  readonly stage: string;
  /** Items of the current stage done, of how many (bootstrap refits), when it counts them. */
  readonly items?: { readonly done: number; readonly total: number };
}

export interface ProgrammeOptions {
  readonly signal?: { readonly aborted: boolean };
  readonly onProgress?: (p: ProgrammeProgress) => void;
  /** Runs the composite's bootstrap refits (default: one after another in this thread). */
  readonly runner?: FitRunner;
}

export const COMPOSITE_STEP = 'composite index';

/** Why the plan gets no composite, or null when it does. */
export function compositeBlocker(plan: ProgrammePlan, fitted: readonly GroupTrend[]): string | null {
  if (!plan.groupColumn || !plan.compositeTable || plan.groups.length < 2) return null;
  const sites = new Set(plan.groups.map((g) => g.spec.site?.column ?? ''));
  if (sites.has('') || sites.size > 1) return 'There is no composite index: its limits resample whole sites together for every species, so the model of each species needs the same "site" column (here one has none, or they differ).';
  const times = new Set(plan.groups.map((g) => g.spec.time?.column ?? ''));
  if (times.size > 1) return 'There is no composite index: the chosen models do not share one time column.';
  if (fitted.some((g) => !g.result)) return 'There is no composite index, because not every species could be fitted.';
  return null;
}

/** The group's spec, model comparison, diagnostics and data summary (without the diagnostics, and said so, when they fail). */
function partsOf(g: PlannedGroup, signal: ProgrammeOptions['signal'], cautions: string[]): Partial<GroupParts> & { spec: ModelSpec } {
  try {
    return groupReportParts(g.table, { label: g.model ?? 'The chosen model', spec: g.spec }, g.others ?? [], { control: { signal } });
  } catch (err) {
    if (err instanceof FitCancelled || signal?.aborted) throw new FitCancelled();
    cautions.push(`The comparison and diagnostics of ${g.label ?? g.group} could not be made: ${(err as Error).message}`);
    return { spec: g.spec };
  }
}

function checkCancel(signal: ProgrammeOptions['signal']): void {
  if (signal?.aborted) throw new FitCancelled();
}

export async function buildProgrammeReport(plan: ProgrammePlan, options: ProgrammeOptions = {}): Promise<ReportDocument> {
  return (await runProgrammeReport(plan, options)).document;
}

/** The report and the groups whose trend could not be fitted or did not converge (their names). */
export async function runProgrammeReport(plan: ProgrammePlan, options: ProgrammeOptions = {}): Promise<{ document: ReportDocument; unsound: string[] }> {
  if (plan.groups.length === 0) throw new RangeError('A report needs at least one species (group) with a chosen model.');
  const { signal } = options;
  const notify = options.onProgress ?? (() => {});
  const wantsComposite = !!plan.groupColumn && !!plan.compositeTable && plan.groups.length >= 2;
  const total = plan.groups.length + (wantsComposite ? 1 : 0);
  const groups: GroupTrend[] = [];
  const cautions = [...(plan.cautions ?? [])];
  for (const [i, g] of plan.groups.entries()) {
    checkCancel(signal);
    notify({ group: g.group, done: i, total, fraction: 0, stage: 'starting' });
    const onProgress = (d: number, n: number, stage: string) => notify({ group: g.group, done: i, total, fraction: n > 0 ? d / n : 0, stage, ...(n > 1 ? { items: { done: d, total: n } } : {}) });
    try {
      const result = await analyseTrend(g.table, g.spec, { signal, onProgress });
      onProgress(0, 1, g.others?.length ? 'comparison and diagnostics' : 'diagnostics');
      groups.push({ group: g.group, label: g.label, result, flags: decisionFlags(result.slope), ...partsOf(g, signal, cautions) });
    } catch (err) {
      if (err instanceof FitCancelled || signal?.aborted) throw new FitCancelled();
      groups.push({ group: g.group, label: g.label, spec: g.spec, error: (err as Error).message });
    }
  }
  checkCancel(signal);
  let composite: CompositeResult['composite'] | undefined;
  const blocker = compositeBlocker(plan, groups);
  if (blocker) cautions.push(blocker);
  else if (wantsComposite) {
    const done = plan.groups.length;
    notify({ group: COMPOSITE_STEP, done, total, fraction: 0, stage: 'starting' });
    const first = plan.groups[0].spec;
    try {
      composite = (
        await compositeTrend(plan.compositeTable!, first, plan.groupColumn!, {
          replicates: plan.replicates ?? DEFAULT_COMPOSITE_REPLICATES,
          seed: plan.seed ?? 1,
          specs: Object.fromEntries(plan.groups.map((g) => [g.group, g.spec])),
          runner: options.runner,
          signal,
          onProgress: (d, n, stage) => notify({ group: COMPOSITE_STEP, done, total, fraction: n > 0 ? d / n : 0, stage, ...(n > 1 ? { items: { done: d, total: n } } : {}) }),
        })
      ).composite;
    } catch (err) {
      if (err instanceof FitCancelled || signal?.aborted) throw new FitCancelled();
      cautions.push(`There is no composite index: ${(err as Error).message}`);
    }
  }
  checkCancel(signal);
  notify({ group: '', done: total, total, fraction: 1, stage: 'assembling the report' });
  const provenance: Provenance = composite ? { ...plan.provenance, seeds: [...plan.provenance.seeds, { what: 'the composite bootstrap', value: composite.seed }] } : plan.provenance;
  const document = buildTrendReport({
    title: plan.title,
    subtitle: plan.subtitle,
    spec: plan.groups[0].spec,
    groupColumn: plan.groupColumn,
    groups,
    composite,
    cautions,
    provenance,
    cleaning: plan.cleaning,
  });
  return { document, unsound: groups.filter((g) => !g.result?.fit.converged).map((g) => g.label ?? g.group) };
}
