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
 * A `runner` over worker threads (poolRunner of the command line's pool)
 * runs the groups' steps and the composite's bootstrap replicates there,
 * all queued at once, so both cores work from the start.
 *
 * runProgrammeReport also gives the run's record for the project's report
 * history (history-record.ts) and, when the plan has the last entry
 * (`previous`), how this run compares with it (since-last.ts; the report
 * then has the section "Since the last report").
 */
import type { EditLog } from '../cleaning/edit-entry';
import type { DataTable } from '../data/table';
import { FitCancelled } from '../engine/types';
import { compositeTrend, type CompositeResult } from '../trend/composite';
import type { FitRunner } from '../trend/fit-runner';
import type { Provenance } from './appendix';
import { buildTrendReport, type ReportInput } from './build';
import type { GroupTrend } from './group-section';
import { groupStep, type PlannedGroup } from './group-step';
import type { ReportDocument } from './model';
import type { ReportHistoryEntry, ReportRecord } from '../project/report-history';
import { reportRecord } from './history-record';
import { compareWithLast, type SinceLast } from './since-last';

export const DEFAULT_COMPOSITE_REPLICATES = 199;

export type { PlannedGroup } from './group-step';

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
  /** The imported and cleaned records behind the log, when at hand (the cleaning part then counts records). */
  readonly cleaningRecords?: ReportInput['cleaningRecords'];
  /** The data key of the cleaned records behind the tables (kept in the report history; null or absent: not known). */
  readonly dataKey?: string | null;
  /** The last entry of the project's report history: the report compares itself with it. */
  readonly previous?: ReportHistoryEntry;
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

function checkCancel(signal: ProgrammeOptions['signal']): void {
  if (signal?.aborted) throw new FitCancelled();
}

export async function buildProgrammeReport(plan: ProgrammePlan, options: ProgrammeOptions = {}): Promise<ReportDocument> {
  return (await runProgrammeReport(plan, options)).document;
}

export interface ProgrammeRun {
  readonly document: ReportDocument;
  /** The groups whose trend could not be fitted or did not converge (their names). */
  readonly unsound: string[];
  /** What the project's report history keeps of this run (its files are added once written). */
  readonly record: ReportRecord;
  /** This run against the plan's `previous` report; null without one. */
  readonly sinceLast: SinceLast | null;
}

/** The report, the groups that are unsound, the run's history record and how it compares with the last report. */
export async function runProgrammeReport(plan: ProgrammePlan, options: ProgrammeOptions = {}): Promise<ProgrammeRun> {
  if (plan.groups.length === 0) throw new RangeError('A report needs at least one species (group) with a chosen model.');
  const { signal } = options;
  const notify = options.onProgress ?? (() => {});
  const wantsComposite = !!plan.groupColumn && !!plan.compositeTable && plan.groups.length >= 2;
  const total = plan.groups.length + (wantsComposite ? 1 : 0);
  const groups: GroupTrend[] = [];
  const cautions = [...(plan.cautions ?? [])];
  const stepProgress = (i: number, group: string) => (d: number, n: number, stage: string) => notify({ group, done: i, total, fraction: n > 0 ? d / n : 0, stage, ...(n > 1 ? { items: { done: d, total: n } } : {}) });
  // With a runner that runs group steps on worker threads, every group's step is queued at once and the
  // composite's bootstrap right behind them; progress is still told in order (the composite's held back
  // until the groups are done). Without one, the groups run here one after another, then the composite.
  const steps = options.runner?.groupSteps;
  let current = 0;
  const queued = steps ? plan.groups.map((g, i) => steps(g, { signal, onProgress: (d, n, stage) => current === i && stepProgress(i, g.group)(d, n, stage) })) : null;
  queued?.forEach((p) => p.catch(() => {}));
  let composite = queued && wantsComposite && !compositeBlocker(plan, []) ? startComposite(plan, options, plan.groups.length, total) : null;
  try {
    for (const [i, g] of plan.groups.entries()) {
      checkCancel(signal);
      current = i;
      notify({ group: g.group, done: i, total, fraction: 0, stage: 'starting' });
      const step = await (queued ? queued[i] : groupStep(g, { signal, onProgress: stepProgress(i, g.group) }));
      groups.push(step.trend);
      cautions.push(...step.cautions);
    }
  } catch (err) {
    composite?.settled.catch(() => {});
    if (err instanceof FitCancelled || signal?.aborted) throw new FitCancelled();
    throw err;
  }
  checkCancel(signal);
  const blocker = compositeBlocker(plan, groups);
  if (blocker) {
    composite?.settled.catch(() => {});
    cautions.push(blocker);
  }
  if (!blocker && wantsComposite) composite ??= startComposite(plan, options, plan.groups.length, total, true);
  const made = composite && !blocker ? await composite.finish() : undefined;
  if (made?.caution) cautions.push(made.caution);
  const compositeIndex = made?.composite;
  checkCancel(signal);
  notify({ group: '', done: total, total, fraction: 1, stage: 'assembling the report' });
  const record = reportRecord({ madeAt: plan.provenance.createdAt, software: plan.provenance.software, dataKey: plan.dataKey ?? null, planned: plan.groups, groups, composite: compositeIndex });
  const sinceLast = plan.previous ? compareWithLast(plan.previous, record) : null;
  const provenance: Provenance = compositeIndex ? { ...plan.provenance, seeds: [...plan.provenance.seeds, { what: 'the composite bootstrap', value: compositeIndex.seed }] } : plan.provenance;
  const document = buildTrendReport({
    title: plan.title,
    subtitle: plan.subtitle,
    spec: plan.groups[0].spec,
    groupColumn: plan.groupColumn,
    groups,
    composite: compositeIndex,
    cautions,
    provenance,
    cleaning: plan.cleaning,
    cleaningRecords: plan.cleaningRecords,
    ...(sinceLast ? { sinceLast } : {}),
  });
  return { record, sinceLast, document, unsound: groups.filter((g) => !g.result?.fit.converged).map((g) => g.label ?? g.group) };
}

interface StartedComposite {
  /** Settles with the composite or its failure (never rejects but for cancelling). */
  readonly settled: Promise<{ composite?: CompositeResult['composite']; caution?: string }>;
  /** Releases the held-back progress, then waits for the composite. */
  finish(): Promise<{ composite?: CompositeResult['composite']; caution?: string }>;
}

/** Starts the composite's bootstrap; its progress is held back until finish() unless `live`. */
function startComposite(plan: ProgrammePlan, options: ProgrammeOptions, done: number, total: number, live = false): StartedComposite {
  const { signal } = options;
  const notify = options.onProgress ?? (() => {});
  let held: ProgrammeProgress | null = null;
  const wasLive = live;
  const report = (p: ProgrammeProgress) => {
    if (live) notify(p);
    else held = p;
  };
  report({ group: COMPOSITE_STEP, done, total, fraction: 0, stage: 'starting' });
  const settled = compositeTrend(plan.compositeTable!, plan.groups[0].spec, plan.groupColumn!, {
    replicates: plan.replicates ?? DEFAULT_COMPOSITE_REPLICATES,
    seed: plan.seed ?? 1,
    specs: Object.fromEntries(plan.groups.map((g) => [g.group, g.spec])),
    runner: options.runner,
    signal,
    onProgress: (d, n, stage) => report({ group: COMPOSITE_STEP, done, total, fraction: n > 0 ? d / n : 0, stage, ...(n > 1 ? { items: { done: d, total: n } } : {}) }),
  }).then(
    (r) => ({ composite: r.composite }),
    (err) => {
      if (err instanceof FitCancelled || signal?.aborted) throw new FitCancelled();
      return { caution: `There is no composite index: ${(err as Error).message}` };
    },
  );
  return {
    settled,
    finish() {
      if (!wasLive) {
        live = true;
        notify({ group: COMPOSITE_STEP, done, total, fraction: 0, stage: 'starting' });
        if (held && held.stage !== 'starting') notify(held);
      }
      return settled;
    },
  };
}
