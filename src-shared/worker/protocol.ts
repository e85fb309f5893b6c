import { isErrorShape, type ErrorShape } from './errors';

/**
 * The messages between a caller and a worker. Every message carries the
 * `rpc` tag so that either side ignores messages that are not its own; `id`
 * pairs a call with its progress, result or error. See docs/workers.md.
 *
 *   caller -> worker   call     { id, method, args }
 *                      cancel   { id }            (honoured between steps; a
 *                                                  synchronous fit is stopped by
 *                                                  terminating the worker)
 *   worker -> caller   progress { id, fraction, stage }   (throttled)
 *                      result   { id, value }
 *                      error    { id, error: { name, message, code? } }
 */
export const RPC_TAG = 'tallywise-rpc/1';

interface Tagged {
  rpc: typeof RPC_TAG;
  id: number;
}

export interface CallMessage extends Tagged {
  kind: 'call';
  method: string;
  args: unknown;
}

export interface CancelMessage extends Tagged {
  kind: 'cancel';
}

export interface ProgressMessage extends Tagged {
  kind: 'progress';
  fraction: number;
  stage: string;
}

export interface ResultMessage extends Tagged {
  kind: 'result';
  value: unknown;
}

export interface ErrorMessage extends Tagged {
  kind: 'error';
  error: ErrorShape;
}

export type CallerMessage = CallMessage | CancelMessage;
export type WorkerMessage = ProgressMessage | ResultMessage | ErrorMessage;

function isTagged(x: unknown): x is Tagged & { kind: unknown } {
  const m = x as Tagged | null;
  return typeof m === 'object' && m !== null && m.rpc === RPC_TAG && Number.isInteger(m.id);
}

export function isCallerMessage(x: unknown): x is CallerMessage {
  if (!isTagged(x)) return false;
  if (x.kind === 'cancel') return true;
  return x.kind === 'call' && typeof (x as CallMessage).method === 'string';
}

export function isWorkerMessage(x: unknown): x is WorkerMessage {
  if (!isTagged(x)) return false;
  if (x.kind === 'result') return true;
  if (x.kind === 'error') return isErrorShape((x as ErrorMessage).error);
  if (x.kind === 'progress') return typeof (x as ProgressMessage).fraction === 'number' && typeof (x as ProgressMessage).stage === 'string';
  return false;
}
