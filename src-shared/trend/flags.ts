/**
 * Decision flags: the fitted log-linear trend projected over a horizon,
 * (1 + r)^h - 1 with its limits projected the same way (the map is
 * monotone, so Wald, robust or bootstrap limits carry over), compared with
 * reductions of 30%, 50% and 80% — the thresholds of criterion A of the
 * IUCN Red List Categories and Criteria (version 3.1, 2012). The sentences
 * say what the interval supports; they are not a Red List assessment.
 */
import type { ChangeInterval } from './interval';

export type FlagStatus = 'beyond' | 'reaches' | 'excludes';

export interface ThresholdFlag {
  /** The reduction as a fraction (0.3 = a 30% decline). */
  decline: number;
  status: FlagStatus;
  sentence: string;
}

export interface DecisionFlags {
  horizon: number;
  /** Projected change over the horizon as a fraction, with limits. */
  projected: { change: number; lower: number; upper: number };
  direction: 'decline' | 'increase' | 'unclear';
  summary: string;
  thresholds: ThresholdFlag[];
  caution: string;
}

export const DEFAULT_HORIZON = 10;
export const DEFAULT_THRESHOLDS: readonly number[] = [0.3, 0.5, 0.8];
export const FLAG_CAUTION =
  'These flags project the fitted log-linear trend forward at a constant rate; they are not a Red List assessment, which also weighs generation length, range, population size and the quality of the data.';

const pct = (x: number) => `${Math.round(Math.abs(x) * 1000) / 10}%`;

export function decisionFlags(slope: ChangeInterval, horizon = DEFAULT_HORIZON, thresholds: readonly number[] = DEFAULT_THRESHOLDS, level = 0.95): DecisionFlags {
  if (!(horizon > 0)) throw new RangeError(`The horizon is a positive number of seasons, not ${horizon}.`);
  const over = (r: number) => Math.pow(1 + r, horizon) - 1;
  const projected = { change: over(slope.perYear), lower: over(slope.lower), upper: over(slope.upper) };
  const span = `${horizon} season${horizon === 1 ? '' : 's'}`;
  const lvl = `${Math.round(level * 100)}%`;
  let direction: DecisionFlags['direction'];
  let summary: string;
  if (projected.upper < 0) {
    direction = 'decline';
    summary = `The whole ${lvl} interval lies below no change: the data point to a decline (between ${pct(projected.upper)} and ${pct(projected.lower)} over ${span} if the trend goes on).`;
  } else if (projected.lower > 0) {
    direction = 'increase';
    summary = `The whole ${lvl} interval lies above no change: the data point to an increase (between ${pct(projected.lower)} and ${pct(projected.upper)} over ${span} if the trend goes on).`;
  } else {
    direction = 'unclear';
    summary = `The ${lvl} interval spans no change: the data cannot tell decline from increase.`;
  }
  const flags = thresholds.map((d): ThresholdFlag => {
    if (!(d > 0 && d < 1)) throw new RangeError(`A threshold is a reduction between 0 and 1 (0.3 for 30%), not ${d}.`);
    const share = pct(d);
    const at = `${/^(8|11|18)/.test(share) ? 'an' : 'a'} ${share} decline over ${span}`;
    if (projected.upper <= -d) return { decline: d, status: 'beyond', sentence: `The whole ${lvl} interval lies beyond ${at}.` };
    if (projected.lower <= -d) return { decline: d, status: 'reaches', sentence: `The ${lvl} interval reaches ${at} but does not lie wholly beyond it: such a decline is possible, not shown.` };
    return { decline: d, status: 'excludes', sentence: `The ${lvl} interval stops short of ${at}: the data speak against a decline that steep.` };
  });
  return { horizon, projected, direction, summary, thresholds: flags, caution: FLAG_CAUTION };
}
