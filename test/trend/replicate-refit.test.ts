import { describe, expect, it } from 'vitest';
import type { DataTable } from '@shared/data/table';
import { columnFromTexts } from '@shared/data/table';
import { createRng } from '@shared/demo/prng';
import { fitModel } from '@shared/engine/fit';
import { parseModelSpec } from '@shared/model/spec';
import { compositeLog } from '@shared/trend/composite-log';
import { compositeReplicate, groupFits, type ReplicateJob } from '@shared/trend/composite-replicate';
import { annualLogIndices } from '@shared/trend/indices';
import { simulateProgramme } from '@shared/trend/power-simulation';
import { startOfFit } from '@shared/trend/refit-start';
import { drawSites, rowsBySite } from '@shared/trend/resample-sites';

// A bootstrap replicate's refits skip their inference and start from the
// full-data fits; they must reach the same optimum as refits from scratch
// with full inference, so the same log indices up to optimiser noise.
// Seeded simulation (invented): a negative-binomial species and one with
// extra zeros (a zero-inflated negative binomial), 18 sites x 6 seasons.
function twoSpecies(): DataTable {
  const design = { sites: 18, seasons: 6, visits: 2, theta: 2.5, siteSd: 0.5, alpha: 0.05 };
  const a = simulateProgramme({ ...design, meanCount: 5, annualChange: -0.05 }, 31);
  const b = simulateProgramme({ ...design, meanCount: 6, annualChange: 0.03 }, 32);
  const rng = createRng(33);
  const countB = b.columns.find((c) => c.name === 'count')!.texts.map((t) => (rng.uniform() < 0.3 ? '0' : t));
  const columns = a.columns.map((c, j) => columnFromTexts(c.name, [...c.texts, ...(c.name === 'count' ? countB : b.columns[j].texts)]));
  const species = columnFromTexts('species', [...Array<string>(a.nrows).fill('A'), ...Array<string>(b.nrows).fill('B')]);
  return { nrows: species.texts.length, columns: [...columns, species] };
}

const common = parseModelSpec({ response: 'count', distribution: 'negbin', site: { column: 'site', effect: 'fixed' }, time: { column: 'season', trend: 'annual' } });
const specs = { B: parseModelSpec({ ...common, distribution: 'zinb', zeroPredictors: [] }) };

describe('bootstrap refits without inference, started from the full-data fit', () => {
  const table = twoSpecies();
  const point = groupFits(table, 'species', (k) => specs[k as 'B'] ?? common);
  const full = point.jobs.map((j) => fitModel(j.table, j.spec));
  const logs = full.map((f, i) => ({ key: point.keys[i], log: annualLogIndices(point.tables[i], point.jobs[i].spec, f) }));
  const weights = { A: 1, B: 1 };
  const groups = rowsBySite(table, 'site');
  const rng = createRng(7);
  const job = (picks: number[]): ReplicateJob => ({
    table, site: 'site', by: 'species', groups, picks, specs, common, species: 2, weights,
    base: logs[0].log.base, levels: logs[0].log.time.levels,
    starts: Object.fromEntries(full.map((f, i) => [point.keys[i], startOfFit(f)])),
  });

  it('gives the log indices of full refits from scratch (to 1e-6), and not those of the full data', () => {
    const fullData = compositeLog(logs, weights);
    let moved = 0;
    for (let r = 0; r < 6; r++) {
      const j = job(drawSites(groups, rng));
      const lean = compositeReplicate(j);
      const cold = compositeReplicate({ ...j, starts: undefined }, { inference: 'full' });
      if (!lean.ok || !cold.ok) throw new Error(`replicate ${r} failed: ${lean.ok ? '' : lean.message} ${cold.ok ? '' : cold.message}`);
      lean.values.forEach((v, t) => {
        expect(Math.abs(v - cold.values[t])).toBeLessThan(1e-6 * Math.max(1, Math.abs(cold.values[t])));
        moved = Math.max(moved, Math.abs(v - fullData[t]));
      });
    }
    // The refits left their start: resampled sites change the indices.
    expect(moved).toBeGreaterThan(1e-3);
  });

  it('a fit without inference has the estimates of the full fit and no covariance or null deviance', () => {
    for (const [i, j] of point.jobs.entries()) {
      const lean = fitModel(j.table, j.spec, { inference: 'none' });
      expect(lean.summary.converged).toBe(true);
      expect(lean.betaNames).toEqual(full[i].betaNames);
      lean.beta.forEach((b, k) => expect(b).toBeCloseTo(full[i].beta[k], 10));
      expect(lean.summary.logLikelihood).toBeCloseTo(full[i].summary.logLikelihood!, 8);
      expect(lean.covariance.every(Number.isNaN)).toBe(true);
      expect(lean.summary.nullDeviance).toBeNull();
      expect(lean.summary.coefficients.every((c) => c.se === null)).toBe(true);
    }
  });
});
