/**
 * Ctrl-C in the command line: SIGINT aborts the running work, which then
 * stops with FitCancelled; the command prints what was and was not done and
 * exits 130 (128 + the signal's number 2: common practice for shells).
 */
import { describe, expect, it } from 'vitest';
import { FitCancelled } from '@shared/engine/types';
import { interruptible } from '../../bin/cli/interrupt';

function capture() {
  const err: string[] = [];
  return { io: { out: () => undefined, err: (s: string) => err.push(s) }, err };
}

/** Work that waits until its signal is aborted, then stops as the engine does. */
const untilAborted = (signal: AbortSignal) =>
  new Promise<number>((_, reject) => signal.addEventListener('abort', () => reject(new FitCancelled()), { once: true }));

describe('interruptible', () => {
  it('turns SIGINT into an abort, prints the stop message and returns 130', async () => {
    const { io, err } = capture();
    const before = process.listenerCount('SIGINT');
    const run = interruptible(io, () => 'Stopped: nothing was written.', untilAborted);
    expect(process.listenerCount('SIGINT')).toBe(before + 1);
    process.emit('SIGINT', 'SIGINT');
    await expect(run).resolves.toBe(130);
    expect(err).toEqual(['Stopped: nothing was written.']);
    expect(process.listenerCount('SIGINT')).toBe(before);
  });

  it('passes the work\'s own exit status and errors through, and lets go of SIGINT either way', async () => {
    const { io, err } = capture();
    const before = process.listenerCount('SIGINT');
    await expect(interruptible(io, () => 'never', async () => 1)).resolves.toBe(1);
    await expect(interruptible(io, () => 'never', async () => { throw new Error('disk full'); })).rejects.toThrow('disk full');
    expect(err).toEqual([]);
    expect(process.listenerCount('SIGINT')).toBe(before);
  });

  it('reads the stop message when it stops, so it can count what was done by then', async () => {
    const { io, err } = capture();
    let done = 0;
    const run = interruptible(io, () => `Stopped after ${done} of 3 groups.`, (signal) => {
      done = 2;
      return untilAborted(signal);
    });
    process.emit('SIGINT', 'SIGINT');
    await run;
    expect(err).toEqual(['Stopped after 2 of 3 groups.']);
  });
});
