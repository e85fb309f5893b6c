import type { CleaningRecord, FieldValue } from '@shared/cleaning/record';
import { recordFields, recordId, type LoadedSource, type RecordFinding } from '@shared/host/contract';
import { unpackColumn } from './unpack-columns';

/**
 * The raw records of every source in the project, as the cleaning log
 * expects them (id + named fields), with each record's place in its file
 * and the findings of the import checks indexed by record.
 */
export interface RecordPlace {
  fileName: string;
  sheet: string;
  row: number;
  column: string;
}

export interface RecordSet {
  raw: CleaningRecord[];
  rawById: Map<string, CleaningRecord>;
  places: Map<string, RecordPlace>;
  findings: RecordFinding[];
  /** Finding indices by record id. */
  findingsOf: Map<string, number[]>;
  /** Letters of the visit columns per file, for naming the cell of a site, date or effort edit. */
  fieldColumns: Map<string, Record<string, string>>;
  /** The ids of all records of the same visit row (one per species on a wide sheet), by record id. */
  visitOf: Map<string, string[]>;
  /** Unit of the effort column, when the sources agree on one. */
  effortUnit?: string;
}

export function buildRecordSet(sources: readonly LoadedSource[]): RecordSet {
  const raw: CleaningRecord[] = [];
  const places = new Map<string, RecordPlace>();
  const findings: RecordFinding[] = [];
  const findingsOf = new Map<string, number[]>();
  const fieldColumns = new Map<string, Record<string, string>>();
  for (const s of sources) {
    const r = s.records;
    fieldColumns.set(s.summary.fileName, r.fieldColumns);
    const sheet = unpackColumn(r.sheet, r.n);
    const row = unpackColumn(r.row, r.n);
    const column = unpackColumn(r.column, r.n);
    const values = recordFields.map((f) => [f, r.values[f] ? unpackColumn(r.values[f], r.n) : []] as const);
    for (let i = 0; i < r.n; i++) {
      const fields: Record<string, FieldValue> = {};
      for (const [f, v] of values) fields[f] = v[i] ?? null;
      const place = { fileName: s.summary.fileName, sheet: String(sheet[i]), row: Number(row[i]), column: String(column[i]) };
      const id = recordId(r.sourceId, place.sheet, place.column, place.row);
      raw.push({ id, fields });
      places.set(id, place);
    }
    for (const f of s.findings) {
      const k = findings.length;
      findings.push({ ...f, id: `${s.summary.id}/${f.id}` });
      for (const id of f.recordIds) {
        const list = findingsOf.get(id);
        if (list) list.push(k);
        else findingsOf.set(id, [k]);
      }
    }
  }
  const rows = new Map<string, string[]>();
  const visitOf = new Map<string, string[]>();
  for (const [id, p] of places) {
    const key = `${p.fileName}|${p.sheet}|${p.row}`;
    let list = rows.get(key);
    if (!list) rows.set(key, (list = []));
    list.push(id);
    visitOf.set(id, list);
  }
  const units = new Set(sources.map((s) => s.summary.effortUnit).filter(Boolean));
  return { raw, rawById: new Map(raw.map((x) => [x.id, x])), places, findings, findingsOf, fieldColumns, visitOf, effortUnit: units.size === 1 ? [...units][0] : undefined };
}

/** "Counts, row 23, col. G" (with the file when asked). */
export function describePlace(p: { fileName?: string; file?: string; sheet?: string; row?: number; column?: string }, withFile = false): string {
  const parts: string[] = [];
  const file = p.fileName ?? p.file;
  if (withFile && file) parts.push(file);
  if (p.sheet) parts.push(p.sheet);
  if (p.row !== undefined) parts.push(`row ${p.row}`);
  if (p.column) parts.push(`col. ${p.column}`);
  return parts.join(', ');
}
