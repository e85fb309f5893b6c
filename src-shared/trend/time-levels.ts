/** The seasons (time values) a fit used, the base season, and the names of their coefficients. */
import type { DataTable } from '../data/table';
import { parseNumber, requireColumn, sortLevels } from '../data/table';
import type { FitOutcome } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import { TrendError } from './errors';

export interface TimeLevels {
  readonly column: string;
  /** Cell texts of the time values in the rows used, sorted (numeric order when all are numbers). */
  readonly levels: readonly string[];
  /** The time values as published: numbers when every level is a number, else the texts. */
  readonly values: readonly (number | string)[];
  /** Whether every level is a number. */
  readonly numeric: boolean;
}

export function timeColumnOf(spec: ModelSpec): string {
  if (!spec.time) throw new TrendError('no-time', 'The model spec has no "time" entry, so there is no trend to estimate. Add "time": { "column": "season", "trend": "annual" } (or "linear") to the spec.');
  return spec.time.column;
}

/** The sorted time levels of the rows a fit used. */
export function timeLevels(table: DataTable, spec: ModelSpec, outcome: Pick<FitOutcome, 'rows'>): TimeLevels {
  const column = timeColumnOf(spec);
  const col = requireColumn(table, column);
  const seen = new Set<string>();
  for (const r of outcome.rows) seen.add(col.texts[r]);
  const levels = sortLevels([...seen]);
  const numeric = levels.every((l) => !Number.isNaN(parseNumber(l)));
  return { column, levels, numeric, values: levels.map((l) => (numeric ? parseNumber(l) : l)) };
}

/** The level text matching a base given as number or text, or an error listing the levels. */
export function resolveLevel(time: TimeLevels, wanted: number | string, what = 'base season'): string {
  const text = String(wanted).trim();
  const hit = time.levels.find((l) => l === text) ?? time.levels.find((l) => !Number.isNaN(parseNumber(text)) && parseNumber(l) === parseNumber(text));
  if (hit === undefined) {
    const list = time.levels.slice(0, 30).join(', ');
    throw new TrendError('unknown-time', `The ${what} ${text} is not a value of "${time.column}" in the rows used; the values are ${list}${time.levels.length > 30 ? ' ...' : ''}. Choose one of them.`);
  }
  return hit;
}

/** The base season of the fit's annual factor: the spec's base, else the first level. */
export function fittedBase(time: TimeLevels, spec: ModelSpec): string {
  return spec.time?.base !== undefined ? resolveLevel(time, spec.time.base) : time.levels[0];
}

/** Coefficient name of an annual effect (`season=2014`). */
export function levelTerm(column: string, level: string): string {
  return `${column}=${level}`;
}
