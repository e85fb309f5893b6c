/**
 * The "Records" table: one row per visit record after cleaning, as the
 * Records stage shows it (edits and exclusions applied): where it came
 * from, the count as the cell read and as the analysis uses it, its status
 * (field code, at-least, approximate ...), effort and its unit, the site's
 * area, the observer, the visit covariates, whether it is left out and why,
 * and the import's flags still open on it.
 */
import type { CleaningRecord, FieldValue } from '../cleaning/record';
import type { EditLog } from '../cleaning/edit-entry';
import { effectiveEntries } from '../cleaning/edit-log';
import type { LoadedSource } from '../host/contract';
import type { Cell } from '../report/model';
import type { SiteAttributes } from '../analysis/site-attributes';
import { visitCovariatesOf } from '../analysis/loaded-records';
import { covariateField } from '../import/visit-covariates';
import { cellOf, exportSheet, type ColumnDef, type ExportSheet } from './export-model';
import { openFlagsByRecord } from './open-flags';
import type { RecordPlace } from './record-places';

export interface RecordsSheetInput {
  readonly sources: readonly LoadedSource[];
  readonly raw: readonly CleaningRecord[];
  readonly cleaned: readonly CleaningRecord[];
  readonly log: EditLog;
  readonly sites: SiteAttributes | null;
  readonly places: ReadonlyMap<string, RecordPlace>;
}

function field(v: FieldValue | undefined): Cell {
  return cellOf(typeof v === 'string' ? v.trim() : v);
}

/** A season or visit: a number where the text is one (2012, 3), else the text. */
function numberIfNumeric(v: FieldValue | undefined): Cell {
  const c = field(v);
  return typeof c === 'string' && /^-?\d+(\.\d+)?$/.test(c) ? Number(c) : c;
}

/** A number, or blank: a count or effort that does not read as a finite number is left blank. */
function numberCell(v: FieldValue | undefined): number | null {
  if (v === null || v === undefined || v === '') return null;
  const n = typeof v === 'number' ? v : Number(v);
  return Number.isFinite(n) ? n : null;
}

/** The effort unit of each record: its source's, or the unit a conversion in effect put it in. */
function effortUnits(sources: readonly LoadedSource[], places: ReadonlyMap<string, RecordPlace>, log: EditLog): (id: string) => string {
  const bySource = new Map(sources.map((s) => [s.summary.id, s.summary.effortUnit ?? '']));
  const converted = new Map<string, string>();
  for (const e of effectiveEntries(log)) {
    if (e.kind === 'convert-unit' && e.field === 'effort' && e.toUnit) for (const id of e.recordIds) converted.set(id, e.toUnit);
  }
  return (id) => converted.get(id) ?? bySource.get(places.get(id)?.sourceId ?? '') ?? '';
}

export function recordsSheet(input: RecordsSheetInput): ExportSheet {
  const covariates = visitCovariatesOf(input.sources);
  const flags = openFlagsByRecord(input.sources, input.raw, input.cleaned);
  const unitOf = effortUnits(input.sources, input.places, input.log);
  const columns: ColumnDef[] = [
    { header: 'File' },
    { header: 'Sheet' },
    { header: 'Row', format: { kind: 'integer' } },
    { header: 'Count cell' },
    { header: 'Site' },
    { header: 'Date' },
    { header: 'Season', format: { kind: 'general' } },
    { header: 'Visit', format: { kind: 'general' } },
    { header: 'Species' },
    { header: 'Count as read (cell text)' },
    { header: 'Count used', format: { kind: 'general' } },
    { header: 'Status' },
    { header: 'Effort', format: { kind: 'general' } },
    { header: 'Effort unit' },
    { header: 'Area (ha)', format: { kind: 'general' } },
    { header: 'Observer' },
    ...covariates.map((name) => ({ header: `${name} (visit covariate)`, format: { kind: 'general' } as const })),
    { header: 'Left out' },
    { header: 'Why left out' },
    { header: 'Open flags' },
  ];
  const rows = input.cleaned.map((r): Cell[] => {
    const f = r.fields;
    const p = input.places.get(r.id);
    const site = typeof f.site === 'string' ? f.site.trim() : f.site === null || f.site === undefined ? '' : String(f.site);
    return [
      cellOf(p?.file),
      cellOf(p?.sheet),
      cellOf(p?.row),
      cellOf(p?.column),
      field(f.site),
      field(f.date),
      numberIfNumeric(f.season),
      numberIfNumeric(f.visit),
      field(f.species),
      cellOf(typeof f.code === 'string' ? f.code : f.code === null || f.code === undefined ? null : String(f.code)),
      numberCell(f.count),
      field(f.status),
      numberCell(f.effort),
      cellOf(f.effort === null || f.effort === undefined || f.effort === '' ? null : unitOf(r.id)),
      cellOf(input.sites?.get(site)?.areaHa),
      field(f.observer),
      ...covariates.map((name) => field(f[covariateField(name)])),
      r.excluded !== undefined ? 'yes' : 'no',
      cellOf(r.excluded),
      cellOf((flags.get(r.id) ?? []).join(', ')),
    ];
  });
  return exportSheet('records', 'Records', 'The records after cleaning, one row per visit record', columns, rows);
}
