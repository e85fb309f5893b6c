import { afterEach, describe, expect, it, vi } from 'vitest';
import { columnFromNumbers, columnFromTexts, type DataTable } from '@shared/data/table';
import { FitCancelled } from '@shared/engine/types';
import { parseModelSpec } from '@shared/model/spec';
import { fitMethods } from '@shared/worker/fit-methods';
import { serveMethods } from '@shared/worker/serve';
import { workerScopePort, type MessageEventSource } from '../../src-renderer/src/worker/web-worker';

// The page's fit client, with the browser's Worker stood in by a class that
// serves the fit methods over a MessageChannel (Node has no Web Worker).
// Checks the worker is started as a module from fit.worker.ts, that fits and
// group fits come back, and that cancel and stop terminate workers.

const started: { url: string; options: WorkerOptions | undefined; terminated: boolean }[] = [];

class StandInWorker extends EventTarget {
  private readonly channel = new MessageChannel();
  private readonly record: (typeof started)[number];
  constructor(url: URL, options?: WorkerOptions) {
    super();
    this.record = { url: String(url), options, terminated: false };
    started.push(this.record);
    serveMethods(workerScopePort(this.channel.port2 as unknown as MessageEventSource), fitMethods);
    this.channel.port1.addEventListener('message', (e) => this.dispatchEvent(new MessageEvent('message', { data: (e as MessageEvent).data })));
    this.channel.port1.start();
  }
  postMessage(message: unknown) {
    this.channel.port1.postMessage(message);
  }
  terminate() {
    this.record.terminated = true;
    this.channel.port1.close();
    this.channel.port2.close();
  }
}

const table: DataTable = {
  nrows: 8,
  columns: [columnFromNumbers('count', [3, 5, 2, 8, 9, 1, 7, 5]), columnFromTexts('species', ['a', 'a', 'a', 'a', 'b', 'b', 'b', 'b'])],
};
const spec = parseModelSpec({ response: 'count', distribution: 'poisson' });

afterEach(() => {
  vi.unstubAllGlobals();
  started.length = 0;
});

async function client() {
  vi.stubGlobal('Worker', StandInWorker);
  vi.stubGlobal('navigator', { hardwareConcurrency: 3 });
  vi.resetModules();
  return import('../../src-renderer/src/worker/fit-client');
}

describe('fit-client', () => {
  it('fits in a module worker started from fit.worker.ts; group fits give each group its own fit', async () => {
    const c = await client();
    try {
      const outcome = await c.fitInWorker(table, spec);
      // intercept-only Poisson: the estimate is log(mean count) = log(40 / 8) (common practice)
      expect(outcome.summary.coefficients[0].estimate).toBeCloseTo(Math.log(5), 7);
      expect(started[0].url).toMatch(/\/fit\.worker\.ts$/);
      expect(started[0].options?.type).toBe('module');
      const groups = await c.fitGroupsInWorkers(table, spec, 'species');
      expect(groups.map((g) => [g.group, 'outcome' in g ? g.outcome.summary.coefficients[0].estimate : NaN])).toEqual([
        ['a', Math.log(18 / 4)],
        ['b', Math.log(22 / 4)],
      ].map(([g, v]) => [g, expect.closeTo(v as number, 7)]));
      // three cores: two workers, one core kept for the page
      expect(started.length).toBe(2);
    } finally {
      c.stopFitWorkers();
    }
    expect(started.every((w) => w.terminated)).toBe(true);
  });

  it('an aborted fit rejects with FitCancelled', async () => {
    const c = await client();
    try {
      const ac = new AbortController();
      const p = c.fitInWorker(table, spec, { signal: ac.signal });
      ac.abort();
      // (the client was imported afresh, so its FitCancelled class is not this file's; compare the name)
      await expect(p).rejects.toMatchObject({ name: new FitCancelled().name });
      expect(started[0]?.terminated).toBe(true);
    } finally {
      c.stopFitWorkers();
    }
  });
});
