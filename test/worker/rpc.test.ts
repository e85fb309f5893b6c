import { describe, expect, it } from 'vitest';
import { FitCancelled, FitInputError } from '@shared/engine/types';
import { callOver } from '@shared/worker/call';
import { WorkerCallError, workerErrorNames } from '@shared/worker/errors';
import { localChannel } from '@shared/worker/local-worker';
import type { CallContext } from '@shared/worker/port';
import { RPC_TAG } from '@shared/worker/protocol';
import { serveMethods } from '@shared/worker/serve';

// The request/answer protocol of src-shared/worker over an in-process
// channel that copies messages with structuredClone, as a real port does.

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function setup(options: Parameters<typeof serveMethods>[2] = {}) {
  const methods = {
    sum: ([xs]: readonly [Float64Array]) => xs.reduce((a, b) => a + b, 0),
    mutate: ([xs]: readonly [Float64Array]) => {
      xs[0] = 99;
      return xs;
    },
    badInput: () => {
      throw new FitInputError('negative-count', 'Rows 3 and 7 have a negative count in "count". Counts must be 0 or more.');
    },
    plainError: () => {
      throw new Error('something broke');
    },
    cancelled: () => {
      throw new FitCancelled();
    },
    uncloneable: () => ({ f: () => 1 }),
    /** Reports progress at given clock ticks. */
    steps: ([n]: readonly [number], ctx: CallContext) => {
      for (let i = 0; i < n; i++) ctx.onProgress(i / n, `step ${i}`);
      return n;
    },
    /** Waits until cancelled (or 2 s), then says what it saw. */
    waitForCancel: async (_args: readonly [], ctx: CallContext) => {
      for (let i = 0; i < 200 && !ctx.signal.aborted; i++) await sleep(10);
      seen.aborted = ctx.signal.aborted;
      return 'finished';
    },
  };
  const seen = { aborted: false };
  const [callerEnd, workerEnd] = localChannel();
  const served = serveMethods(workerEnd, methods, options);
  const client = callOver<typeof methods>(callerEnd);
  return { client, served, seen, callerEnd, workerEnd };
}

describe('serveMethods and callOver', () => {
  it('returns a result, with the arguments copied and not shared', async () => {
    const { client } = setup();
    const xs = Float64Array.from([1, 2, 3.5]);
    expect(await client.call('sum', [xs])).toBe(6.5);
    const back = await client.call('mutate', [xs]);
    expect(back[0]).toBe(99);
    expect(xs[0]).toBe(1);
    expect(client.pending).toBe(0);
  });

  it('an engine error crosses with its name, message and code', async () => {
    const { client } = setup();
    const err = await client.call('badInput', [] as never).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(WorkerCallError);
    expect(err).toMatchObject({ name: 'FitInputError', code: 'negative-count', message: expect.stringContaining('Rows 3 and 7') });
  });

  it('a plain Error gets the stable name WorkerFailure; a cancelled fit comes back as FitCancelled', async () => {
    const { client } = setup();
    await expect(client.call('plainError', [] as never)).rejects.toMatchObject({ name: workerErrorNames.failure, message: 'something broke' });
    await expect(client.call('cancelled', [] as never)).rejects.toBeInstanceOf(FitCancelled);
  });

  it('an unknown method is refused by name, listing the methods served', async () => {
    const { client } = setup();
    const c = client.call as (m: string, a: unknown) => Promise<unknown>;
    await expect(c('nope', [])).rejects.toMatchObject({ name: workerErrorNames.unknownMethod, message: expect.stringContaining('"nope"') });
    await expect(c('nope', [])).rejects.toMatchObject({ message: expect.stringContaining('sum') });
  });

  it('a result that cannot be copied is reported as NotCloneable', async () => {
    const { client } = setup();
    await expect(client.call('uncloneable', [] as never)).rejects.toMatchObject({ name: workerErrorNames.notCloneable });
  });

  it('progress is throttled to one message per interval', async () => {
    let t = 0;
    // each call of the clock advances it 30 ms; with a 100 ms interval
    // steps 0, 4 and 8 of 10 are sent (at 30, 150 and 270 ms)
    const { client } = setup({ progressIntervalMs: 100, now: () => (t += 30) });
    const got: string[] = [];
    expect(await client.call('steps', [10], { onProgress: (f, s) => got.push(`${f}:${s}`) })).toBe(10);
    expect(got).toEqual(['0:step 0', '0.4:step 4', '0.8:step 8']);
  });

  it('aborting sends a cancel the method sees, and the call rejects at once', async () => {
    const { client, seen } = setup();
    const ac = new AbortController();
    const p = client.call('waitForCancel', [], { signal: ac.signal });
    await sleep(30);
    ac.abort();
    await expect(p).rejects.toBeInstanceOf(FitCancelled);
    for (let t = 0; t < 200 && !seen.aborted; t++) await sleep(10);
    expect(seen.aborted).toBe(true);
    expect(client.pending).toBe(0);
  });

  it('an already aborted signal rejects without sending anything', async () => {
    const { client, workerEnd } = setup();
    const sent: unknown[] = [];
    workerEnd.onMessage((m) => sent.push(m));
    await expect(client.call('sum', [new Float64Array(1)], { signal: AbortSignal.abort() })).rejects.toBeInstanceOf(FitCancelled);
    await sleep(10);
    expect(sent).toEqual([]);
  });

  it('ignores messages that are not of the protocol, on both sides', async () => {
    const { client, callerEnd, workerEnd } = setup();
    const answers: unknown[] = [];
    callerEnd.onMessage((m) => answers.push(m));
    callerEnd.postMessage({ hello: 'world' });
    callerEnd.postMessage({ rpc: 'other/1', kind: 'call', id: 1, method: 'sum', args: [[1]] });
    workerEnd.postMessage({ rpc: RPC_TAG, kind: 'result', id: 12345, value: 1 });
    await sleep(20);
    expect(answers).toEqual([{ rpc: RPC_TAG, kind: 'result', id: 12345, value: 1 }]);
    expect(await client.call('sum', [Float64Array.from([2, 2])])).toBe(4);
  });

  it('failAll rejects what is waiting; close stops the worker side answering', async () => {
    const { client, served } = setup();
    const p = client.call('waitForCancel', []);
    client.failAll(new Error('stopped'));
    await expect(p).rejects.toThrow('stopped');
    served.close();
    const late = client.call('sum', [Float64Array.from([1])]);
    const outcome = await Promise.race([late.then(() => 'answered'), sleep(50).then(() => 'silent')]);
    expect(outcome).toBe('silent');
  });
});
