/** Numbers in report tables and sentences: one formatting for HTML and PDF, and the matching spreadsheet format codes. */
import type { Cell, NumberFormat } from './model';

/** What a table shows where a number has no finite value. */
export const NO_VALUE = '–';

export function formatNumber(value: number, format: NumberFormat = { kind: 'fixed', decimals: 3 }): string {
  if (!Number.isFinite(value)) return NO_VALUE;
  switch (format.kind) {
    case 'fixed':
      return fixed(value, format.decimals);
    case 'percent':
      return `${fixed(100 * value, format.decimals)}%`;
    case 'integer':
      return fixed(value, 0);
    case 'p':
      return value < 0.0001 ? '<0.0001' : value.toFixed(4);
    case 'general':
      return String(value);
  }
}

/** A table cell as text: text as it is, numbers formatted, null as a dash. */
export function cellText(cell: Cell, format?: NumberFormat): string {
  if (cell === null) return NO_VALUE;
  return typeof cell === 'number' ? formatNumber(cell, format) : cell;
}

/** The spreadsheet number format code for a format (exceljs numFmt). */
export function spreadsheetFormat(format: NumberFormat | undefined): string | undefined {
  if (!format) return undefined;
  switch (format.kind) {
    case 'fixed':
      return format.decimals > 0 ? `0.${'0'.repeat(format.decimals)}` : '0';
    case 'percent':
      return format.decimals > 0 ? `0.${'0'.repeat(format.decimals)}%` : '0%';
    case 'integer':
      return '0';
    case 'p':
      return '0.0000';
    case 'general':
      return 'General';
  }
}

/** Fixed decimals, and no "-0". */
function fixed(value: number, decimals: number): string {
  const t = value.toFixed(decimals);
  return /^-0\.?0*$/.test(t) ? t.slice(1) : t;
}

/** A change as a percentage of its size, without sign (for sentences that say "declined by"). */
export function percentSize(fraction: number, decimals = 0): string {
  return `${fixed(Math.abs(100 * fraction), decimals)}%`;
}

/** A change as a signed percentage ("+2.1%", "-3.9%"). */
export function signedPercent(fraction: number, decimals = 1): string {
  const t = fixed(100 * fraction, decimals);
  return `${t.startsWith('-') || /^0\.?0*$/.test(t) ? '' : '+'}${t}%`;
}
