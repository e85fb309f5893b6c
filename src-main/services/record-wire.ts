import { recordFields, type PackedColumn, type RecordColumns } from '@shared/host/contract';
import type { CountRecord } from '@shared/import/records';
import { covariateField } from '@shared/import/visit-covariates';

/** Records as packed columns for the bridge (the format is described in the contract). */
export function packColumn(values: readonly (string | number | null)[]): PackedColumn {
  if (values.every((v) => v === null || typeof v === 'number')) {
    return { numbers: values.map((v) => (v === null || !Number.isFinite(v as number) ? '' : String(v))).join(',') };
  }
  const index = new Map<string, number>();
  const levels: string[] = [];
  const codes = values.map((v) => {
    if (v === null) return -1;
    const t = String(v);
    let k = index.get(t);
    if (k === undefined) {
      k = levels.length;
      levels.push(t);
      index.set(t, k);
    }
    return k;
  });
  return { levels, codes: codes.join(',') };
}

/**
 * `effort` gives each record's effort as the page shows it (in the unit of
 * its column, where the records hold the canonical unit).
 */
export function recordsToColumns(records: readonly CountRecord[], sourceId: string, effort: (r: CountRecord) => number | null = (r) => r.effort): RecordColumns {
  const values: Record<string, PackedColumn> = {};
  for (const f of recordFields) values[f] = packColumn(f === 'effort' ? records.map(effort) : records.map((r) => r[f] as string | number | null));
  // Visit covariates travel as fields of their own (cov:<name>), beside the fixed ones.
  const covariates = Object.keys(records[0]?.visitCovariates ?? {});
  for (const name of covariates) values[covariateField(name)] = packColumn(records.map((r) => r.visitCovariates?.[name] ?? null));
  const first = records[0];
  const fieldColumns: Record<string, string> = {};
  if (first) for (const [k, v] of Object.entries(first.columns)) if (v) fieldColumns[k] = v;
  return {
    n: records.length,
    sourceId,
    sheet: packColumn(records.map((r) => r.sheet)),
    row: packColumn(records.map((r) => r.row)),
    column: packColumn(records.map((r) => r.column)),
    fieldColumns,
    values,
    ...(covariates.length ? { covariates } : {}),
  };
}
