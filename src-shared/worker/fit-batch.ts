import { rowList } from '../engine/design/build';
import type { FitOutcome } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import type { ErrorShape } from './errors';
import type { FitMethods } from './fit-methods';
import type { GroupJob } from './fit-groups';
import type { WorkerPool } from './pool';

/** The outcome of one group's fit, or the error that stopped it. */
export type GroupResult = { group: string; position: number; outcome: FitOutcome } | { group: string; position: number; error: ErrorShape };

export interface GroupFitOptions {
  /** Each group as it finishes, in the order they finish. */
  onResult?: (result: GroupResult, done: number, total: number) => void;
  onProgress?: (group: string, fraction: number, stage: string) => void;
  signal?: AbortSignal;
}

/**
 * A group's fit sees only the group's rows, so the rows an error names are
 * counted within the group; this says so and gives them in the whole table
 * too (`rows` becomes whole-table rows).
 */
export function errorInWholeTable(error: ErrorShape, job: GroupJob): ErrorShape {
  if (!error.rows?.length) return error;
  const rows = error.rows.map((r) => job.rows[r]).filter((r) => r !== undefined);
  return {
    ...error,
    rows,
    message: `${error.message} (Row numbers count the rows of group "${job.key}" only; in the whole table they are data row${rows.length > 1 ? 's' : ''} ${rowList(rows)}.)`,
  };
}

/** Fits the same spec to every group across the pool; resolves with the results in group order. */
export async function fitGroupsOnPool(pool: WorkerPool<FitMethods>, jobs: readonly GroupJob[], spec: ModelSpec, options: GroupFitOptions = {}): Promise<GroupResult[]> {
  const { onResult, onProgress, signal } = options;
  const asResult = (index: number, r: { ok: true; value: FitOutcome } | { ok: false; error: ErrorShape }): GroupResult => {
    const job = jobs[index];
    const { key: group, position } = job;
    return r.ok ? { group, position, outcome: r.value } : { group, position, error: errorInWholeTable(r.error, job) };
  };
  let done = 0;
  const settled = await pool.map(
    'fit',
    jobs.map((j) => [j.table, spec] as const),
    {
      signal,
      onProgress: onProgress && ((i, f, s) => onProgress(jobs[i].key, f, s)),
      onResult: onResult && ((r) => onResult(asResult(r.index, r), ++done, jobs.length)),
    },
  );
  return settled.map((r) => asResult(r.index, r));
}
