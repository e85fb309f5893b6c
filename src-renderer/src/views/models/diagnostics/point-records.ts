import type { DataTable } from '@shared/data/table';
import type { ChartId } from '../diagnostic-charts';
import { keyOfRow, keyText, type RecordKey } from './record-key';
import type { RecordLink } from './record-link';

/**
 * From a clicked chart point to the records behind it. Residual and QQ
 * points carry their analysis-table row as the third value ([x, y, row]);
 * site points and bars (mean–variance, influence) carry `site` and `rows`.
 * Frequency, rootogram and zero charts are about counts, not records.
 */
const chartNames: Partial<Record<ChartId, string>> = {
  residuals: 'residuals against fitted values',
  'residuals-season': 'residuals by season',
  'residuals-site': 'residuals by site',
  qq: 'QQ plot',
  'mean-variance': 'mean–variance chart',
  influence: 'influence by site',
};

export const linkedCharts: ReadonlySet<ChartId> = new Set(Object.keys(chartNames) as ChartId[]);

/** The series whose points lead to records, which the keyboard walks through (see components/point-keys.ts). */
export const linkedSeries: Partial<Record<ChartId, readonly string[]>> = {
  residuals: ['residuals'],
  'residuals-season': ['residuals'],
  'residuals-site': ['residuals'],
  qq: ['inside', 'outside'],
  'mean-variance': ['sites'],
  influence: ['change'],
};

/** What a click on the chart shows, for the hint under it. */
export function clickHint(id: ChartId): string {
  return id === 'influence' ? "Click a bar to see the site's records" : id === 'mean-variance' ? "Click a site to see its records" : 'Click a point to see its records';
}

function rowsOf(data: unknown): number[] {
  if (Array.isArray(data)) return typeof data[2] === 'number' ? [data[2]] : [];
  if (data && typeof data === 'object' && Array.isArray((data as { rows?: unknown }).rows)) return ((data as { rows: unknown[] }).rows).filter((r): r is number => typeof r === 'number');
  return [];
}

/** What a point leads to, in words for the keyboard ("Common toad at Hollow Pond, season 2019"), without the chart's name. */
export function pointLabel(id: ChartId, data: unknown, table: DataTable, columns: { site: string; season: string }, species: string): string | null {
  const link = pointLink(id, data, table, columns, species);
  return link ? link.label.replace(/ \(from [^)]*\)$/, '') : null;
}

export function pointLink(id: ChartId, data: unknown, table: DataTable, columns: { site: string; season: string }, species: string): RecordLink | null {
  if (!linkedCharts.has(id)) return null;
  const rows = rowsOf(data).filter((r) => r >= 0 && r < table.nrows);
  if (!rows.length) return null;
  const seen = new Map<string, RecordKey>();
  for (const r of rows) {
    const k = keyOfRow(table, r, columns);
    seen.set(keyText(k), k);
  }
  const keys = [...seen.values()];
  const first = keys[0];
  const label =
    keys.length === 1
      ? `${species} at ${first.site ?? '?'}, season ${first.season ?? '?'}`
      : `${species} at ${first.site ?? '?'}, ${keys.length} seasons`;
  return { label: `${label} (from ${chartNames[id]})`, keys };
}
