/** Estimates on the log scale turned into published indices and changes with Wald limits. */
import { Z_975 } from '../engine/inference/wald';
import { normalQuantile } from '../engine/math/distributions';

export interface IndexRow {
  time: number | string;
  index: number;
  lower: number;
  upper: number;
}

export interface ChangeInterval {
  perYear: number;
  lower: number;
  upper: number;
}

/** The two-sided normal quantile for a confidence level (0.95 -> 1.96). */
export function zFor(level = 0.95): number {
  if (!(level > 0 && level < 1)) throw new RangeError(`A confidence level lies between 0 and 1, not ${level}.`);
  return level === 0.95 ? Z_975 : normalQuantile(1 - (1 - level) / 2);
}

/** 100 exp(g) with limits 100 exp(g -/+ z se). */
export function indexFromLog(time: number | string, g: number, se: number, z = Z_975): IndexRow {
  return { time, index: 100 * Math.exp(g), lower: 100 * Math.exp(g - z * se), upper: 100 * Math.exp(g + z * se) };
}

/** exp(b) - 1 with limits exp(b -/+ z se) - 1. */
export function changeFromLog(b: number, se: number, z = Z_975): ChangeInterval {
  return { perYear: Math.expm1(b), lower: Math.expm1(b - z * se), upper: Math.expm1(b + z * se) };
}
