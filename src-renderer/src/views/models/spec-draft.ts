import { findColumn, levelsOf, sortLevels, type DataTable } from '@shared/data/table';
import { hasZeroPart, parseModelSpec, type Distribution, type ModelSpec, type Term } from '@shared/model/spec';

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
export type TimeChoice = 'none' | 'annual' | 'linear';

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
  /** Leave out the rows whose chosen offset is missing or not positive (instead of refusing the fit). */
  readonly dropBadOffsetRows: boolean;
}

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

/** The analysis table's roles: which columns are the response, grouping, time and offsets. */
export interface TableRoles {
  readonly response: 'count';
  readonly site: 'site';
  readonly season: 'season';
  readonly species: 'species';
  /** Effort column (e.g. effort_h) and its unit, when the records have effort. */
  readonly effort?: { readonly column: string; readonly unit: string };
  readonly area?: { readonly column: 'area_ha'; readonly unit: 'ha' };
}

const unitOfEffortColumn: Record<string, string> = { effort_h: 'hours', effort_km: 'km', effort_trap_nights: 'trap-nights', effort_visits: 'visits', effort_points: 'points' };

export function tableRoles(table: DataTable, effortColumn: string | undefined): TableRoles {
  return {
    response: 'count',
    site: 'site',
    season: 'season',
    species: 'species',
    ...(effortColumn ? { effort: { column: effortColumn, unit: unitOfEffortColumn[effortColumn] ?? 'units' } } : {}),
    ...(findColumn(table, 'area_ha') ? { area: { column: 'area_ha' as const, unit: 'ha' as const } } : {}),
  };
}

/** Columns that are bookkeeping or roles, never predictors. */
const notPredictors = new Set(['count', 'site', 'season', 'species', 'log_effort', 'log_area', 'offset', 'area_ha']);

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

/** The engine's spec for the draft (the same for every species of a batch). */
export function specOf(draft: SpecDraft, roles: TableRoles): ModelSpec {
  const offsets = [
    ...(draft.effortOffset && roles.effort ? [{ column: roles.effort.column, log: true }] : []),
    ...(draft.areaOffset && roles.area ? [{ column: roles.area.column, log: true }] : []),
  ];
  return parseModelSpec({
    response: roles.response,
    distribution: draft.distribution,
    predictors: draft.predictors.map(termOf),
    offsets,
    zeroPredictors: hasZeroPart(draft.distribution) ? draft.zeroPredictors.map(termOf) : [],
    ...(draft.site !== 'none' ? { site: { column: roles.site, effect: draft.site, quadraturePoints: draft.quadraturePoints } } : {}),
    ...(draft.time !== 'none' ? { time: { column: roles.season, trend: draft.time } } : {}),
  });
}

/** A short name for a fitted spec: "Negative binomial, site fixed, season annual". */
export function specLabel(spec: ModelSpec): string {
  const parts = [distributionNames[spec.distribution]];
  if (spec.predictors.length) parts.push(spec.predictors.map((t) => ('column' in t ? t.column : t.columns.join(' & '))).join(' + '));
  if (spec.site) parts.push(spec.site.effect === 'random' ? `site random (${spec.site.quadraturePoints} pt${spec.site.quadraturePoints === 1 ? '' : 's'})` : 'site fixed');
  if (spec.time) parts.push(`season ${spec.time.trend}`);
  if (hasZeroPart(spec.distribution) && spec.zeroPredictors.length) parts.push(`zero part: ${spec.zeroPredictors.map((t) => ('column' in t ? t.column : '')).join(' + ')}`);
  if (!spec.offsets.length) parts.push('no offset');
  return parts.join(', ');
}

