/**
 * A design taken from an existing programme: its numbers of sites, seasons
 * and visits, mean count, theta, site SD and annual change from a fit of a
 * log-linear trend with site effects (the spec's time column as the trend).
 */
import type { DataTable } from '../data/table';
import { fitModel } from '../engine/fit';
import type { ModelSpec } from '../model/spec';
import { TrendError } from './errors';
import type { PowerDesign } from './power-design';
import { slopeOf } from './slope';
import { timeLevels } from './time-levels';
import { linearTrendSpec } from './trend-specs';

export function designFromFit(table: DataTable, spec: ModelSpec, alpha = 0.05): PowerDesign {
  if (!spec.site) throw new TrendError('power-needs-site', 'A design from a fit needs the site column: add "site" to the model spec.');
  const lin = linearTrendSpec(spec);
  const fit = fitModel(table, lin);
  const time = timeLevels(table, lin, fit);
  const effects = fit.siteEffects;
  const sites = effects ? effects.levels.length : 0;
  if (sites < 2) throw new TrendError('power-needs-site', `The fit has ${sites} site${sites === 1 ? '' : 's'}; a design needs at least 2.`);
  let mean = 0;
  for (const y of fit.y) mean += y;
  mean /= fit.y.length;
  let siteSd: number;
  if (fit.summary.random) siteSd = fit.summary.random.sd;
  else {
    const e = Array.from(effects!.effect);
    const m = e.reduce((a, b) => a + b, 0) / e.length;
    siteSd = Math.sqrt(e.reduce((a, b) => a + (b - m) ** 2, 0) / Math.max(1, e.length - 1));
  }
  const slope = slopeOf(fit, time.column);
  return {
    sites,
    seasons: time.levels.length,
    visits: Math.max(1, Math.round(fit.y.length / (sites * time.levels.length))),
    meanCount: mean,
    theta: fit.theta,
    siteSd,
    annualChange: slope.perYear,
    alpha,
  };
}
