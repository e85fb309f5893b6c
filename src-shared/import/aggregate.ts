import { columnFromNumbers, columnFromTexts, type DataTable, type TableColumn } from '../data/table';
import type { CountRecord } from './records';
import { combineVisits, covariateKind, type VisitCovariateColumn } from './visit-covariate-rule';

/**
 * The analysis table: visits aggregated to one row per site x season x
 * species, by a rule the caller picks:
 *   sum  - counts summed over the visits, effort summed over the same visits;
 *   max  - the largest count, with the effort of the visit that gave it;
 *   mean - the mean count per visit, with the mean effort per visit.
 * Only records with a finite number are used: not-surveyed and invalid cells, and
 * "present" cells without a number, are left out (present ones are counted in
 * `present_uncounted`); at-least and approximate counts are used as their
 * number and counted in `at_least_records` / `approximate_records`.
 *
 * Units: effort is in its canonical unit (hours for time, km for distance,
 * trap-nights...; the column is named for it, e.g. effort_h), area in
 * hectares (area_ha). `log_effort`, `log_area` and `offset` (their sum, or
 * whichever exists) are natural logs, for use as offsets with log: false;
 * they are blank where effort or area is missing or not positive.
 *
 * A site x season x species with no usable count (all not surveyed, or only
 * "present") gets no row. `sources[k]` lists the indices (into the records
 * given) of the records analysis row k was made from.
 *
 * Visit covariates (options.visitCovariates) are combined over the visits a
 * row uses, by the rule in visit-covariate-rule.ts: numbers by their mean
 * (with rule max: the value of the visit that gave the count), texts only
 * where the visits agree.
 */
export type AggregateRule = 'sum' | 'max' | 'mean';

export interface AggregateOptions {
  readonly rule: AggregateRule;
  /** Canonical effort unit of the records ('hours', 'km' ...), when effort is mapped. */
  readonly effortUnit?: string;
  readonly hasArea?: boolean;
  /** Covariate names to carry (the first value within a group); default: all seen. */
  readonly covariates?: readonly string[];
  /** Visit covariates to carry: the name in the records' `visitCovariates` and the table column to write; default none. */
  readonly visitCovariates?: readonly { readonly name: string; readonly column: string }[];
}

export interface AnalysisTable {
  readonly table: DataTable;
  readonly sources: readonly (readonly number[])[];
  readonly rule: AggregateRule;
  readonly effortColumn?: string;
  readonly excluded: { readonly notSurveyed: number; readonly invalid: number; readonly presentUncounted: number };
  /** The visit covariates' columns, in the order asked for. */
  readonly visitCovariates: readonly VisitCovariateColumn[];
}

const effortColumnNames: Record<string, string> = { hours: 'effort_h', km: 'effort_km', 'trap-nights': 'effort_trap_nights', visits: 'effort_visits', points: 'effort_points' };

/** Every column name aggregateRecords may write before the covariates (so that a covariate never takes one of them). */
export const fixedAnalysisColumns: readonly string[] = [
  'site', 'season', 'species', 'count', 'visits', 'effort', ...Object.values(effortColumnNames),
  'log_effort', 'area_ha', 'log_area', 'offset', 'at_least_records', 'approximate_records', 'present_uncounted',
];

export function effortColumnName(unit: string): string {
  return effortColumnNames[unit] ?? 'effort';
}

function logOrNaN(v: number): number {
  return v > 0 ? Math.log(v) : Number.NaN;
}

interface Group {
  readonly site: string;
  readonly season: string;
  readonly species: string;
  readonly used: number[];
  readonly all: number[];
  present: number;
}

