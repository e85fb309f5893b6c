/**
 * Fixed site effects in the count part of a zero-inflated or hurdle model.
 *
 * The site enters the count part as the first factor term (treatment coding
 * by the shared design builder, so predictors that do not vary within sites
 * are the ones dropped as aliased). As in the other count models, the
 * published site effects are the per-site intercepts (intercept plus the
 * site's contrast) with their SEs, and neither the intercept nor the site
 * columns are listed among the coefficients.
 *
 * Sites whose counts are all zero are left out beforehand (./zero-design.ts).
 */
import type { DataTable } from '../../data/table';
import { requireColumn } from '../../data/table';
import type { ModelSpec, Term } from '../../model/spec';
import type { FactorCoding, TermCoding } from '../design/build';
import type { Design } from '../types';

/** Index of the site term in the count-part term list. */
export const SITE_TERM_INDEX = 0;

export function countTermsWithSite(spec: ModelSpec, terms: readonly Term[]): Term[] {
  return spec.site?.effect === 'fixed' ? [{ column: spec.site.column, type: 'factor' }, ...terms] : [...terms];
}

export interface SiteIntercepts {
  readonly levels: string[];
  readonly effect: Float64Array;
  readonly sd: Float64Array;
  readonly siteOfRow: Int32Array;
  /** Count-design columns that are neither the intercept nor a site column (the published ones). */
  readonly listed: number[];
}

/**
 * Per-site intercepts from a count design built with the site term first:
 * b0 for the reference site, b0 + b_s for the others, with SEs from the
 * k x k covariance `cov` (count columns first).
 */
export function siteIntercepts(
  table: DataTable,
  X: Design,
  coding: readonly TermCoding[],
  rows: readonly number[],
  beta: ArrayLike<number>,
  cov: Float64Array,
  k: number,
): SiteIntercepts {
  const site = coding[SITE_TERM_INDEX] as FactorCoding;
  const j0 = X.names.indexOf('intercept');
  const colOf = new Map<string, number>();
  X.names.forEach((nm, j) => {
    if (X.termOf[j] === SITE_TERM_INDEX) colOf.set(nm.slice(site.column.length + 1), j);
  });
  const levels = [...site.levels];
  const effect = new Float64Array(levels.length);
  const sd = new Float64Array(levels.length);
  levels.forEach((lv, g) => {
    const j = colOf.get(lv);
    const v00 = cov[j0 * k + j0];
    if (j === undefined) {
      effect[g] = beta[j0];
      sd[g] = Math.sqrt(v00);
    } else {
      effect[g] = beta[j0] + beta[j];
      sd[g] = Math.sqrt(v00 + cov[j * k + j] + 2 * cov[j * k + j0]);
    }
  });
  const texts = requireColumn(table, site.column).texts;
  const index = new Map(levels.map((l, g) => [l, g]));
  const siteOfRow = Int32Array.from(rows, (r) => index.get(texts[r]) ?? -1);
  const listed = X.names.map((_, j) => j).filter((j) => j !== j0 && X.termOf[j] !== SITE_TERM_INDEX);
  return { levels, effect, sd, siteOfRow, listed };
}
