/**
 * Dates typed as text, in several styles: ISO (2019-05-03, 2019/05/03),
 * day/month/year or month/day/year with / or - (3/5/2019), dotted
 * day.month.year (3.5.2019, read day first as is common practice where that
 * style is used), and month names (3 May 2019, May 3, 2019, 3-May-19).
 *
 * Numeric a/b/year dates are ambiguous on their own. A column is read as a
 * whole: a first part above 12 settles day-first, a second part above 12
 * settles month-first; when nothing settles it the caller must say
 * (dateOrder), and when both occur the column mixes styles.
 */
export type DateOrder = 'dmy' | 'mdy';

const monthNames: Record<string, number> = {
  jan: 1, january: 1, feb: 2, february: 2, mar: 3, march: 3, apr: 4, april: 4, may: 5, jun: 6, june: 6,
  jul: 7, july: 7, aug: 8, august: 8, sep: 9, sept: 9, september: 9, oct: 10, october: 10, nov: 11, november: 11,
  dec: 12, december: 12,
};

type Parsed =
  | { style: 'fixed'; y: number; m: number; d: number }
  | { style: 'numeric'; a: number; b: number; y: number };

const isoRe = /^(\d{4})[-/](\d{1,2})[-/](\d{1,2})(?:[T ]\d{1,2}:\d{2}(?::\d{2})?)?$/;
const numericRe = /^(\d{1,2})[/-](\d{1,2})[/-](\d{2}|\d{4})$/;
const dottedRe = /^(\d{1,2})\.(\d{1,2})\.(\d{2}|\d{4})$/;
const dayMonthNameRe = /^(\d{1,2})(?:st|nd|rd|th)?[\s-]+([A-Za-z]{3,9})\.?[\s-]+(\d{2}|\d{4})$/;
const monthNameDayRe = /^([A-Za-z]{3,9})\.?\s+(\d{1,2})(?:st|nd|rd|th)?,?\s+(\d{4})$/;

/** Two-digit years: 00-69 are 2000s, 70-99 are 1900s (common practice). */
function fullYear(y: string): number {
  const n = Number(y);
  if (y.length === 4) return n;
  return n < 70 ? 2000 + n : 1900 + n;
}

function parseText(text: string): Parsed | null {
  const t = text.trim();
  let m = isoRe.exec(t);
  if (m) return { style: 'fixed', y: Number(m[1]), m: Number(m[2]), d: Number(m[3]) };
  m = numericRe.exec(t);
  if (m) return { style: 'numeric', a: Number(m[1]), b: Number(m[2]), y: fullYear(m[3]) };
  m = dottedRe.exec(t);
  if (m) return { style: 'fixed', y: fullYear(m[3]), m: Number(m[2]), d: Number(m[1]) };
  m = dayMonthNameRe.exec(t);
  if (m && monthNames[m[2].toLowerCase()]) return { style: 'fixed', y: fullYear(m[3]), m: monthNames[m[2].toLowerCase()], d: Number(m[1]) };
  m = monthNameDayRe.exec(t);
  if (m && monthNames[m[1].toLowerCase()]) return { style: 'fixed', y: Number(m[3]), m: monthNames[m[1].toLowerCase()], d: Number(m[2]) };
  return null;
}

function iso(y: number, m: number, d: number): string | null {
  if (m < 1 || m > 12 || d < 1 || y < 1000 || y > 9999) return null;
  const dim = new Date(Date.UTC(y, m, 0)).getUTCDate();
  if (d > dim) return null;
  return `${String(y).padStart(4, '0')}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`;
}

/** Whether a text looks like a date in one of the styles read here. */
export function looksLikeTextDate(text: string): boolean {
  return parseText(text) !== null;
}

/** An ISO date for the text, given the order of numeric dates; null when it is not a valid date. */
export function parseTextDate(text: string, order: DateOrder): string | null {
  const p = parseText(text);
  if (!p) return null;
  if (p.style === 'fixed') return iso(p.y, p.m, p.d);
  return order === 'dmy' ? iso(p.y, p.b, p.a) : iso(p.y, p.a, p.b);
}

/** An ISO date when the text reads one way only (not numeric, or a part above 12, or day = month); otherwise null. */
export function parseClearTextDate(text: string): string | null {
  const p = parseText(text);
  if (!p) return null;
  if (p.style === 'fixed') return iso(p.y, p.m, p.d);
  if (p.a > 12) return iso(p.y, p.b, p.a);
  if (p.b > 12 || p.a === p.b) return iso(p.y, p.a, p.b);
  return null;
}

export interface DateColumnReading {
  /** Texts that look like dates (out of the non-blank ones). */
  readonly dateLike: number;
  readonly nonBlank: number;
  /** How numeric a/b/year dates read: settled by the data, needing the caller's word, contradictory, or absent. */
  readonly order: DateOrder | 'ambiguous' | 'mixed' | 'none';
  /** Up to three examples that could be read either way (for the question). */
  readonly examples: string[];
  /** For 'mixed': one text of each style. */
  readonly conflict?: { readonly dayFirst: string; readonly monthFirst: string };
}

/** Reads a column of texts as dates as a whole (see the module comment). */
export function readDateColumn(texts: readonly string[]): DateColumnReading {
  let dateLike = 0;
  let nonBlank = 0;
  let dayFirst: string | undefined;
  let monthFirst: string | undefined;
  let numeric = 0;
  const examples: string[] = [];
  const seen = new Set<string>();
  for (const raw of texts) {
    const t = raw.trim();
    if (t === '') continue;
    nonBlank++;
    if (seen.has(t)) {
      const again = parseText(t);
      if (again) dateLike++;
      continue;
    }
    seen.add(t);
    const p = parseText(t);
    if (!p) continue;
    dateLike++;
    if (p.style !== 'numeric') continue;
    numeric++;
    if (p.a > 12 && p.b <= 12) dayFirst ??= t;
    else if (p.b > 12 && p.a <= 12) monthFirst ??= t;
    else if (p.a !== p.b && examples.length < 3) examples.push(t);
  }
  let order: DateColumnReading['order'] = 'none';
  if (numeric > 0) {
    if (dayFirst && monthFirst) order = 'mixed';
    else if (dayFirst) order = 'dmy';
    else if (monthFirst) order = 'mdy';
    else order = examples.length > 0 ? 'ambiguous' : 'dmy'; // only a == b dates: either order gives the same day
  }
  const conflict = order === 'mixed' ? { dayFirst: dayFirst!, monthFirst: monthFirst! } : undefined;
  return { dateLike, nonBlank, order, examples, conflict };
}
