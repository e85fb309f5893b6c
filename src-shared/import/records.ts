import type { CountStatus } from './field-codes';
import type { CovariateValue } from './visit-covariates';

/**
 * One count: a species at a site on a visit, after mapping and field codes.
 * Everything keeps its place in the file (sheet, row, column letters) so a
 * finding or an analysis row can point back at the cell.
 */
export interface CountRecord {
  readonly sheet: string;
  readonly row: number;
  /** Letter of the count cell. */
  readonly column: string;
  readonly site: string;
  /** ISO date, or null when there is no date or it could not be read. */
  readonly date: string | null;
  readonly dateText: string;
  /** How the date cell was stored: a real date, text, a number (a day serial), or blank; absent without a date column. */
  readonly dateKind?: 'date' | 'text' | 'number' | 'blank';
  readonly season: string;
  readonly visit: string;
  readonly species: string;
  /** The count cell's text as found. */
  readonly code: string;
  readonly status: CountStatus;
  /** The count (or its bound/estimate); null without a number. */
  readonly count: number | null;
  /** The rule that read the code: '' for a number cell, 'number-as-text' for a number typed as text, else the field-code rule id. */
  readonly rule: string;
  /** Effort in the canonical unit (hours, km, trap-nights ...), null when missing or unreadable. */
  readonly effort: number | null;
  readonly effortText: string;
  /** Area in hectares, null when missing. */
  readonly area: number | null;
  readonly observer: string;
  readonly covariates: Readonly<Record<string, string>>;
  /**
   * The visit covariates of the counts sheet (its columns with the role
   * "covariate"), by name: a number where the whole column reads as numbers,
   * else the text; null for a blank cell. `covariates` holds the same as texts
   * together with the site attributes of a site sheet.
   */
  readonly visitCovariates?: Readonly<Record<string, CovariateValue>>;
  /** Column letters of the roles, for findings. */
  readonly columns: Readonly<Partial<Record<'site' | 'date' | 'season' | 'visit' | 'effort' | 'area' | 'observer' | 'species', string>>>;
  /** True when the count cell holds a formula error (#DIV/0! ...). */
  readonly formulaError: boolean;
}
