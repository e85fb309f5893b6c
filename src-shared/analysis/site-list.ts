import { cellAt, type SheetGrid } from '../project/sheet-grid';
import type { SiteSheetLink } from '../project/site-sheet-link';
import { parseNumber } from '../data/table';
import { looksLikeVariant } from '../import/similarity';
import { unitFromHeader, isAreaUnit, type AreaUnit } from '../import/units';
import { siteAttributesFromSheet, SiteSheetError } from './site-attributes';

/**
 * Linking a site list (one row per site, with its area and attributes) to
 * the records: the headers of a sheet's row, a first guess at which sheet
 * and columns make the list, and a check of a proposed link against the
 * records' sites: which sites match, which records' sites the list lacks
 * (with a list name that looks like a variant of each), and what is wrong
 * with the list itself (duplicate names, areas that are not positive numbers).
 */

/** The trimmed header texts of a 1-based row ('' for a blank cell). */
export function headersAt(grid: SheetGrid, headerRow: number): string[] {
  if (headerRow < 1 || headerRow > grid.rows) return [];
  return Array.from({ length: grid.columns }, (_, c) => cellAt(grid, headerRow - 1, c).text.trim());
}

/** Why the row cannot be the headers (blank, numbers only, a header repeated), or null. */
export function headerRowProblem(grid: SheetGrid, headerRow: number): string | null {
  const place = `Row ${headerRow} of sheet "${grid.name}"`;
  if (grid.rows === 0) return `Sheet "${grid.name}" is empty; choose another sheet.`;
  if (headerRow > grid.rows) return `${place} is past the end of the sheet (it has ${grid.rows} rows); choose the row that holds the column names.`;
  const headers = headersAt(grid, headerRow).filter(Boolean);
  if (!headers.length) return `${place} is blank, so it has no column names; choose the row that holds them (Site, Area ...).`;
  if (headers.every((h) => Number.isFinite(parseNumber(h)))) return `${place} holds only numbers (${headers.slice(0, 3).join(', ')}), not column names; the sheet may have no header row. Add one in the workbook (Site, Area ...) and import it again, or choose the row that holds them.`;
  const seen = new Set<string>();
  for (const h of headers) {
    if (seen.has(h)) return `${place} names the column "${h}" twice; rename one in the workbook and import it again, or choose another header row.`;
    seen.add(h);
  }
  return null;
}

export interface SiteListGuess {
  readonly headerRow: number;
  readonly siteColumn: string;
  readonly area: { readonly column: string; readonly unit: AreaUnit } | null;
}

const siteHeader = /\b(site|pond|plot|station|transect|location|point)s?\b|\bname\b/i;
const areaHeader = /\b(area|size)\b|\bha\b|hectare|m²|m2|km²|km2/i;

/** Most of the cells below the header in column c read as numbers. */
function mostlyNumbers(grid: SheetGrid, headerRow: number, c: number): boolean {
  let filled = 0;
  let numbers = 0;
  for (let r = headerRow; r < grid.rows; r++) {
    const t = cellAt(grid, r, c).text.trim();
    if (!t) continue;
    filled++;
    if (Number.isFinite(parseNumber(t))) numbers++;
  }
  return filled > 0 && numbers >= filled * 0.8;
}

function guessAt(grid: SheetGrid, row: number): SiteListGuess | null {
  if (headerRowProblem(grid, row)) return null;
  const headers = headersAt(grid, row);
  if (headers.filter(Boolean).length < 2) return null;
  const site = headers.findIndex((h) => h && siteHeader.test(h) && !areaHeader.test(h));
  if (site < 0) return null;
  const area = headers.findIndex((h, c) => c !== site && h && areaHeader.test(h) && mostlyNumbers(grid, row, c));
  const unit = area >= 0 ? unitFromHeader(headers[area]) : undefined;
  return { headerRow: row, siteColumn: headers[site], area: area >= 0 ? { column: headers[area], unit: isAreaUnit(unit) ? unit : 'ha' } : null };
}

/**
 * A first guess at a site list in the sheet: within its first 10 rows, the
 * first row of two or more headers with a site header (Site, Pond, Plot,
 * Station ...) and an area header over numbers, else the first with a site
 * header alone; the unit from the area header (ha when it names none). Null
 * when no row has a site header.
 */
export function guessSiteList(grid: SheetGrid): SiteListGuess | null {
  const guesses: SiteListGuess[] = [];
  for (let row = 1; row <= Math.min(10, grid.rows - 1); row++) {
    const g = guessAt(grid, row);
    if (g) guesses.push(g);
  }
  return guesses.find((g) => g.area) ?? guesses[0] ?? null;
}

/** A guess that reads as a site list with areas: worth suggesting after an import. */
export function looksLikeSiteList(grid: SheetGrid): SiteListGuess | null {
  const guess = guessSiteList(grid);
  return guess?.area ? guess : null;
}

export interface UnmatchedSite {
  readonly name: string;
  /** Records of the cleaned data with this site. */
  readonly records: number;
  /** A site of the list whose name looks like a variant of this one (the merge to offer), or null. */
  readonly like: string | null;
}

export interface SiteListCheck {
  /** Sites the list names (each once). */
  readonly listed: number;
  readonly matched: readonly string[];
  /** The records' sites the list does not name, most records first. */
  readonly unmatched: readonly UnmatchedSite[];
  /** Sites of the list no record has. */
  readonly unused: readonly string[];
  /** What is wrong with the list (the header row, a missing column, duplicate names, bad areas), each naming the place and the fix. */
  readonly problems: readonly string[];
  /** The link cannot be used as it is (the header row or a column is wrong). */
  readonly unusable: boolean;
}

/**
 * Checks a proposed link against the records' sites (site name -> number of
 * records, after cleaning). Names match as the analysis joins them: the same
 * text, spaces at the ends ignored.
 */
export function checkSiteList(grid: SheetGrid, link: SiteSheetLink, fileName: string, recordSites: ReadonlyMap<string, number>): SiteListCheck {
  const header = headerRowProblem(grid, link.headerRow);
  const none = { listed: 0, matched: [], unmatched: [], unused: [] };
  if (header) return { ...none, problems: [header], unusable: true };
  let reading;
  try {
    reading = siteAttributesFromSheet(grid, link, fileName);
  } catch (err) {
    if (err instanceof SiteSheetError) return { ...none, problems: [err.message], unusable: true };
    throw err;
  }
  const listed = [...reading.sites.keys()];
  const counts = new Map<string, number>();
  for (const [name, n] of recordSites) {
    const key = name.trim();
    if (key) counts.set(key, (counts.get(key) ?? 0) + n);
  }
  const matched = [...counts.keys()].filter((s) => reading.sites.has(s)).sort();
  const unmatched = [...counts.entries()]
    .filter(([s]) => !reading.sites.has(s))
    .sort((a, b) => b[1] - a[1] || (a[0] < b[0] ? -1 : 1))
    .map(([name, records]) => ({ name, records, like: listed.find((l) => looksLikeVariant(name, l)) ?? null }));
  const unused = listed.filter((s) => !counts.has(s));
  return { listed: listed.length, matched, unmatched, unused, problems: reading.problems, unusable: false };
}
