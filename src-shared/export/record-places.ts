/** Where each record sits in its workbook (file, sheet, row, count-cell column), as the import gave it. */
import type { LoadedSource } from '../host/contract';
import { recordsOfSource } from '../analysis/loaded-records';

export interface RecordPlace {
  readonly file: string;
  readonly sourceId: string;
  readonly sheet: string;
  readonly row: number;
  readonly column: string;
}

export function recordPlaces(sources: readonly LoadedSource[]): Map<string, RecordPlace> {
  const out = new Map<string, RecordPlace>();
  for (const s of sources) {
    const u = recordsOfSource(s);
    u.raw.forEach((rec, i) => out.set(rec.id, { file: s.summary.fileName, sourceId: s.summary.id, sheet: String(u.sheet[i] ?? ''), row: Number(u.row[i]), column: String(u.column[i] ?? '') }));
  }
  return out;
}
