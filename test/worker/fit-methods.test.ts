import { describe, expect, it } from 'vitest';
import { columnFromNumbers, columnFromTexts, type DataTable } from '@shared/data/table';
import { createRng } from '@shared/demo/prng';
import { samplePoisson } from '@shared/demo/samplers';
import { fitModel } from '@shared/engine/fit';
import { parseModelSpec } from '@shared/model/spec';
import { fitGroupsOnPool } from '@shared/worker/fit-batch';
import { planGroups } from '@shared/worker/fit-groups';
import { fitMethods, type FitMethods } from '@shared/worker/fit-methods';
import { localWorker } from '@shared/worker/local-worker';
import { WorkerPool } from '@shared/worker/pool';

// The fit method through the pool: a FitOutcome (typed arrays and all)
// survives the structured-clone boundary unchanged, and the engine's
// progress reaches the caller. Seeded simulated Poisson counts.

function simulated(seed: number): DataTable {
  const rng = createRng(seed);
  const species: string[] = [];
  const effort: number[] = [];
  const count: number[] = [];
  for (const [sp, rate] of [['heron', 0.8], ['gull', 3], ['tern', 1.5]] as const) {
    for (let i = 0; i < 40; i++) {
      const e = 1 + (i % 4);
      species.push(sp);
      effort.push(e);
      count.push(samplePoisson(rng, rate * e));
    }
  }
  return { nrows: count.length, columns: [columnFromTexts('species', species), columnFromNumbers('effort', effort), columnFromNumbers('count', count)] };
}

const spec = parseModelSpec({ response: 'count', distribution: 'poisson', offsets: [{ column: 'effort', log: true }] });

describe('fitMethods over the pool', () => {
  it('a fit through a worker equals the same fit called directly, typed arrays included', async () => {
    const table = simulated(11);
    const pool = new WorkerPool<FitMethods>(() => localWorker(fitMethods), { size: 1 });
    const stages = new Set<string>();
    try {
      const viaWorker = await pool.run('fit', [table, spec], { onProgress: (_f, s) => stages.add(s) });
      const direct = fitModel(table, spec);
      expect(viaWorker.beta).toBeInstanceOf(Float64Array);
      expect(viaWorker).toEqual(direct);
      expect(stages.size).toBeGreaterThan(0);
    } finally {
      pool.dispose();
    }
  });

  it('per-group fits recover each simulated rate (log rate within 3 SE), in group order', async () => {
    const table = simulated(12);
    const pool = new WorkerPool<FitMethods>(() => localWorker(fitMethods), { size: 2 });
    const finished: string[] = [];
    try {
      const results = await fitGroupsOnPool(pool, planGroups(table, 'species').jobs, spec, { onResult: (r, done, total) => finished.push(`${r.group} ${done}/${total}`) });
      expect(results.map((r) => r.group)).toEqual(['gull', 'heron', 'tern']);
      const truth: Record<string, number> = { gull: 3, heron: 0.8, tern: 1.5 };
      for (const r of results) {
        if (!('outcome' in r)) throw new Error(r.error.message);
        const b = r.outcome.summary.coefficients[0];
        expect(Math.abs(b.estimate - Math.log(truth[r.group])), r.group).toBeLessThan(3 * b.se);
      }
      expect(finished.map((f) => f.split(' ')[1]).sort()).toEqual(['1/3', '2/3', '3/3']);
    } finally {
      pool.dispose();
    }
  });
});
