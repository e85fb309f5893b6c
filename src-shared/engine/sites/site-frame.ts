/**
 * The rows, response, offset, design and site index of a model with a site
 * term, from a table and a spec: the model frame and the design builder of
 * the engine, plus the site column turned into an index per used row.
 */
import type { DataTable } from '../../data/table';
import { requireColumn, sortLevels } from '../../data/table';
import type { ModelSpec } from '../../model/spec';
import { buildDesign } from '../design/build';
import { frameOptions, modelFrame } from '../frame';
import { countTerms } from '../model-terms';
import type { Design, Warning } from '../types';
import { FitInputError } from '../types';

export interface SiteFrame {
  /** Table rows used (0-based), in order. */
  readonly rows: number[];
  readonly y: Float64Array;
  readonly offset: Float64Array;
  readonly hasOffset: boolean;
  readonly design: Design;
  /** Site index per used row, into `levels`. */
  readonly site: Int32Array;
  /** Site names (cell texts) in sorted order. */
  readonly levels: string[];
  readonly column: string;
  readonly warnings: Warning[];
}

/** Site index per row from the cell texts: levels sorted as factor levels are. */
export function siteIndex(texts: readonly string[]): { site: Int32Array; levels: string[] } {
  const levels = sortLevels([...new Set(texts)]);
  const index = new Map(levels.map((l, k) => [l, k] as const));
  return { site: Int32Array.from(texts, (t) => index.get(t)!), levels };
}

export function siteFrame(table: DataTable, spec: ModelSpec, intercept: boolean, kind: 'fixed' | 'random'): SiteFrame {
  const siteSpec = spec.site;
  if (!siteSpec) {
    throw new FitInputError('no-site', `This fit needs a site column, but the model spec has no "site" entry. Add "site": { "column": ..., "effect": "${kind}" }.`);
  }
  if (spec.distribution !== 'poisson' && spec.distribution !== 'negbin' && !(kind === 'fixed' && spec.distribution === 'quasipoisson')) {
    throw new FitInputError(
      'unsupported-site-model',
      `${kind === 'fixed' ? 'Fixed' : 'Random'} site effects are available for the ${kind === 'fixed' ? 'poisson, quasipoisson' : 'poisson'} and negbin distributions, not "${spec.distribution}". Change the distribution or the site effect.`,
    );
  }
  for (const t of spec.predictors) {
    const cols = t.type === 'interaction' ? t.columns : [t.column];
    if (cols.includes(siteSpec.column)) {
      throw new FitInputError(
        'site-in-predictors',
        `The site column "${siteSpec.column}" is also listed among the predictors. The site effect already accounts for it; remove it from "predictors".`,
      );
    }
  }
  requireColumn(table, siteSpec.column);
  const frame = modelFrame(table, frameOptions(spec));
  // Fixed sites: dependence is checked after within-site centring (./absorbed-core.ts), which also finds plain dependence.
  const built = buildDesign(table, countTerms(table, spec, frame.rows), { intercept, rows: frame.rows, dropAliased: kind === 'random' });
  const col = requireColumn(table, siteSpec.column);
  const { site, levels } = siteIndex(frame.rows.map((r) => col.texts[r]));
  return {
    rows: frame.rows,
    y: frame.y,
    offset: frame.offset,
    hasOffset: frame.hasOffset,
    design: built.design,
    site,
    levels,
    column: siteSpec.column,
    warnings: [...frame.warnings, ...built.warnings],
  };
}
