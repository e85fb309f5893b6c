/**
 * The lead sentence of a species section, written from the slope and its
 * limits so that it never says more than the interval supports: a decline or
 * an increase only when the whole 95% interval lies on that side of no change.
 */
import type { ChangeInterval } from '../trend/interval';
import { percentSize, signedPercent } from './number-format';

export interface SummaryParts {
  /** What was counted ("common toad"). */
  readonly subject: string;
  /** The per-season change exp(b) - 1 with its 95% limits. */
  readonly slope: ChangeInterval;
  readonly first: number | string;
  readonly last: number | string;
  /** Seasons between first and last (last - first for numeric seasons). */
  readonly span: number;
}

/** The change over the span implied by a constant per-season change, with limits (the map is monotone). */
export function changeOverSpan(slope: ChangeInterval, span: number): ChangeInterval {
  const over = (r: number) => Math.pow(1 + r, span) - 1;
  return { perYear: over(slope.perYear), lower: over(slope.lower), upper: over(slope.upper) };
}

export function summarySentence(p: SummaryParts): string {
  const period = `${p.first}–${p.last}`;
  const c = changeOverSpan(p.slope, p.span);
  const rate = `${signedPercent(p.slope.perYear)} a season, limits ${signedPercent(p.slope.lower)} to ${signedPercent(p.slope.upper)}`;
  if (![c.perYear, c.lower, c.upper].every(Number.isFinite)) {
    return `The trend in counts of ${p.subject} over ${period} has no finite estimate; see the cautions below.`;
  }
  if (c.upper < 0) {
    return `Counts of ${p.subject} declined by ${percentSize(c.perYear)} (95% limits ${percentSize(c.upper)} to ${percentSize(c.lower)}) over ${period}, on the fitted log-linear trend (${rate}).`;
  }
  if (c.lower > 0) {
    return `Counts of ${p.subject} increased by ${percentSize(c.perYear)} (95% limits ${percentSize(c.lower)} to ${percentSize(c.upper)}) over ${period}, on the fitted log-linear trend (${rate}).`;
  }
  return `Over ${period} the fitted trend in counts of ${p.subject} lies between a ${percentSize(c.lower)} decline and a ${percentSize(c.upper)} increase (95% limits; ${rate}): the data cannot tell decline from increase.`;
}
