import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FitCancelled } from '@shared/engine/types';
import { workerErrorNames } from '@shared/worker/errors';
import type { CallContext } from '@shared/worker/port';
import { RPC_TAG } from '@shared/worker/protocol';
import { WorkerPool } from '@shared/worker/pool';
import { nodeWorker } from '../../bin/cli/worker/node-worker';

// Real worker_threads round trips through the Node adapter and the pool.
// The worker is a small module written here that speaks the protocol of
// src-shared/worker/protocol.ts by hand, so this also pins the wire format.

const workerSource = `
import { parentPort } from 'node:worker_threads';
const tag = ${JSON.stringify(RPC_TAG)};
const methods = {
  echo: (args) => args,
  spin: ([ms], progress) => {           // a synchronous loop, like a fit
    const end = Date.now() + ms;
    let n = 0;
    while (Date.now() < end) { if (++n % 100000 === 0) progress(0.5, 'spinning'); }
    return n;
  },
  exit: () => process.exit(3),
  throwLater: () => { setTimeout(() => { throw new Error('boom'); }, 0); return new Promise(() => {}); },
};
parentPort.on('message', async (m) => {
  if (!m || m.rpc !== tag || m.kind !== 'call') return;
  const progress = (fraction, stage) => parentPort.postMessage({ rpc: tag, kind: 'progress', id: m.id, fraction, stage });
  try {
    const value = await methods[m.method](m.args, progress);
    parentPort.postMessage({ rpc: tag, kind: 'result', id: m.id, value });
  } catch (e) {
    parentPort.postMessage({ rpc: tag, kind: 'error', id: m.id, error: { name: e.name, message: e.message } });
  }
});
`;

type Methods = {
  echo: (args: readonly [string, Float64Array], ctx: CallContext) => readonly [string, Float64Array];
  spin: (args: readonly [number], ctx: CallContext) => number;
  exit: (args: readonly [], ctx: CallContext) => never;
  throwLater: (args: readonly [], ctx: CallContext) => Promise<never>;
};

let dir = '';
let file = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'tw-worker-'));
  file = join(dir, 'protocol-worker.mjs');
  writeFileSync(file, workerSource);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('worker_threads through the pool', () => {
  it('round trip: arguments and typed arrays come back intact', async () => {
    const pool = new WorkerPool<Methods>(() => nodeWorker(file), { size: 1 });
    try {
      const [s, xs] = await pool.run('echo', ['heron', Float64Array.from([0.5, 2, Number.NaN])]);
      expect(s).toBe('heron');
      expect(xs).toBeInstanceOf(Float64Array);
      expect(Array.from(xs)).toEqual([0.5, 2, Number.NaN]);
    } finally {
      pool.dispose();
    }
  });

  it('a busy synchronous call reports progress and is cancelled by terminating its thread', async () => {
    const pool = new WorkerPool<Methods>(() => nodeWorker(file), { size: 1 });
    try {
      const ac = new AbortController();
      const stages: string[] = [];
      const started = Date.now();
      const p = pool.run('spin', [20_000], { signal: ac.signal, onProgress: (_f, s) => stages.push(s) });
      // wait for the first progress message, then cancel
      while (stages.length === 0 && Date.now() - started < 10_000) await new Promise((r) => setTimeout(r, 10));
      ac.abort();
      await expect(p).rejects.toBeInstanceOf(FitCancelled);
      expect(Date.now() - started).toBeLessThan(15_000);
      expect(stages[0]).toBe('spinning');
      expect(await pool.run('spin', [1])).toBeGreaterThanOrEqual(0);
      expect(pool.workersStarted).toBe(2);
    } finally {
      pool.dispose();
    }
  });

  it('a thread that exits fails its call with WorkerCrashed naming the exit code; the pool goes on', async () => {
    const pool = new WorkerPool<Methods>(() => nodeWorker(file), { size: 1 });
    try {
      await expect(pool.run('exit', [])).rejects.toMatchObject({ name: workerErrorNames.crashed, message: expect.stringContaining('exit code 3') });
      await expect(pool.run('throwLater', [])).rejects.toMatchObject({ name: workerErrorNames.crashed, message: expect.stringContaining('boom') });
      const [s] = await pool.run('echo', ['after', new Float64Array(0)]);
      expect(s).toBe('after');
    } finally {
      pool.dispose();
    }
  });
});
