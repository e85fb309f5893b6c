import { describe, expect, it } from 'vitest';
import { workerErrorNames } from '@shared/worker/errors';
import type { CallContext } from '@shared/worker/port';
import { WorkerPool } from '@shared/worker/pool';
import { serveMethods } from '@shared/worker/serve';
import { webWorker, workerScopePort, type MessageEventSource } from '../../src-renderer/src/worker/web-worker';

// The renderer's Web Worker adapters, driven through a real MessageChannel
// (the same postMessage / message-event interface a Worker and its `self`
// have) and a bare EventTarget for the error event.

const methods = {
  scale: ([xs, k]: readonly [Float64Array, number], ctx: CallContext) => {
    ctx.onProgress(0.5, 'scaling');
    return xs.map((x) => x * k);
  },
};

describe('Web Worker adapters', () => {
  it('a call goes through webWorker and workerScopePort and comes back with its progress', async () => {
    const channel = new MessageChannel();
    let terminated = false;
    const page = Object.assign(channel.port1 as unknown as MessageEventSource, {
      terminate: () => {
        terminated = true;
        channel.port1.close();
      },
    });
    serveMethods(workerScopePort(channel.port2 as unknown as MessageEventSource), methods);
    const pool = new WorkerPool<typeof methods>(() => webWorker(page), { size: 1 });
    const stages: string[] = [];
    const out = await pool.run('scale', [Float64Array.from([1, 2, 3]), 2], { onProgress: (_f, s) => stages.push(s) });
    expect(Array.from(out)).toEqual([2, 4, 6]);
    expect(stages).toEqual(['scaling']);
    pool.dispose();
    expect(terminated).toBe(true);
    channel.port2.close();
  });

  it("a worker's error event fails the running call with WorkerCrashed and the error's message", async () => {
    class FakeWorker extends EventTarget {
      terminated = false;
      postMessage() {
        // never answers; the test raises an error event instead
      }
      terminate() {
        this.terminated = true;
      }
    }
    const fake = new FakeWorker();
    const pool = new WorkerPool<typeof methods>(() => webWorker(fake), { size: 1 });
    const p = pool.run('scale', [new Float64Array(1), 1]);
    fake.dispatchEvent(Object.assign(new Event('error'), { message: 'Uncaught RangeError: Invalid array length' }));
    await expect(p).rejects.toMatchObject({ name: workerErrorNames.crashed, message: expect.stringContaining('Invalid array length') });
    expect(fake.terminated).toBe(true);
    pool.dispose();
  });
});
