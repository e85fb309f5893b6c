import { describe, expect, it } from 'vitest';
import type { DataTable } from '@shared/data/table';
import { columnFromTexts } from '@shared/data/table';
import { parseModelSpec } from '@shared/model/spec';
import { reportFitMethods } from '@shared/report/fit-worker-methods';
import { splitBy } from '@shared/data/table';
import { buildProgrammeReport, type ProgrammePlan, type ProgrammeProgress } from '@shared/report/programme-report';
import { compositeTrend } from '@shared/trend/composite';
import { inThreadRunner } from '@shared/trend/fit-runner';
import { poolRunner, servesReplicates } from '@shared/trend/pool-runner';
import { simulateProgramme } from '@shared/trend/power-simulation';
import { localWorker } from '@shared/worker/local-worker';
import { WorkerPool } from '@shared/worker/pool';

// The composite's bootstrap runs three ways: whole replicates in this thread
// (no runner), separate species refits on a FitRunner, and whole replicates
// in pool workers. The same seed must give the same draws, so the same
// numbers every way: exactly for whole replicates (here and in workers);
// the separate refits start from scratch with full inference, so they
// reach the same optimum up to optimiser noise (1e-6 relative). Seeded simulation (invented): two species on 16 sites.
function twoSpecies(): DataTable {
  const parts = [
    { key: 'A', meanCount: 6, annualChange: -0.06, seed: 21 },
    { key: 'B', meanCount: 4, annualChange: 0.02, seed: 22 },
  ].map((p) => ({ key: p.key, t: simulateProgramme({ sites: 16, seasons: 5, visits: 2, meanCount: p.meanCount, theta: 3, siteSd: 0.4, annualChange: p.annualChange, alpha: 0.05 }, p.seed) }));
  const columns = parts[0].t.columns.map((c, j) => columnFromTexts(c.name, parts.flatMap((p) => p.t.columns[j].texts)));
  const species = columnFromTexts('species', parts.flatMap((p) => Array<string>(p.t.nrows).fill(p.key)));
  return { nrows: species.texts.length, columns: [...columns, species] };
}
const spec = parseModelSpec({ response: 'count', distribution: 'negbin', site: { column: 'site', effect: 'fixed' }, time: { column: 'season', trend: 'annual' } });
const poisson = parseModelSpec({ ...spec, distribution: 'poisson' });

describe('composite bootstrap runners', () => {
  const table = twoSpecies();
  const options = { replicates: 24, seed: 5, specs: { B: poisson } };

  it('gives the same index and limits in this thread, as separate refits and as whole replicates in workers', async () => {
    const here = await compositeTrend(table, spec, 'species', options);
    const separate = await compositeTrend(table, spec, 'species', { ...options, runner: inThreadRunner });
    const pool = servesReplicates(new WorkerPool(() => localWorker(reportFitMethods), { size: 2 }));
    const done: number[] = [];
    try {
      const whole = await compositeTrend(table, spec, 'species', { ...options, runner: poolRunner(pool), onProgress: (d, n, stage) => stage === 'bootstrap refits' && done.push(d / n) });
      expect({ ...separate.composite, indices: [] }).toEqual({ ...here.composite, indices: [] });
      separate.composite.indices.forEach((r, i) => {
        const h = here.composite.indices[i];
        expect(r.time).toBe(h.time);
        for (const k of ['index', 'lower', 'upper'] as const) expect(Math.abs(r[k] - h[k])).toBeLessThan(1e-6 * h[k]);
      });
      expect(whole.composite).toEqual(here.composite);
    } finally {
      pool.dispose();
    }
    expect(here.composite.failedReplicates).toBe(0);
    expect(done.at(-1)).toBe(1);
    // The limits are those of draws, not the point itself.
    expect(here.composite.indices.some((r) => r.lower < r.index && r.upper > r.index)).toBe(true);
  });

  it('a pool that is not marked runs the refits one fit per call', async () => {
    const pool = new WorkerPool(() => localWorker(reportFitMethods), { size: 1 });
    try {
      expect(poolRunner(pool).replicates).toBeUndefined();
      expect(poolRunner(servesReplicates(pool)).groupSteps).toBeDefined();
    } finally {
      pool.dispose();
    }
  });

  it('a programme report with its group steps and replicates on pool workers equals the one made in this thread, progress in order', async () => {
    const plan: ProgrammePlan = {
      title: 'Two species',
      groupColumn: 'species',
      groups: splitBy(table, 'species').map((g) => ({ group: g.key, table: g.table, spec: g.key === 'B' ? poisson : spec, others: [{ label: 'Poisson', spec: poisson }] })),
      compositeTable: table,
      replicates: 20,
      seed: 3,
      provenance: { software: { name: 'Tallywise', version: 'test' }, inputs: [], seeds: [], createdAt: '2026-12-02T00:00:00Z' },
    };
    const here = await buildProgrammeReport(plan);
    const pool = servesReplicates(new WorkerPool(() => localWorker(reportFitMethods), { size: 2 }));
    const steps: ProgrammeProgress[] = [];
    try {
      const onPool = await buildProgrammeReport(plan, { runner: poolRunner(pool), onProgress: (p) => steps.push(p) });
      expect(onPool.sheets).toEqual(here.sheets);
      expect(onPool.sections).toEqual(here.sections);
    } finally {
      pool.dispose();
    }
    expect([...new Set(steps.map((s) => s.group).filter(Boolean))]).toEqual(['A', 'B', 'composite index']);
    for (let i = 1; i < steps.length; i++) expect(steps[i].done).toBeGreaterThanOrEqual(steps[i - 1].done);
  });
});
