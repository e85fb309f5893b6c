import { describe, expect, it } from 'vitest';
import { FitCancelled } from '@shared/engine/types';
import { workerErrorNames, type ErrorShape } from '@shared/worker/errors';
import { localWorker } from '@shared/worker/local-worker';
import type { CallContext, WorkerLike } from '@shared/worker/port';
import { defaultPoolSize, WorkerPool, type Settled } from '@shared/worker/pool';

// The pool's scheduling, cancel and failure handling, with in-process
// workers whose methods wait on timers (so that completion order is known).

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function makeMethods(trace: { running: number; most: number; aborted: number }) {
  return {
    /** Waits `ms`, then returns `value`; counts how many run at once. */
    wait: async ([ms, value]: readonly [number, string], ctx: CallContext) => {
      trace.running++;
      trace.most = Math.max(trace.most, trace.running);
      try {
        ctx.onProgress(0, 'waiting');
        for (let t = 0; t < ms; t += 5) {
          if (ctx.signal.aborted) {
            trace.aborted++;
            throw new FitCancelled();
          }
          await sleep(5);
        }
        return value;
      } finally {
        trace.running--;
      }
    },
    fail: ([message]: readonly [string]) => {
      throw Object.assign(new Error(message), { name: 'FitInputError' });
    },
  };
}

type Methods = ReturnType<typeof makeMethods>;

/** A factory of in-process workers that counts them and can make one die. */
function factory() {
  const trace = { running: 0, most: 0, aborted: 0 };
  const workers: { worker: WorkerLike; terminated: boolean; crash(message: string): void }[] = [];
  const create = (): WorkerLike => {
    const inner = localWorker(makeMethods(trace));
    const failures = new Set<(e: ErrorShape) => void>();
    const entry = {
      terminated: false,
      crash: (message: string) => failures.forEach((l) => l({ name: 'Error', message })),
      worker: {
        postMessage: (m: unknown) => inner.postMessage(m),
        onMessage: (l: (m: unknown) => void) => inner.onMessage(l),
        onFailure(l: (e: ErrorShape) => void) {
          failures.add(l);
          return () => failures.delete(l);
        },
        terminate() {
          entry.terminated = true;
          inner.terminate();
        },
      },
    };
    workers.push(entry);
    return entry.worker;
  };
  return { create, trace, workers };
}

describe('defaultPoolSize', () => {
  it('keeps one core for the UI thread when asked, never fewer than one worker', () => {
    expect(defaultPoolSize(8, 1)).toBe(7);
    expect(defaultPoolSize(8, 0)).toBe(8);
    expect(defaultPoolSize(1, 1)).toBe(1);
    expect(defaultPoolSize(Number.NaN, 0)).toBe(1);
  });
});

