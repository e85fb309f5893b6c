/**
 * How often the 95% limits of the slope cover the true slope, over
 * programmes simulated from a design (negative-binomial counts with normal
 * site effects) and refitted with a log-linear trend and site effects.
 */
import { deriveSeed } from '../demo/prng';
import { inThreadRunner, type FitRunner } from './fit-runner';
import type { PowerDesign } from './power-design';
import { powerSpec, simulateProgramme, type PowerFitModel } from './power-simulation';
import { slopeOf } from './slope';

export interface CoverageResult {
  replicates: number;
  failed: number;
  covered: number;
  coverage: number;
  /** Monte-Carlo standard error of `coverage`. */
  mcse: number;
}

export async function slopeCoverage(design: PowerDesign, replicates: number, seed: number, options: { model?: PowerFitModel; siteEffect?: 'fixed' | 'random'; runner?: FitRunner } = {}): Promise<CoverageResult> {
  const spec = powerSpec(options.model ?? 'negbin', options.siteEffect ?? 'fixed');
  const jobs = Array.from({ length: replicates }, (_, r) => ({ table: simulateProgramme(design, deriveSeed(seed, `coverage #${r}`)), spec }));
  const done = await (options.runner ?? inThreadRunner)(jobs);
  const truth = Math.log1p(design.annualChange);
  let covered = 0;
  let failed = 0;
  for (const f of done) {
    if (!f.ok || !f.outcome.summary.converged) {
      failed++;
      continue;
    }
    const s = slopeOf(f.outcome, 'season');
    if (Math.log1p(s.lower) <= truth && truth <= Math.log1p(s.upper)) covered++;
  }
  const n = replicates - failed;
  const coverage = covered / n;
  return { replicates: n, failed, covered, coverage, mcse: Math.sqrt((coverage * (1 - coverage)) / n) };
}
