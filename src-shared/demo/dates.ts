/** Calendar helpers for the demo (dates as ISO texts 'YYYY-MM-DD', UTC). */

export function isoDateFromDayOfYear(year: number, dayOfYear: number): string {
  return new Date(Date.UTC(year, 0, dayOfYear)).toISOString().slice(0, 10);
}

/** The date as a person types it on a day-first sheet: '14/04/2019'. */
export function dayFirstText(iso: string): string {
  const [y, m, d] = iso.split('-');
  return `${d}/${m}/${y}`;
}

/** Midnight UTC of an ISO date, as the workbook writer stores it. */
export function utcDate(iso: string): Date {
  const [y, m, d] = iso.split('-').map(Number);
  return new Date(Date.UTC(y, m - 1, d));
}
