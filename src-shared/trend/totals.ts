/**
 * Model-based totals over every site per season. A site-season that was
 * surveyed contributes its observed count; one that was not is predicted
 * from the annual fit by moving the site's own surveyed rows to that season:
 *   P(s, t) = sum over rows k of site s of E[y_k] exp(g_t - g_{t_k}) / (seasons site s was surveyed),
 * which keeps the site's effect, offsets and covariates as they were. Limits
 * come from simulation: the annual effects are drawn from the normal
 * distribution of their estimates (the fit's covariance; site effects held
 * at their estimates, observed counts held fixed), the totals recomputed,
 * and percentile limits taken.
 */
import { CholeskyDecomposition, Matrix } from 'ml-matrix';
import type { DataTable } from '../data/table';
import { requireColumn } from '../data/table';
import { createRng } from '../demo/prng';
import { sampleNormal } from '../demo/samplers';
import type { FitOutcome } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import { coefficientIndex } from './contrast';
import { TrendError } from './errors';
import { percentileLimits } from './percentile';
import { fittedBase, levelTerm, timeLevels } from './time-levels';

export interface SeasonTotal {
  time: number | string;
  total: number;
  lower: number;
  upper: number;
  /** Sites surveyed that season, of all sites. */
  surveyedSites: number;
  sites: number;
  /** The part of the total that is predicted (unsurveyed sites). */
  predicted: number;
}

export interface TotalsResult {
  totals: SeasonTotal[];
  draws: number;
  seed: number;
  method: string;
}

export function modelTotals(table: DataTable, spec: ModelSpec, outcome: FitOutcome, options: { draws?: number; seed?: number } = {}): TotalsResult {
  if (!spec.site) throw new TrendError('totals-need-site', 'Totals over all sites need the site column: add "site" to the model spec.');
  if (spec.time?.trend !== 'annual') throw new TrendError('totals-need-annual', 'Totals are predicted from annual effects: set "trend": "annual" in the spec\'s time entry.');
  const time = timeLevels(table, spec, outcome);
  const reference = fittedBase(time, spec);
  const siteCol = requireColumn(table, spec.site.column);
  const timeCol = requireColumn(table, time.column);
  const L = time.levels.length;
  const levelIndex = new Map(time.levels.map((l, i) => [l, i]));
  const siteIndex = new Map<string, number>();
  const rowSite: number[] = [];
  const rowTime: number[] = [];
  outcome.rows.forEach((r) => {
    const s = siteCol.texts[r];
    if (!siteIndex.has(s)) siteIndex.set(s, siteIndex.size);
    rowSite.push(siteIndex.get(s)!);
    rowTime.push(levelIndex.get(timeCol.texts[r])!);
  });
  const S = siteIndex.size;
  const observed = new Float64Array(S * L);
  const surveyed = new Uint8Array(S * L);
  rowSite.forEach((s, k) => {
    observed[s * L + rowTime[k]] += outcome.y[k];
    surveyed[s * L + rowTime[k]] = 1;
  });
  const seasonsOf = new Float64Array(S);
  for (let s = 0; s < S; s++) for (let t = 0; t < L; t++) seasonsOf[s] += surveyed[s * L + t];
  // Coefficients of the annual effects (reference 0) and their covariance.
  const names = time.levels.filter((l) => l !== reference).map((l) => levelTerm(time.column, l));
  const idx = names.map((n) => {
    const j = coefficientIndex(outcome, n);
    if (j < 0) throw new TrendError('season-not-estimable', `The fit has no estimate for ${n}; totals need every season's effect.`);
    return j;
  });
  const g = new Float64Array(L);
  const pos = time.levels.map((l) => (l === reference ? -1 : names.indexOf(levelTerm(time.column, l))));
  pos.forEach((p, i) => (g[i] = p < 0 ? 0 : outcome.beta[idx[p]]));
  const totalsFor = (gv: Float64Array): Float64Array => {
    // Per site: sum_k E[y_k] exp(-g_{t_k}); the prediction for season t is that times exp(g_t) / seasons.
    const base = new Float64Array(S);
    rowSite.forEach((s, k) => (base[s] += outcome.expected[k] * Math.exp(-gv[rowTime[k]])));
    const out = new Float64Array(L);
    for (let t = 0; t < L; t++) {
      for (let s = 0; s < S; s++) out[t] += surveyed[s * L + t] ? observed[s * L + t] : (base[s] * Math.exp(gv[t])) / seasonsOf[s];
    }
    return out;
  };
  const point = totalsFor(g);
  const draws = options.draws ?? 1000;
  const seed = options.seed ?? 1;
  const k = outcome.beta.length + outcome.gamma.length;
  const V = new Matrix(names.length, names.length);
  idx.forEach((a, i) => idx.forEach((b, j) => V.set(i, j, (outcome.covariance[b * k + a] + outcome.covariance[a * k + b]) / 2)));
  const chol = new CholeskyDecomposition(V);
  if (!chol.isPositiveDefinite()) throw new TrendError('totals-covariance', 'The covariance of the annual effects is not positive definite, so totals cannot be simulated; check the fit for aliased seasons.');
  const Lc = chol.lowerTriangularMatrix;
  const rng = createRng(seed);
  const sims: number[][] = Array.from({ length: L }, () => []);
  const zv = new Float64Array(names.length);
  for (let d = 0; d < draws; d++) {
    for (let i = 0; i < zv.length; i++) zv[i] = sampleNormal(rng);
    const gd = new Float64Array(L);
    pos.forEach((p, i) => {
      if (p < 0) return;
      let v = outcome.beta[idx[p]];
      for (let j = 0; j <= p; j++) v += Lc.get(p, j) * zv[j];
      gd[i] = v;
    });
    const t = totalsFor(gd);
    for (let i = 0; i < L; i++) sims[i].push(t[i]);
  }
  const totals = time.levels.map((_, t): SeasonTotal => {
    const lim = percentileLimits(sims[t]);
    let n = 0;
    let seen = 0;
    for (let s = 0; s < S; s++) {
      if (!surveyed[s * L + t]) continue;
      n++;
      seen += observed[s * L + t];
    }
    const predicted = point[t] - seen;
    return { time: time.values[t], total: point[t], lower: lim.lower, upper: lim.upper, surveyedSites: n, sites: S, predicted };
  });
  return {
    totals,
    draws,
    seed,
    method: `observed counts where a site was surveyed, model predictions (the site's surveyed rows moved to the season) where not; percentile limits from ${draws} draws of the annual effects from their estimated covariance (site effects held at their estimates, observed counts fixed)`,
  };
}
