import { FitCancelled } from '@shared/engine/types';
import type { CliIO } from './command';

/** Exit status of a run stopped by Ctrl-C (128 + SIGINT's number, as shells report it). */
export const INTERRUPTED = 130;

/**
 * Runs a command's long work with Ctrl-C (SIGINT) wired to an abort signal
 * for as long as it runs. When the work stops because of that signal (it
 * throws FitCancelled), prints `stopped()` — which says what was and was not
 * printed or written — and returns 130; any other error goes on up.
 */
export async function interruptible(io: CliIO, stopped: () => string, work: (signal: AbortSignal) => Promise<number>): Promise<number> {
  const stop = new AbortController();
  const onInterrupt = () => stop.abort();
  process.once('SIGINT', onInterrupt);
  try {
    return await work(stop.signal);
  } catch (err) {
    if (!(err instanceof FitCancelled)) throw err;
    io.err(stopped());
    return INTERRUPTED;
  } finally {
    process.off('SIGINT', onInterrupt);
  }
}
