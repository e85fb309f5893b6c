/**
 * Invented, seeded monitoring data for the simulation tests: sites surveyed
 * over several seasons, each with its own level, a common log-linear trend,
 * effort in hours, and negative-binomial (or Poisson) counts.
 */
import type { DataTable } from '@shared/data/table';
import { columnFromNumbers, columnFromTexts } from '@shared/data/table';
import { createRng } from '@shared/demo/prng';
import { sampleNegBinomial, sampleNormal, samplePoisson } from '@shared/demo/samplers';
import type { FitForDiagnostics } from '@shared/diagnostics';
import type { Distribution } from '@shared/model/spec';

export interface SiteSimulation {
  readonly sites: number;
  readonly seasons: number;
  readonly slope: number;
  /** Negative-binomial size; undefined for Poisson counts. */
  readonly theta?: number;
  readonly siteSd: number;
  readonly baseMean: number;
}

export function simulateSites(seed: number, s: SiteSimulation): DataTable {
  const rng = createRng(seed);
  const site: string[] = [];
  const season: number[] = [];
  const effort: number[] = [];
  const count: number[] = [];
  for (let g = 0; g < s.sites; g++) {
    const level = sampleNormal(rng, 0, s.siteSd);
    for (let t = 0; t < s.seasons; t++) {
      const e = 1 + Math.floor(rng.uniform() * 4);
      const mu = s.baseMean * e * Math.exp(level + s.slope * t);
      site.push(`S${String(g + 1).padStart(2, '0')}`);
      season.push(2015 + t);
      effort.push(e);
      count.push(s.theta === undefined ? samplePoisson(rng, mu) : sampleNegBinomial(rng, mu, s.theta));
    }
  }
  return {
    nrows: count.length,
    columns: [columnFromTexts('site', site), columnFromNumbers('season', season), columnFromNumbers('effort_h', effort), columnFromNumbers('count', count)],
  };
}

/** A "fit" whose parameters are the truth: the model the data come from, for checks under the true model. */
export function trueModel(distribution: Exclude<Distribution, 'quasipoisson'>, mu: Float64Array, y: Float64Array, theta: number | null, zeroProb?: Float64Array): FitForDiagnostics {
  const n = mu.length;
  const expected = Float64Array.from(mu, (m, i) => {
    if (!zeroProb) return m;
    if (distribution === 'zip' || distribution === 'zinb') return (1 - zeroProb[i]) * m;
    const p0 = distribution === 'hurdle-poisson' ? Math.exp(-m) : Math.pow(theta! / (theta! + m), theta!);
    return (zeroProb[i] * m) / (1 - p0);
  });
  return { distribution, rows: Int32Array.from({ length: n }, (_, i) => i), y, mu, theta, zeroProb, expected };
}
