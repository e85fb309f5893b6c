/**
 * What the counts behind a trend are: per season the sites visited, the
 * records of the analysis table, the visits they sum (when the table has a
 * visits column), the total counted and the effort recorded. Computed from
 * the group's analysis table and its spec.
 */
import { findColumn, type DataTable } from '../data/table';
import type { ModelSpec } from '../model/spec';
import type { Block, Cell, TableBlock, TableColumnSpec } from './model';

export interface SeasonSummary {
  readonly time: number | string;
  readonly sites: number | null;
  /** Rows of the analysis table used (a count and a season filled in). */
  readonly records: number;
  /** Sum of the visits column; null without one. */
  readonly visits: number | null;
  readonly counted: number;
  /** Sum of the effort (first offset) column; null without one. */
  readonly effort: number | null;
}

export interface DataSummary {
  readonly timeColumn: string;
  readonly siteColumn: string | null;
  readonly effortColumn: string | null;
  readonly visitsColumn: string | null;
  readonly seasons: readonly SeasonSummary[];
  /** Rows left out because the response or the season was blank. */
  readonly blankRows: number;
}

/**
 * The data summary of one group's analysis table. Sites come from the spec's
 * site column, else a column named "site"; visits from `visitsColumn`
 * (default a numeric column named "visits", when there is one).
 */
export function dataSummary(table: DataTable, spec: ModelSpec, visitsColumn = 'visits'): DataSummary {
  const timeColumn = spec.time?.column ?? 'season';
  const time = findColumn(table, timeColumn);
  const response = findColumn(table, spec.response);
  if (!time || !response) throw new RangeError(`The analysis table has no column "${time ? spec.response : timeColumn}"; the data summary needs the ${time ? 'response' : 'season'} column of the spec.`);
  const siteName = spec.site?.column ?? (findColumn(table, 'site') ? 'site' : null);
  const site = siteName ? findColumn(table, siteName) : undefined;
  const effortName = spec.offsets[0]?.column ?? null;
  const effort = effortName ? findColumn(table, effortName) : undefined;
  const visitCol = findColumn(table, visitsColumn);
  const visits = visitCol?.numeric ? visitCol : undefined;
  const acc = new Map<string, { time: number | string; sites: Set<string>; records: number; visits: number; counted: number; effort: number }>();
  let blankRows = 0;
  for (let i = 0; i < table.nrows; i++) {
    const t = time.texts[i];
    const y = response.values[i];
    if (t === '' || !Number.isFinite(y)) {
      blankRows++;
      continue;
    }
    let a = acc.get(t);
    if (!a) acc.set(t, (a = { time: time.numeric ? time.values[i] : t, sites: new Set(), records: 0, visits: 0, counted: 0, effort: 0 }));
    a.records++;
    if (visits && Number.isFinite(visits.values[i])) a.visits += visits.values[i];
    a.counted += y;
    if (site) a.sites.add(site.texts[i]);
    if (effort && Number.isFinite(effort.values[i])) a.effort += effort.values[i];
  }
  const seasons = [...acc.values()]
    .sort((x, y) => (typeof x.time === 'number' && typeof y.time === 'number' ? x.time - y.time : String(x.time).localeCompare(String(y.time))))
    .map((a) => ({ time: a.time, sites: site ? a.sites.size : null, records: a.records, visits: visits ? a.visits : null, counted: a.counted, effort: effort ? a.effort : null }));
  return { timeColumn, siteColumn: site ? siteName : null, effortColumn: effort ? effortName : null, visitsColumn: visits ? visitsColumn : null, seasons, blankRows };
}

export function dataSummaryColumns(d: DataSummary, groupHeader?: string): TableColumnSpec[] {
  return [
    ...(groupHeader ? [{ header: groupHeader }] : []),
    { header: d.timeColumn, format: { kind: 'general' } },
    { header: 'Sites', format: { kind: 'integer' } },
    { header: 'Records', format: { kind: 'integer' } },
    { header: 'Visits', format: { kind: 'integer' } },
    { header: 'Total counted', format: { kind: 'integer' } },
    { header: d.effortColumn ? `Effort (${d.effortColumn})` : 'Effort', format: { kind: 'fixed', decimals: 1 } },
  ];
}

export function dataSummaryCells(d: DataSummary, group?: string): Cell[][] {
  return d.seasons.map((s) => [...(group !== undefined ? [group] : []), s.time, s.sites, s.records, s.visits, s.counted, s.effort]);
}

export function dataSummaryBlocks(id: string, subject: string, d: DataSummary): Block[] {
  const records = d.seasons.reduce((a, s) => a + s.records, 0);
  const notes = [`Records: rows of the analysis table used by the model.${d.visitsColumn ? ` Visits: the sum of "${d.visitsColumn}".` : ' No visits column, so visits are not counted.'}${d.siteColumn ? ` Sites: distinct values of "${d.siteColumn}".` : ' No site column, so sites are not counted.'}${d.effortColumn ? ` Effort: the sum of "${d.effortColumn}", the model's offset.` : ' No effort offset in the model.'}`];
  if (d.blankRows) notes.push(`${d.blankRows} row${d.blankRows === 1 ? '' : 's'} with a blank count or ${d.timeColumn} are not in the table (and not in the model).`);
  const table: TableBlock = { kind: 'table', id, caption: `Data behind the trend of ${subject}: ${records} records over ${d.seasons.length} seasons`, columns: dataSummaryColumns(d), rows: dataSummaryCells(d), notes };
  return [table];
}
