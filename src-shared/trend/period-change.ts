/**
 * Change between two periods: the mean log index of the later period minus
 * the mean log index of the earlier one, as a ratio with Wald limits
 * (a linear contrast of the annual effects, so its variance is exact).
 */
import type { DataTable } from '../data/table';
import { parseNumber } from '../data/table';
import type { FitOutcome } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import { contrast, type Weight } from './contrast';
import { TrendError } from './errors';
import { annualWeights } from './indices';
import { zFor } from './interval';
import { fittedBase, timeLevels, type TimeLevels } from './time-levels';

export interface Period {
  readonly first: number | string;
  readonly last: number | string;
}

export interface PeriodChange {
  from: { first: number | string; last: number | string; seasons: number };
  to: { first: number | string; last: number | string; seasons: number };
  /** exp(mean log index of `to` - mean log index of `from`). */
  ratio: number;
  lower: number;
  upper: number;
  /** 100 (ratio - 1). */
  percent: number;
  method: string;
}

/** Parses `2012-2014:2022-2024` (a single season may stand alone: `2012:2024`). */
export function parsePeriods(text: string): [Period, Period] {
  const parts = text.split(':');
  const period = (p: string): Period => {
    const m = /^\s*([^-\s]+)\s*(?:-\s*([^-\s]+)\s*)?$/.exec(p);
    if (!m) throw new TrendError('bad-periods', `A period is written FIRST-LAST (e.g. 2012-2014), not "${p}".`);
    const num = (s: string) => (Number.isNaN(parseNumber(s)) ? s : parseNumber(s));
    return { first: num(m[1]), last: num(m[2] ?? m[1]) };
  };
  if (parts.length !== 2) throw new TrendError('bad-periods', `Give two periods as FIRST-LAST:FIRST-LAST (e.g. 2012-2014:2022-2024), not "${text}".`);
  return [period(parts[0]), period(parts[1])];
}

/** Levels of the time column that fall in a period (by position in the sorted levels). */
export function levelsIn(time: TimeLevels, p: Period): string[] {
  const pos = (v: number | string) => time.values.findIndex((x) => x === v || String(x) === String(v));
  const a = pos(p.first);
  const b = pos(p.last);
  if (a < 0 || b < 0) {
    const missing = a < 0 ? p.first : p.last;
    throw new TrendError('unknown-time', `The season ${missing} is not a value of "${time.column}" in the rows used; the values are ${time.levels.join(', ')}.`);
  }
  if (a > b) throw new TrendError('bad-periods', `The period ${p.first}-${p.last} runs backwards; write the earlier season first.`);
  return time.levels.slice(a, b + 1);
}

export function periodChange(table: DataTable, spec: ModelSpec, outcome: FitOutcome, from: Period, to: Period, level = 0.95): PeriodChange {
  const time = timeLevels(table, spec, outcome);
  const reference = fittedBase(time, spec);
  const A = levelsIn(time, from);
  const B = levelsIn(time, to);
  const weights: Weight[] = [];
  for (const l of A) for (const w of annualWeights(outcome, time, reference, l, reference)) weights.push({ name: w.name, weight: -w.weight / A.length });
  for (const l of B) for (const w of annualWeights(outcome, time, reference, l, reference)) weights.push({ name: w.name, weight: w.weight / B.length });
  const e = contrast(outcome, weights);
  const z = zFor(level);
  const ratio = Math.exp(e.estimate);
  return {
    from: { first: from.first, last: from.last, seasons: A.length },
    to: { first: to.first, last: to.last, seasons: B.length },
    ratio,
    lower: Math.exp(e.estimate - z * e.se),
    upper: Math.exp(e.estimate + z * e.se),
    percent: 100 * (ratio - 1),
    method: 'mean log index of each period from the annual fit; Wald limits from its covariance',
  };
}
