import { findColumn, levelsOf, sortLevels, type DataTable } from '@shared/data/table';
import type { TableRoles } from '@shared/model/table-roles';
import { timeIsPredictor } from '@shared/model/season-term';
import { hasZeroPart, parseModelSpec, SpecError, type Distribution, type ModelSpec, type Term } from '@shared/model/spec';

/**
 * The model builder's form: what the analyst chose, in the words of the
 * screen. `specOf` turns it into the engine's ModelSpec (the CLI contract's
 * shape), so the builder never writes a spec by hand.
 */
export interface PredictorChoice {
  readonly column: string;
  readonly type: 'numeric' | 'factor';
  /** Reference level of a factor ('' for the first in sorted order). */
  readonly reference: string;
}

export type SiteChoice = 'none' | 'fixed' | 'random';
export type TimeChoice = 'none' | 'annual' | 'linear' | 'smooth';

/** Two chosen predictors whose effects may depend on each other. */
export type InteractionChoice = readonly [string, string];

export interface SpecDraft {
  readonly species: readonly string[];
  readonly distribution: Distribution;
  readonly predictors: readonly PredictorChoice[];
  readonly zeroPredictors: readonly PredictorChoice[];
  readonly effortOffset: boolean;
  readonly areaOffset: boolean;
  readonly site: SiteChoice;
  readonly quadraturePoints: number;
  readonly time: TimeChoice;
  /** Degrees of freedom of the smooth season curve (time 'smooth'). */
  readonly seasonDf: number;
  /** Two-way interactions in the count part, between chosen predictors. */
  readonly interactions: readonly InteractionChoice[];
  /** Leave out the rows whose chosen offset is missing or not positive (instead of refusing the fit). */
  readonly dropBadOffsetRows: boolean;
}

export { tableRoles, type TableRoles } from '@shared/model/table-roles';

export const initialDraft: SpecDraft = {
  species: [],
  distribution: 'poisson',
  predictors: [],
  zeroPredictors: [],
  effortOffset: true,
  areaOffset: false,
  site: 'fixed',
  quadraturePoints: 9,
  time: 'annual',
  seasonDf: 4,
  interactions: [],
  dropBadOffsetRows: false,
};

export const distributionNames: Record<Distribution, string> = {
  poisson: 'Poisson',
  quasipoisson: 'Quasi-Poisson',
  negbin: 'Negative binomial',
  zip: 'Zero-inflated Poisson',
  zinb: 'Zero-inflated negative binomial',
  'hurdle-poisson': 'Hurdle Poisson',
  'hurdle-negbin': 'Hurdle negative binomial',
};

/**
 * The analysis table's bookkeeping columns: how many of a row's visits were
 * at-least, approximate or present-without-a-number records (see
 * aggregate.ts). They describe how a row was made, not the site or season,
 * so they are kept for notes and checks, never offered as predictors. The
 * number of visits summed (`visits`) stays a choice: with effort as the
 * offset it can still be worth a term where visits differ in kind.
 */
export const bookkeepingColumns = ['at_least_records', 'approximate_records', 'present_uncounted'] as const;

/** Columns that are bookkeeping or roles, never predictors. */
const notPredictors = new Set<string>(['count', 'site', 'season', 'species', 'log_effort', 'log_area', 'offset', 'area_ha', ...bookkeepingColumns]);

export interface PredictorColumn {
  readonly name: string;
  /** Every cell a number (or blank): offered as numeric first. */
  readonly numeric: boolean;
  /** Distinct values, sorted as the engine sorts factor levels. */
  readonly levels: readonly string[];
}

export function predictorColumns(table: DataTable, roles: TableRoles): PredictorColumn[] {
  return table.columns
    .filter((c) => !notPredictors.has(c.name) && c.name !== roles.effort?.column)
    .map((c) => {
      const levels = sortLevels(levelsOf(c));
      const numeric = c.texts.every((t, i) => t === '' || Number.isFinite(c.values[i]));
      return { name: c.name, numeric, levels };
    });
}

export function speciesOf(table: DataTable): string[] {
  const col = findColumn(table, 'species');
  return col ? sortLevels(levelsOf(col)) : [];
}

function termOf(p: PredictorChoice): Term {
  return p.type === 'numeric' ? { column: p.column, type: 'numeric' } : { column: p.column, type: 'factor', ...(p.reference ? { reference: p.reference } : {}) };
}

const wholeIn = (v: number, lo: number, hi: number) => Number.isInteger(v) && v >= lo && v <= hi;

/** The engine's spec for the draft (the same for every species of a batch); a SpecError in plain words when a number is out of range. */
export function specOf(draft: SpecDraft, roles: TableRoles): ModelSpec {
  if (draft.time === 'smooth' && !wholeIn(draft.seasonDf, 1, 20)) throw new SpecError('The season curve needs a whole number of degrees of freedom from 1 to 20 (4 is a usual start).');
  if (draft.site === 'random' && !wholeIn(draft.quadraturePoints, 1, 50)) throw new SpecError('The number of quadrature points must be a whole number from 1 (the Laplace approximation) to 50.');
  const offsets = [
    ...(draft.effortOffset && roles.effort ? [{ column: roles.effort.column, log: true }] : []),
    ...(draft.areaOffset && roles.area ? [{ column: roles.area.column, log: true }] : []),
  ];
  return parseModelSpec({
    response: roles.response,
    distribution: draft.distribution,
    predictors: [
      ...draft.predictors.map(termOf),
      ...draft.interactions.map((columns) => ({ type: 'interaction' as const, columns: [...columns] })),
      // The smooth season curve as the trend module writes it (src-shared/trend/trend-specs.ts): a spline term plus the time column.
      ...(draft.time === 'smooth' ? [{ column: roles.season, type: 'spline' as const, df: draft.seasonDf }] : []),
    ],
    offsets,
    zeroPredictors: hasZeroPart(draft.distribution) ? draft.zeroPredictors.map(termOf) : [],
    ...(draft.site !== 'none' ? { site: { column: roles.site, effect: draft.site, quadraturePoints: draft.quadraturePoints } } : {}),
    ...(draft.time !== 'none' ? { time: { column: roles.season, trend: draft.time === 'smooth' ? 'linear' : draft.time } } : {}),
  });
}

/** A short name for a fitted spec: "Negative binomial, site fixed, season annual". */
function termName(t: Term): string {
  if (t.type === 'interaction') return t.columns.join(' × ');
  return t.type === 'spline' ? `smooth ${t.column} (${t.df} df)` : t.column;
}

export function specLabel(spec: ModelSpec): string {
  const parts = [distributionNames[spec.distribution]];
  if (spec.predictors.length) parts.push(spec.predictors.map(termName).join(' + '));
  if (spec.site) parts.push(spec.site.effect === 'random' ? `site random (${spec.site.quadraturePoints} pt${spec.site.quadraturePoints === 1 ? '' : 's'})` : 'site fixed');
  if (spec.time && !timeIsPredictor(spec)) parts.push(`season ${spec.time.trend}`);
  if (hasZeroPart(spec.distribution) && spec.zeroPredictors.length) parts.push(`zero part: ${spec.zeroPredictors.map(termName).join(' + ')}`);
  if (!spec.offsets.length) parts.push('no offset');
  return parts.join(', ');
}

