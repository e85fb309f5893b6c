/** The report's tables built from results: annual indices, coefficients, the trend summary. */
import type { FitSummary } from '../model/fit-result';
import type { IndexRow } from '../trend/interval';
import type { Cell, TableBlock, TableColumnSpec } from './model';

const INDEX = { kind: 'fixed', decimals: 1 } as const;
const COEF = { kind: 'fixed', decimals: 4 } as const;
const RATIO = { kind: 'fixed', decimals: 3 } as const;
const PCT = { kind: 'percent', decimals: 1 } as const;

/** Columns that name the group when tables of several groups are stacked for a spreadsheet. */
function grouped(columns: TableColumnSpec[], groupHeader?: string): TableColumnSpec[] {
  return groupHeader ? [{ header: groupHeader }, ...columns] : columns;
}

const timeCell = (t: number | string): Cell => t;

export function indexColumns(timeName: string, groupHeader?: string): TableColumnSpec[] {
  return grouped([{ header: timeName, format: { kind: 'general' } }, { header: 'Index', format: INDEX }, { header: 'Lower 95%', format: INDEX }, { header: 'Upper 95%', format: INDEX }], groupHeader);
}

export function indexCells(rows: readonly IndexRow[], group?: string): Cell[][] {
  return rows.map((r) => [...(group !== undefined ? [group] : []), timeCell(r.time), r.index, r.lower, r.upper]);
}

export function indexTable(id: string, caption: string, timeName: string, rows: readonly IndexRow[], notes?: string[]): TableBlock {
  return { kind: 'table', id, caption, columns: indexColumns(timeName), rows: indexCells(rows), notes };
}

export function coefficientColumns(groupHeader?: string): TableColumnSpec[] {
  return grouped(
    [
      { header: 'Term' },
      { header: 'Estimate', format: COEF },
      { header: 'SE', format: COEF },
      { header: 'z', format: { kind: 'fixed', decimals: 2 } },
      { header: 'p', format: { kind: 'p' } },
      { header: 'Rate ratio', format: RATIO },
      { header: 'Lower 95%', format: RATIO },
      { header: 'Upper 95%', format: RATIO },
    ],
    groupHeader,
  );
}

/** Coefficients on the log scale with their rate ratios exp(estimate) and exp of the Wald limits. */
export function coefficientCells(fit: FitSummary, group?: string): Cell[][] {
  const rows = fit.coefficients.map((c) => ({ ...c, part: '' }));
  const zero = fit.zeroCoefficients.map((c) => ({ ...c, part: 'zero part: ' }));
  return [...rows, ...zero].map((c) => [
    ...(group !== undefined ? [group] : []),
    `${c.part}${c.term}`,
    c.estimate,
    c.se,
    c.z,
    c.p,
    c.part ? null : Math.exp(c.estimate),
    c.part ? null : Math.exp(c.lower),
    c.part ? null : Math.exp(c.upper),
  ]);
}

export function coefficientTable(id: string, caption: string, fit: FitSummary, extraNotes: readonly string[] = []): TableBlock {
  const notes = ['Estimates on the log scale (logit for the zero part); rate ratio = exp(estimate), with exp of the Wald 95% limits.'];
  if (fit.seType === 'site-robust') notes.push('Standard errors are site-robust (sandwich).');
  if (fit.zeroCoefficients.length) notes.push('Rate ratios are not shown for the zero part (logit scale).');
  return { kind: 'table', id, caption, columns: coefficientColumns(), rows: coefficientCells(fit), notes: [...notes, ...extraNotes] };
}

export interface SummaryRow {
  readonly group: string;
  readonly perSeason: number;
  readonly lower: number;
  readonly upper: number;
  readonly overSpan: number;
  readonly overLower: number;
  readonly overUpper: number;
  readonly direction: string;
  readonly converged: boolean;
}

export function summaryTable(id: string, caption: string, groupHeader: string, rows: readonly SummaryRow[], spanWords: string): TableBlock {
  return {
    kind: 'table',
    id,
    caption,
    columns: [
      { header: groupHeader },
      { header: 'Change a season', format: PCT },
      { header: 'Lower 95%', format: PCT },
      { header: 'Upper 95%', format: PCT },
      { header: `Change ${spanWords}`, format: PCT },
      { header: `Lower 95% ${spanWords}`, format: PCT },
      { header: `Upper 95% ${spanWords}`, format: PCT },
      { header: 'What the interval shows' },
      { header: 'Converged' },
    ],
    rows: rows.map((r) => [r.group, r.perSeason, r.lower, r.upper, r.overSpan, r.overLower, r.overUpper, r.direction, r.converged ? 'yes' : 'no']),
    notes: ['Change a season = exp(b) - 1 of the log-linear slope b; the change over the period compounds it over the seasons between the first and the last.'],
  };
}
