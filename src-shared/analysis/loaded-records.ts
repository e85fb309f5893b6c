import type { CleaningRecord, FieldValue } from '../cleaning/record';
import { recordFields, recordId, type LoadedSource, type PackedColumn } from '../host/contract';
import { covariateField } from '../import/visit-covariates';

/**
 * The raw records of the sources as the import gives them to the page
 * (packed columns, see the contract), unpacked into the id + fields shape
 * the cleaning log replays on. The app and the command line both start the
 * analysis from here, so they see the same values.
 */
export function unpackColumn(c: PackedColumn, n: number): (string | number | null)[] {
  if (n === 0) return [];
  if ('numbers' in c) return c.numbers.split(',').map((t) => (t === '' ? null : Number(t)));
  return c.codes.split(',').map((t) => {
    const k = Number(t);
    return k < 0 ? null : c.levels[k];
  });
}

/** One source's records in order, with their places (sheet, 1-based row, count-cell column). */
export function recordsOfSource(s: LoadedSource): { raw: CleaningRecord[]; sheet: FieldValue[]; row: FieldValue[]; column: FieldValue[] } {
  const r = s.records;
  const sheet = unpackColumn(r.sheet, r.n);
  const row = unpackColumn(r.row, r.n);
  const column = unpackColumn(r.column, r.n);
  // The fixed fields, then the source's visit covariates (cov:<name>), as the import packed them.
  const fields = [...recordFields, ...(r.covariates ?? []).map(covariateField)];
  const values = fields.map((f) => [f, r.values[f] ? unpackColumn(r.values[f], r.n) : []] as const);
  const raw: CleaningRecord[] = [];
  for (let i = 0; i < r.n; i++) {
    const fields: Record<string, FieldValue> = {};
    for (const [f, v] of values) fields[f] = v[i] ?? null;
    raw.push({ id: recordId(r.sourceId, String(sheet[i]), String(column[i]), Number(row[i])), fields });
  }
  return { raw, sheet, row, column };
}

/** The unit of the effort column when every source that names one names the same. */
export function commonEffortUnit(sources: readonly LoadedSource[]): string | undefined {
  const units = new Set(sources.map((s) => s.summary.effortUnit).filter(Boolean));
  return units.size === 1 ? [...units][0] : undefined;
}

/** The visit covariates of the sources, each name once, in the order the sources give them. */
export function visitCovariatesOf(sources: readonly LoadedSource[]): string[] {
  return [...new Set(sources.flatMap((s) => s.records.covariates ?? []))];
}

export function rawRecordsOf(sources: readonly LoadedSource[]): CleaningRecord[] {
  return sources.flatMap((s) => recordsOfSource(s).raw);
}
