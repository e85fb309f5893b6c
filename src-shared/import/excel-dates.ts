/**
 * Spreadsheet date serials (ECMA-376 SpreadsheetML) to ISO dates.
 *
 * 1900 system (common practice, ECMA-376 Part 1 §18.17.4.1): serial 1 is
 * 1900-01-01 and serial 60 is the non-existent 1900-02-29 kept for
 * compatibility, so serials from 61 on count from 1899-12-30.
 * 1904 system: serial 0 is 1904-01-01.
 */
const dayMs = 86_400_000;
const epoch1900 = Date.UTC(1899, 11, 30);
const epoch1904 = Date.UTC(1904, 0, 1);

/** The ISO date (and time when the serial has a fraction) or null for a serial that is not a date. */
export function serialToIso(serial: number, date1904: boolean): string | null {
  if (!Number.isFinite(serial) || serial < 0 || serial >= 2_958_466) return null;
  const days = Math.floor(serial);
  const fraction = serial - days;
  let base = date1904 ? epoch1904 : epoch1900;
  if (!date1904) {
    if (days === 60) return '1900-02-29';
    if (days < 60) base = Date.UTC(1899, 11, 31);
    if (days === 0) return null;
  }
  const ms = base + days * dayMs;
  const d = new Date(ms);
  const date = d.toISOString().slice(0, 10);
  const seconds = Math.round(fraction * 86_400);
  if (seconds === 0 || seconds === 86_400) return seconds === 86_400 ? new Date(ms + dayMs).toISOString().slice(0, 10) : date;
  const hh = Math.floor(seconds / 3600);
  const mm = Math.floor((seconds % 3600) / 60);
  const ss = seconds % 60;
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${date}T${pad(hh)}:${pad(mm)}${ss ? `:${pad(ss)}` : ''}`;
}

/** The serial of an ISO date (yyyy-mm-dd) in the 1900 system; used by tests and writers. */
export function isoToSerial1900(iso: string): number {
  const [y, m, d] = iso.split('-').map(Number);
  const ms = Date.UTC(y, m - 1, d);
  const days = Math.round((ms - epoch1900) / dayMs);
  return days < 61 ? days - 1 : days;
}

/**
 * Whether a number format code shows a date: it has day, month or year
 * tokens outside quoted text, brackets and escapes (the elapsed-time formats
 * [h]:mm are durations, not dates).
 */
export function isDateFormatCode(code: string): boolean {
  const stripped = code
    .replace(/"[^"]*"/g, '')
    .replace(/\\./g, '')
    .replace(/\[[^\]]*\]/g, '')
    .replace(/[_*]./g, '')
    .split(';')[0];
  if (/[dy]/i.test(stripped)) return true;
  // m alone is a month; beside h or s it is minutes.
  return /m/i.test(stripped) && !/[hs]/i.test(stripped);
}

/** Built-in number formats 14-22 and 45-47 are dates or times; of those, 14-17 and 22 carry a date (ECMA-376 §18.8.30). */
export function isBuiltInDateFormat(id: number): boolean {
  return (id >= 14 && id <= 17) || id === 22 || (id >= 27 && id <= 36) || (id >= 50 && id <= 58);
}
