/**
 * The numbers of a report run as the project's report history keeps them
 * (src-shared/project/report-history.ts): per species its model, the trend
 * a season and the indices with their limits, theta and AIC; the
 * composite's indices with its bootstrap settings. Nothing per record.
 */
import type { CompositeResult } from '../trend/composite';
import type { IndexRow } from '../trend/interval';
import type { HistoryIndex, HistorySpecies, ReportHistoryEntry, ReportRecord } from '../project/report-history';
import type { GroupTrend } from './group-section';
import type { PlannedGroup } from './group-step';

/** A number as the history stores it: null when it has no finite value. */
export const stored = (x: number | null | undefined): number | null => (typeof x === 'number' && Number.isFinite(x) ? x : null);

export function historyIndices(rows: readonly IndexRow[]): HistoryIndex[] {
  return rows.map((r) => ({ season: r.time, index: stored(r.index), lower: stored(r.lower), upper: stored(r.upper) }));
}

function speciesRecord(planned: PlannedGroup, g: GroupTrend | undefined): HistorySpecies {
  const model = { name: planned.model ?? '', spec: planned.spec, dropBadOffsetRows: planned.dropBadOffsetRows ?? false };
  const r = g?.result;
  const label = planned.label !== undefined && planned.label !== planned.group ? { label: planned.label } : {};
  if (!r) return { species: planned.group, ...label, model, result: null, error: g?.error ?? 'The trend could not be fitted.' };
  return {
    species: planned.group,
    ...label,
    model,
    result: {
      converged: r.fit.converged,
      rows: r.fit.nobs,
      theta: stored(r.fit.theta),
      aic: stored(r.fit.aic),
      base: r.method?.base ?? r.indices[0]?.time ?? '',
      trend: { perSeason: stored(r.slope.perYear), lower: stored(r.slope.lower), upper: stored(r.slope.upper) },
      indices: historyIndices(r.indices),
    },
    error: null,
  };
}

export interface RecordInput {
  readonly madeAt: string;
  readonly software: { readonly name: string; readonly version: string };
  readonly dataKey: string | null;
  readonly planned: readonly PlannedGroup[];
  readonly groups: readonly GroupTrend[];
  readonly composite?: CompositeResult['composite'];
}

/** What the history keeps of a run, before its files are written. */
export function reportRecord(input: RecordInput): ReportRecord {
  const c = input.composite;
  return {
    madeAt: input.madeAt,
    software: { name: input.software.name, version: input.software.version },
    dataKey: input.dataKey,
    species: input.planned.map((p) => speciesRecord(p, input.groups.find((g) => g.group === p.group))),
    composite: c ? { replicates: c.replicates, seed: c.seed, indices: historyIndices(c.indices) } : null,
  };
}

/** The history entry of a run whose files were written (names without folder, SHA-256 of their bytes). */
export function historyEntry(record: ReportRecord, files: readonly { name: string; sha256: string }[]): ReportHistoryEntry {
  return { ...record, files: files.map((f) => ({ name: f.name, sha256: f.sha256 })) };
}
