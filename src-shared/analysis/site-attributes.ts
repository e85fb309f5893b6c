import type { SiteSheetLink } from '../project/site-sheet-link';
import { cellAt, type SheetGrid } from '../project/sheet-grid';
import { parseNumber } from '../data/table';
import { toHectares } from '../import/units';

/**
 * What the programme knows about each site (its area and covariates such as
 * habitat), read from the sheet the project links as its site list
 * (`doc.sites`), and joined to the records by site name.
 *
 * Covariate columns get a plain name in the analysis table: the header in
 * lower case, runs of other characters as one `_` ("Habitat" -> `habitat`,
 * "Water depth (cm)" -> `water_depth_cm`).
 */
export interface SiteInfo {
  /** Area in hectares; null where the sheet leaves it blank or it is not a number. */
  readonly areaHa: number | null;
  readonly covariates: Readonly<Record<string, string>>;
}

export type SiteAttributes = ReadonlyMap<string, SiteInfo>;

export interface SiteSheetReading {
  readonly sites: SiteAttributes;
  /** Covariate column names in the analysis table, in the link's order. */
  readonly covariates: readonly string[];
  /** Problems found, each naming the place and the fix; the sites read are still used. */
  readonly problems: readonly string[];
}

export function covariateName(header: string): string {
  const name = header.toLowerCase().replace(/[^a-z0-9]+/g, '_').replace(/^_+|_+$/g, '');
  return name || 'site_covariate';
}

export class SiteSheetError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SiteSheetError';
  }
}

/** Reads the linked site sheet. A missing column is an error (the link is wrong); a bad cell is a problem listed. */
export function siteAttributesFromSheet(grid: SheetGrid, link: SiteSheetLink, fileName: string): SiteSheetReading {
  const place = `sheet "${link.sheet}" of ${fileName}`;
  const header = Array.from({ length: grid.columns }, (_, c) => cellAt(grid, link.headerRow - 1, c).text.trim());
  const columnOf = (name: string): number => {
    const c = header.indexOf(name.trim());
    if (c < 0) throw new SiteSheetError(`The site list (${place}) has no column "${name}" in row ${link.headerRow}; its headers are ${header.filter(Boolean).map((h) => `"${h}"`).join(', ') || 'blank'}. Choose the site list's columns again.`);
    return c;
  };
  const siteCol = columnOf(link.siteColumn);
  const areaCol = link.area ? columnOf(link.area.column) : -1;
  const covCols = link.covariates.map((h) => ({ name: covariateName(h), col: columnOf(h) }));
  const sites = new Map<string, SiteInfo>();
  const problems: string[] = [];
  for (let r = link.headerRow; r < grid.rows; r++) {
    const name = cellAt(grid, r, siteCol).text.trim();
    if (!name) continue;
    if (sites.has(name)) {
      problems.push(`The site list (${place}) names "${name}" twice (row ${r + 1} is the second); the first row is used.`);
      continue;
    }
    let areaHa: number | null = null;
    if (link.area) {
      const text = cellAt(grid, r, areaCol).text;
      const v = parseNumber(text);
      if (Number.isFinite(v) && v > 0) areaHa = toHectares(v, link.area.unit);
      else problems.push(`The site list (${place}, row ${r + 1}) gives "${name}" the area "${text}", which is not a positive number; its rows get no area offset until the sheet is corrected and imported again.`);
    }
    const covariates: Record<string, string> = {};
    for (const { name: n, col } of covCols) covariates[n] = cellAt(grid, r, col).text.trim();
    sites.set(name, { areaHa, covariates });
  }
  return { sites, covariates: covCols.map((c) => c.name), problems };
}