describe('WorkerPool', () => {
  it('runs at most `size` calls at once and starts workers only when needed', async () => {
    const f = factory();
    const pool = new WorkerPool<Methods>(f.create, { size: 2 });
    expect(pool.workersStarted).toBe(0);
    const all = await Promise.all(['a', 'b', 'c', 'd', 'e'].map((v) => pool.run('wait', [20, v])));
    expect(all).toEqual(['a', 'b', 'c', 'd', 'e']);
    expect(f.trace.most).toBe(2);
    expect(pool.workersStarted).toBe(2);
    pool.dispose();
  });

  it('map streams results in completion order with their index, and resolves in input order', async () => {
    const f = factory();
    const pool = new WorkerPool<Methods>(f.create, { size: 3 });
    const streamed: number[] = [];
    const progressOf = new Set<number>();
    const out = await pool.map(
      'wait',
      [
        [150, 'slow'],
        [10, 'fast'],
        [60, 'middle'],
      ],
      { onResult: (r) => streamed.push(r.index), onProgress: (i) => progressOf.add(i) },
    );
    expect(streamed).toEqual([1, 2, 0]);
    expect(out.map((r) => (r.ok ? r.value : r.error.name))).toEqual(['slow', 'fast', 'middle']);
    expect([...progressOf].sort()).toEqual([0, 1, 2]);
    pool.dispose();
  });

  it('a failed item does not stop the others; its error keeps its name', async () => {
    const f = factory();
    const pool = new WorkerPool<Methods>(f.create, { size: 2 });
    const out: Settled<string>[] = await pool.map('wait', [
      [5, 'one'],
      [5, 'two'],
    ]);
    expect(out.every((r) => r.ok)).toBe(true);
    await expect(pool.run('fail', ['all counts are zero'])).rejects.toMatchObject({ name: 'FitInputError', message: 'all counts are zero' });
    expect(await pool.run('wait', [5, 'after'])).toBe('after');
    pool.dispose();
  });

  it('cancelling a running call stops its worker, and the next call gets a new one', async () => {
    const f = factory();
    const pool = new WorkerPool<Methods>(f.create, { size: 1 });
    const ac = new AbortController();
    const p = pool.run('wait', [2000, 'never'], { signal: ac.signal });
    await sleep(20);
    ac.abort();
    await expect(p).rejects.toBeInstanceOf(FitCancelled);
    expect(f.workers[0].terminated).toBe(true);
    expect(await pool.run('wait', [5, 'next'])).toBe('next');
    expect(pool.workersStarted).toBe(2);
    pool.dispose();
  });

  it('cancelling a queued call takes it off the queue without stopping any worker', async () => {
    const f = factory();
    const pool = new WorkerPool<Methods>(f.create, { size: 1 });
    const first = pool.run('wait', [40, 'first']);
    const ac = new AbortController();
    const second = pool.run('wait', [40, 'second'], { signal: ac.signal });
    expect(pool.queued).toBe(1);
    ac.abort();
    await expect(second).rejects.toBeInstanceOf(FitCancelled);
    expect(pool.queued).toBe(0);
    expect(await first).toBe('first');
    expect(f.workers[0].terminated).toBe(false);
    expect(pool.workersStarted).toBe(1);
    pool.dispose();
  });

  it('aborting a map cancels what is left and rejects with FitCancelled', async () => {
    const f = factory();
    const pool = new WorkerPool<Methods>(f.create, { size: 2 });
    const ac = new AbortController();
    const streamed: number[] = [];
    const p = pool.map(
      'wait',
      [
        [5, 'a'],
        [2000, 'b'],
        [2000, 'c'],
        [2000, 'd'],
      ],
      { signal: ac.signal, onResult: (r) => streamed.push(r.index) },
    );
    for (let t = 0; t < 400 && streamed.length === 0; t++) await sleep(5);
    ac.abort();
    await expect(p).rejects.toBeInstanceOf(FitCancelled);
    expect(streamed).toEqual([0]);
    expect(pool.queued).toBe(0);
    expect(await pool.run('wait', [5, 'still usable'])).toBe('still usable');
    pool.dispose();
  });

  it('a worker that dies fails its call with WorkerCrashed and is replaced', async () => {
    const f = factory();
    const pool = new WorkerPool<Methods>(f.create, { size: 1 });
    const p = pool.run('wait', [2000, 'x']);
    const queued = pool.run('wait', [5, 'queued']);
    await sleep(20);
    f.workers[0].crash('out of memory');
    await expect(p).rejects.toMatchObject({ name: workerErrorNames.crashed, message: 'out of memory' });
    expect(await queued).toBe('queued');
    expect(pool.workersStarted).toBe(2);
    pool.dispose();
  });

  it('a factory that throws fails the call with its message', async () => {
    const pool = new WorkerPool<Methods>(() => {
      throw new Error('cannot start a worker: file missing');
    });
    await expect(pool.run('wait', [1, 'x'])).rejects.toThrow('file missing');
    pool.dispose();
  });

  it('dispose rejects running and queued calls with PoolDisposed and stops every worker', async () => {
    const f = factory();
    const pool = new WorkerPool<Methods>(f.create, { size: 1 });
    const running = pool.run('wait', [2000, 'r']);
    const queued = pool.run('wait', [5, 'q']);
    await sleep(10);
    pool.dispose();
    await expect(running).rejects.toMatchObject({ name: workerErrorNames.disposed });
    await expect(queued).rejects.toMatchObject({ name: workerErrorNames.disposed });
    await expect(pool.run('wait', [1, 'late'])).rejects.toMatchObject({ name: workerErrorNames.disposed });
    expect(f.workers.every((w) => w.terminated)).toBe(true);
  });
});
