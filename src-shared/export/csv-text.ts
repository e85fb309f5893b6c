/**
 * One export table as CSV text (RFC 4180): comma separated, CRLF line ends,
 * a field quoted when it holds a comma, a quote, a line break or leading or
 * trailing space, quotes doubled. Numbers are written as JavaScript writes
 * them ('.' decimal mark, no thousands separators); blanks as empty fields.
 * The caller adds the UTF-8 byte order mark when writing the file.
 */
import type { Cell } from '../report/model';
import type { ExportSheet } from './export-model';

function field(c: Cell): string {
  if (c === null) return '';
  if (typeof c === 'number') return Number.isFinite(c) ? String(c) : '';
  return /[",\r\n]|^\s|\s$/.test(c) ? `"${c.replace(/"/g, '""')}"` : c;
}

export function csvText(sheet: ExportSheet): string {
  const lines = [sheet.table.columns.map((c) => field(c.header)), ...sheet.table.rows.map((r) => r.map(field))];
  return lines.map((l) => l.join(',')).join('\r\n') + '\r\n';
}