export function aggregateRecords(records: readonly CountRecord[], options: AggregateOptions): AnalysisTable {
  const groups = new Map<string, Group>();
  const excluded = { notSurveyed: 0, invalid: 0, presentUncounted: 0 };
  records.forEach((r, i) => {
    const key = `${r.site}\u0000${r.season}\u0000${r.species}`;
    let g = groups.get(key);
    if (!g) {
      g = { site: r.site, season: r.season, species: r.species, used: [], all: [], present: 0 };
      groups.set(key, g);
    }
    g.all.push(i);
    if (r.status === 'not-surveyed') excluded.notSurveyed++;
    else if (r.status === 'invalid' || (r.count !== null && !Number.isFinite(r.count))) excluded.invalid++;
    else if (r.count === null) {
      excluded.presentUncounted++;
      g.present++;
    } else g.used.push(i);
  });
  const cmp = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);
  const list = [...groups.values()].filter((g) => g.used.length > 0)
    .sort((a, b) => cmp(a.site, b.site) || cmp(a.season, b.season) || cmp(a.species, b.species));
  const n = list.length;
  const count = new Float64Array(n);
  const visits = new Float64Array(n);
  const effort = new Float64Array(n);
  const area = new Float64Array(n);
  const atLeast = new Float64Array(n);
  const approx = new Float64Array(n);
  const present = new Float64Array(n);
  const covNames = options.covariates ?? [...new Set(records.flatMap((r) => Object.keys(r.covariates)))];
  const cov = covNames.map(() => new Array<string>(n).fill(''));
  const visitCovs = (options.visitCovariates ?? []).map((v) => {
    const kind = covariateKind(records.map((r) => r.visitCovariates?.[v.name] ?? null));
    return { ...v, kind, numbers: new Float64Array(n).fill(Number.NaN), texts: new Array<string>(n).fill(''), disagreeing: 0 };
  });
  const sources: number[][] = [];
  list.forEach((g, k) => {
    const used = g.used.map((i) => records[i]);
    const counts = used.map((r) => r.count!);
    const efforts = used.map((r) => (r.effort === null ? Number.NaN : r.effort));
    visits[k] = used.length;
    present[k] = g.present;
    atLeast[k] = used.filter((r) => r.status === 'at-least').length;
    approx[k] = used.filter((r) => r.status === 'approximate').length;
    let covariateVisits = used;
    if (options.rule === 'sum') {
      count[k] = counts.reduce((s, c) => s + c, 0);
      effort[k] = efforts.reduce((s, e) => s + e, 0);
    } else if (options.rule === 'max') {
      let best = 0;
      for (let j = 1; j < counts.length; j++) if (counts[j] > counts[best]) best = j;
      count[k] = counts[best];
      effort[k] = efforts[best];
      covariateVisits = [used[best]];
    } else {
      count[k] = counts.reduce((s, c) => s + c, 0) / counts.length;
      effort[k] = efforts.reduce((s, e) => s + e, 0) / efforts.length;
    }
    const withArea = records[g.all.find((i) => records[i].area !== null) ?? g.all[0]];
    area[k] = withArea.area ?? Number.NaN;
    covNames.forEach((name, c) => {
      const src = g.all.map((i) => records[i].covariates[name]).find((v) => v !== undefined && v !== '');
      cov[c][k] = src ?? '';
    });
    for (const v of visitCovs) {
      const { value, disagree } = combineVisits(covariateVisits.map((r) => r.visitCovariates?.[v.name] ?? null), v.kind);
      if (typeof value === 'number') v.numbers[k] = value;
      else if (value !== null) v.texts[k] = value;
      if (disagree) v.disagreeing++;
    }
    sources.push(g.used);
  });
  const columns: TableColumn[] = [
    columnFromTexts('site', list.map((g) => g.site)),
    columnFromTexts('season', list.map((g) => g.season)),
    columnFromTexts('species', list.map((g) => g.species)),
    columnFromNumbers('count', count),
    columnFromNumbers('visits', visits),
  ];
  const offset = new Float64Array(n).fill(0);
  const hasOffset = new Uint8Array(n);
  const effortColumn = options.effortUnit ? effortColumnName(options.effortUnit) : undefined;
  if (effortColumn) {
    const logE = Float64Array.from(effort, logOrNaN);
    columns.push(columnFromNumbers(effortColumn, effort), columnFromNumbers('log_effort', logE));
    logE.forEach((v, k) => {
      offset[k] += v;
      hasOffset[k] = 1;
    });
  }
  if (options.hasArea) {
    const logA = Float64Array.from(area, logOrNaN);
    columns.push(columnFromNumbers('area_ha', area), columnFromNumbers('log_area', logA));
    logA.forEach((v, k) => {
      offset[k] += v;
      hasOffset[k] = 1;
    });
  }
  if (effortColumn || options.hasArea) columns.push(columnFromNumbers('offset', offset.map((v, k) => (hasOffset[k] ? v : Number.NaN))));
  columns.push(columnFromNumbers('at_least_records', atLeast), columnFromNumbers('approximate_records', approx), columnFromNumbers('present_uncounted', present));
  covNames.forEach((name, c) => {
    if (!columns.some((col) => col.name === name)) columns.push(columnFromTexts(name, cov[c]));
  });
  for (const v of visitCovs) columns.push(v.kind === 'number' ? columnFromNumbers(v.column, v.numbers) : columnFromTexts(v.column, v.texts));
  const visitCovariates = visitCovs.map(({ name, column, kind, disagreeing }) => ({ name, column, kind, disagreeing }));
  return { table: { nrows: n, columns }, sources, rule: options.rule, effortColumn, excluded, visitCovariates };
}
