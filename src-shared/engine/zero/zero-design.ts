/**
 * The rows and the two design matrices of a zero-inflated or hurdle fit.
 *
 * - Model frame (shared): rows with blanks left out, response and offsets checked.
 * - Count part: predictors, the time term (../model-terms.ts) and, with
 *   fixed sites, the site as the first factor term (./fixed-sites.ts).
 * - Factor levels and fixed sites whose counts are all zero are handled as
 *   in the other count models (../design/empty-levels.ts): a reference
 *   level with only zeros is moved, and the rows of any other such level are
 *   left out with a warning. Under zero inflation this is the limit of the
 *   fit (those rows get P(0) = 1 and carry no information); in a hurdle
 *   model their count-part effect cannot be estimated at all, and they are
 *   left out of the zero part too, as the warning says.
 * - Zero part: `zeroPredictors` on the same rows, intercept only when empty.
 */
import type { DataTable } from '../../data/table';
import type { ModelSpec, Term } from '../../model/spec';
import type { BuiltDesign } from '../design/build';
import { buildDesign } from '../design/build';
import { emptyIndicatorColumns, moveEmptyReferences } from '../design/empty-levels';
import type { ModelFrame } from '../frame';
import { frameOptions, modelFrame } from '../frame';
import { countTerms } from '../model-terms';
import type { Design, Warning } from '../types';
import { countTermsWithSite, SITE_TERM_INDEX } from './fixed-sites';
import type { CheckedKind } from './input-checks';
import { checkCounts } from './input-checks';

export interface ZeroDesign {
  readonly frame: ModelFrame;
  readonly count: BuiltDesign;
  readonly X: Design;
  readonly Z: Design;
  readonly warnings: Warning[];
}

/** A part's design with an intercept; its warnings are prefixed with the part's name. */
function buildPart(table: DataTable, terms: readonly Term[], rows: readonly number[], part: string, warnings: Warning[]): BuiltDesign {
  const built = buildDesign(table, terms, { intercept: true, rows });
  for (const w of built.warnings) warnings.push({ code: w.code, message: `${part}: ${w.message}` });
  return built;
}

const NO_SITE_TERM = -1000;
const HURDLE_NOTE = ' In a hurdle model those rows are also left out of the zero part.';

export function prepareZeroDesign(table: DataTable, spec: ModelSpec, kind: CheckedKind): ZeroDesign {
  const warnings: Warning[] = [];
  let frame = modelFrame(table, frameOptions(spec));
  warnings.push(...frame.warnings);
  checkCounts(frame.y, kind, spec.response);
  let terms = countTermsWithSite(spec, countTerms(table, spec, frame.rows));
  const build = () => buildDesign(table, terms, { intercept: true, rows: frame.rows });
  let count = build();
  const moved = moveEmptyReferences(count.design, frame.y, terms, count.levels);
  if (moved.changed) {
    warnings.push(...moved.warnings);
    terms = moved.terms;
    count = build();
  }
  const siteTerm = spec.site?.effect === 'fixed' ? SITE_TERM_INDEX : NO_SITE_TERM;
  // Repeated, since leaving rows out can leave another level with only zeros.
  for (let round = 0; round < 10; round++) {
    const empty = emptyIndicatorColumns(count.design, frame.y, count.levels, siteTerm, spec.site?.column);
    if (!empty.columns.length) break;
    for (const w of empty.warnings) warnings.push(kind.zero === 'hurdle' ? { ...w, message: w.message + HURDLE_NOTE } : w);
    const drop = new Set(empty.rows);
    frame = modelFrame(table, { ...frameOptions(spec), rows: frame.rows.filter((_, i) => !drop.has(i)) });
    checkCounts(frame.y, kind, spec.response);
    count = build();
  }
  count = buildPart(table, terms, frame.rows, 'Count part', warnings);
  const Z = buildPart(table, spec.zeroPredictors, frame.rows, 'Zero part', warnings).design;
  return { frame, count, X: count.design, Z, warnings };
}
