import type { CleaningRecord } from '@shared/cleaning/record';
import type { LoadedSource, RecordFinding } from '@shared/host/contract';
import { commonEffortUnit, recordsOfSource, visitCovariatesOf } from '@shared/analysis/loaded-records';
import { covariateField } from '@shared/import/visit-covariates';

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
  /** The visit covariates of the sources: name, record field, and whether every value is a number. */
  covariates: VisitCovariate[];
}

export interface VisitCovariate {
  name: string;
  field: string;
  numeric: boolean;
}

export function buildRecordSet(sources: readonly LoadedSource[]): RecordSet {
  const raw: CleaningRecord[] = [];
  const places = new Map<string, RecordPlace>();
  const findings: RecordFinding[] = [];
  const findingsOf = new Map<string, number[]>();
  const fieldColumns = new Map<string, Record<string, string>>();
  for (const s of sources) {
    fieldColumns.set(s.summary.fileName, s.records.fieldColumns);
    const unpacked = recordsOfSource(s);
    unpacked.raw.forEach((rec, i) => {
      raw.push(rec);
      places.set(rec.id, { fileName: s.summary.fileName, sheet: String(unpacked.sheet[i]), row: Number(unpacked.row[i]), column: String(unpacked.column[i]) });
    });
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
  const covariates = visitCovariatesOf(sources).map((name) => {
    const field = covariateField(name);
    return { name, field, numeric: raw.every((r) => r.fields[field] === undefined || r.fields[field] === null || typeof r.fields[field] === 'number') };
  });
  return { raw, rawById: new Map(raw.map((x) => [x.id, x])), places, findings, findingsOf, fieldColumns, visitOf, effortUnit: commonEffortUnit(sources), covariates };
}
