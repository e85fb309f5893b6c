/**
 * Which coefficient the influence-by-site chart follows: the trend. With a
 * linear time trend that is the slope on the time column; with an annual
 * trend (time as a factor) the last time level against the base, i.e. the
 * change from the base season to the latest one; without a time term, the
 * first count-part coefficient after the intercept that is not a site
 * effect. Returns null when there is none.
 */
import type { ModelSpec } from '../model/spec';

export interface InfluenceCoefficient {
  /** The coefficient's published name (e.g. "season" or "season=2024"). */
  readonly name: string;
  /** What it measures, in words for the chart. */
  readonly meaning: string;
}

export function influenceCoefficient(spec: Pick<ModelSpec, 'time' | 'site'>, betaNames: readonly string[]): InfluenceCoefficient | null {
  const time = spec.time;
  if (time) {
    if (betaNames.includes(time.column)) return { name: time.column, meaning: `the trend per ${time.column}` };
    const prefix = `${time.column}=`;
    const levels = betaNames.filter((b) => b.startsWith(prefix) && !b.includes(' & '));
    if (levels.length) {
      const last = levels[levels.length - 1];
      return { name: last, meaning: `the change from the base ${time.column} to ${last.slice(prefix.length)}` };
    }
  }
  const siteLevel = spec.site ? `${spec.site.column}=` : null;
  const first = betaNames.find((b) => b !== 'intercept' && !(siteLevel && b.startsWith(siteLevel)));
  return first === undefined ? null : { name: first, meaning: `the coefficient of ${first}` };
}
