import type { Finding } from './findings';
import type { CountRecord } from './records';

/**
 * Date checks that need no season window from the user: a visit date far
 * outside the dates of the other visits (pooled over seasons by day of the
 * year: more than 45 days before the 5th or after the 95th percentile), and
 * a season with only a handful of records beside much larger ones (often a
 * mistyped year). Both need at least 20 dated visits to say anything.
 */
const marginDays = 45;

function dayOfYear(iso: string): number {
  const y = Number(iso.slice(0, 4));
  const t = Date.UTC(y, Number(iso.slice(5, 7)) - 1, Number(iso.slice(8, 10)));
  return Math.round((t - Date.UTC(y, 0, 1)) / 86_400_000) + 1;
}

function monthDay(doy: number): string {
  const d = new Date(Date.UTC(2001, 0, doy));
  return d.toISOString().slice(5, 10);
}

export function datePatternFindings(records: readonly CountRecord[], file: string): Finding[] {
  const visits = new Map<string, CountRecord>();
  for (const r of records) if (r.date && r.status !== 'not-surveyed') visits.set(`${r.sheet}|${r.row}`, r);
  const list = [...visits.values()];
  if (list.length < 20) return [];
  const out: Finding[] = [];
  const days = list.map((r) => dayOfYear(r.date!)).sort((a, b) => a - b);
  const q = (p: number) => days[Math.min(days.length - 1, Math.floor(p * (days.length - 1)))];
  const lo = q(0.05);
  const hi = q(0.95);
  for (const r of list) {
    const d = dayOfYear(r.date!);
    if (d >= lo - marginDays && d <= hi + marginDays) continue;
    out.push({
      code: 'date-outside-season', severity: 'warning', file, sheet: r.sheet, row: r.row, column: r.columns.date,
      message: `The date ${r.date} lies far outside the dates of the other visits (most fall between ${monthDay(lo)} and ${monthDay(hi)}, month-day).`,
      fix: 'Check the date for a typing slip (day and month swapped, wrong month); set the season window in the template if the survey really ran then.',
    });
  }
  const bySeason = new Map<string, CountRecord[]>();
  for (const r of list) {
    const rs = bySeason.get(r.season);
    if (rs) rs.push(r);
    else bySeason.set(r.season, [r]);
  }
  if (bySeason.size >= 2) {
    const largest = Math.max(...[...bySeason.values()].map((v) => v.length));
    for (const [season, rs] of bySeason) {
      if (rs.length > 3 || rs.length * 20 > largest) continue;
      const r = rs[0];
      out.push({
        code: 'season-few-records', severity: 'warning', file, sheet: r.sheet, row: r.row, column: r.columns.season ?? r.columns.date,
        message: `Season ${season || '(blank)'} has only ${rs.length} visit${rs.length > 1 ? 's' : ''}, against ${largest} in the largest season.`,
        fix: 'Check the year of these dates (or the season column) for a typing slip.',
      });
    }
  }
  return out;
}
