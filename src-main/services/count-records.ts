import { CellKind } from '@shared/import/cells';
import { serialToIso } from '@shared/import/excel-dates';
import { compileFieldCodes, type CountClassifier } from '@shared/import/field-codes';
import { findImportedColumn, type ImportedColumn, type ImportedTable } from '@shared/import/imported-table';
import type { CountRecord } from '@shared/import/records';
import { parseTextDate, type DateOrder } from '@shared/import/text-dates';
import { parseNumber } from '@shared/data/table';
import { recordId, type ColumnRoles } from '@shared/host/contract';

/**
 * Reshapes an imported table into one record per count (a wide sheet's row
 * of species columns becomes one record per species), reading count cells
 * with the field codes and dates in the given order. Each record keeps its
 * place in the file and a stable id: `<source>:<sheet>!<column><row>`.
 * Effort stays in the unit of its column (minutes on the demo sheets), as
 * the analyst reads it on the sheet; `effortUnit` names that unit.
 */
export interface IdentifiedRecord extends CountRecord {
  readonly id: string;
  /** Index of the table row the record came from (records of one visit share it). */
  readonly tableRow: number;
  /** How the date cell was stored: a real date, text, a number, or blank. */
  readonly dateKind: 'date' | 'text' | 'number' | 'blank';
  /** True when a count cell that reads as a number was stored as text. */
  readonly countAsText: boolean;
}

export interface ReshapeResult {
  records: IdentifiedRecord[];
  effortUnit?: string;
}

function column(table: ImportedTable, name: string | undefined): ImportedColumn | undefined {
  if (name === undefined) return undefined;
  const j = findImportedColumn(table, name);
  return j >= 0 ? table.columns[j] : undefined;
}

function letterOf(col: ImportedColumn | undefined, sheet: number): string | undefined {
  return col ? col.letters[sheet] || undefined : undefined;
}

function readDate(col: ImportedColumn | undefined, i: number, order: DateOrder, date1904: boolean): { iso: string | null; text: string; kind: IdentifiedRecord['dateKind'] } {
  if (!col) return { iso: null, text: '', kind: 'blank' };
  const text = col.texts[i] ?? '';
  const kind = col.kinds[i];
  if (kind === CellKind.date) return { iso: text.slice(0, 10), text, kind: 'date' };
  if (kind === CellKind.number) return { iso: serialToIso(col.numbers[i], date1904)?.slice(0, 10) ?? null, text, kind: 'number' };
  if (text.trim() === '') return { iso: null, text, kind: 'blank' };
  return { iso: parseTextDate(text, order), text, kind: 'text' };
}

/** Effort as written, in the column's own unit (the analysis table converts it to hours, km ...). */
function readEffort(col: ImportedColumn | undefined, i: number): { value: number | null; text: string } {
  if (!col) return { value: null, text: '' };
  const text = col.texts[i] ?? '';
  const raw = col.kinds[i] === CellKind.number ? col.numbers[i] : parseNumber(text);
  return { value: Number.isFinite(raw) ? raw : null, text };
}

export function reshapeRecords(table: ImportedTable, roles: ColumnRoles, sourceId: string, dateOrder: DateOrder = 'dmy', classify: CountClassifier = compileFieldCodes()): ReshapeResult {
  const site = column(table, roles.site)!;
  const date = column(table, roles.date);
  const season = column(table, roles.season);
  const visit = column(table, roles.visit);
  const observer = column(table, roles.observer);
  const effort = column(table, roles.effort);
  const speciesCol = column(table, roles.species);
  const countCols: { name: string | null; col: ImportedColumn }[] = roles.speciesColumns?.length
    ? roles.speciesColumns.map((name) => ({ name, col: column(table, name)! }))
    : [{ name: null, col: column(table, roles.count)! }];
  const date1904 = table.source.date1904 ?? false;
  const records: IdentifiedRecord[] = [];
  for (let i = 0; i < table.nrows; i++) {
    const s = table.sheetIndex[i];
    const sheet = table.sheets[s];
    const row = table.rowNumbers[i];
    const d = readDate(date, i, dateOrder, date1904);
    const e = readEffort(effort, i);
    const seasonText = season ? (season.texts[i] ?? '').trim() : d.iso ? d.iso.slice(0, 4) : '';
    const columns = {
      site: letterOf(site, s),
      date: letterOf(date, s),
      season: letterOf(season, s),
      visit: letterOf(visit, s),
      effort: letterOf(effort, s),
      observer: letterOf(observer, s),
      species: letterOf(speciesCol, s),
    };
    for (const { name, col } of countCols) {
      const letter = col.letters[s] ?? '';
      const text = col.texts[i] ?? '';
      const kind = col.kinds[i];
      const reading = classify(text, kind, col.numbers[i]);
      records.push({
        id: recordId(sourceId, sheet, letter, row),
        tableRow: i,
        sheet,
        row,
        column: letter,
        site: site.texts[i] ?? '',
        date: d.iso,
        dateText: d.text,
        dateKind: d.kind,
        season: seasonText,
        visit: visit ? (visit.texts[i] ?? '').trim() : '',
        species: name ?? (speciesCol?.texts[i] ?? ''),
        code: text,
        status: reading.status,
        count: Number.isNaN(reading.number) ? null : reading.number,
        rule: reading.rule,
        effort: e.value,
        effortText: e.text,
        area: null,
        observer: observer ? (observer.texts[i] ?? '').trim() : '',
        covariates: {},
        columns,
        formulaError: reading.rule === 'formula-error',
        countAsText: kind === CellKind.text && reading.status === 'counted' && (reading.rule === '' || reading.rule === 'number-as-text'),
      });
    }
  }
  return { records, effortUnit: roles.effort ? roles.effortUnit : undefined };
}
