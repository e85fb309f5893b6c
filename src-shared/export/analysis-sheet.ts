/**
 * The "Analysis table": exactly the table the models are fitted to (one row
 * per site x season x species; counts, effort, area, offsets, site and visit
 * covariates), column by column, with the unit in each header where the
 * column has one. Numeric columns stay numbers (a blank where the table has
 * no finite value); text columns stay text.
 */
import type { AggregateRule, AnalysisTable } from '../import/aggregate';
import type { TableColumn } from '../data/table';
import type { Cell } from '../report/model';
import { cellOf, exportSheet, type ColumnDef, type ExportSheet } from './export-model';

const effortUnits: Record<string, string> = { effort_h: 'hours', effort_km: 'km', effort_trap_nights: 'trap-nights', effort_visits: 'visits', effort_points: 'points' };

/** The header of a column: its name in the table, and its unit in brackets where it has one. */
export function analysisHeader(name: string, effortColumn: string | undefined, rule: AggregateRule = 'sum'): string {
  const effortUnit = effortColumn ? (effortUnits[effortColumn] ?? 'as recorded') : 'as recorded';
  const units: Record<string, string> = {
    count: rule === 'sum' ? 'sum over the visits used' : rule === 'max' ? 'largest count of the visits used' : 'mean over the visits used',
    visits: 'visits used',
    log_effort: `natural log of ${effortUnit}`,
    area_ha: 'hectares',
    log_area: 'natural log of hectares',
    offset: 'natural log of effort times area',
  };
  if (effortColumn && name === effortColumn) units[name] = effortUnit;
  return units[name] ? `${name} (${units[name]})` : name;
}

/** Text columns whose values are names, kept as text even when they read as numbers (site "12"). */
const nameColumns = new Set(['site', 'species']);

function columnCells(c: TableColumn): (k: number) => Cell {
  if (c.numeric && !nameColumns.has(c.name)) return (k) => cellOf(c.texts[k] === '' ? null : c.values[k]);
  return (k) => cellOf(c.texts[k]);
}

export function analysisSheet(analysis: AnalysisTable): ExportSheet {
  const t = analysis.table;
  const columns: ColumnDef[] = t.columns.map((c) => ({ header: analysisHeader(c.name, analysis.effortColumn, analysis.rule), ...(c.numeric && !nameColumns.has(c.name) ? { format: { kind: 'general' } as const } : {}) }));
  const cells = t.columns.map(columnCells);
  const rows: Cell[][] = [];
  for (let k = 0; k < t.nrows; k++) rows.push(cells.map((cell) => cell(k)));
  return exportSheet('analysis', 'Analysis table', 'The table the models are fitted to, one row per site x season x species', columns, rows);
}
