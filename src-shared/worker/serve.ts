import { toErrorShape, workerErrorNames, type ErrorShape } from './errors';
import type { MessagePortLike, MethodTable } from './port';
import { isCallerMessage, RPC_TAG, type CallMessage, type WorkerMessage } from './protocol';

export interface ServeOptions {
  /** Least time between two progress messages of one call (default 100 ms). */
  progressIntervalMs?: number;
  /** Clock in milliseconds (tests pass their own). */
  now?: () => number;
}

export interface Served {
  /** Stops answering: unsubscribes and marks every running call as cancelled. */
  close(): void;
}

/**
 * The worker side: answers call messages on `port` with the methods of the
 * table. A method may be synchronous (a fit) or return a promise. Whatever
 * it throws goes back as an error shape; progress from its context is sent
 * at most once per interval.
 */
export function serveMethods(port: MessagePortLike, methods: MethodTable, options: ServeOptions = {}): Served {
  const interval = options.progressIntervalMs ?? 100;
  const now = options.now ?? (() => Date.now());
  const running = new Map<number, { aborted: boolean }>();
  let closed = false;

  const send = (message: WorkerMessage): void => {
    if (closed) return;
    try {
      port.postMessage(message);
    } catch (err) {
      // Only a result can hold something that will not clone; say so in its place.
      const error: ErrorShape = {
        name: workerErrorNames.notCloneable,
        message: `The worker could not send back the result of call ${message.id} (${toErrorShape(err).message}).`,
      };
      port.postMessage({ rpc: RPC_TAG, kind: 'error', id: message.id, error } satisfies WorkerMessage);
    }
  };

  const answer = async (call: CallMessage): Promise<void> => {
    const signal = { aborted: false };
    running.set(call.id, signal);
    let last = -Infinity;
    const ctx = {
      signal,
      onProgress(fraction: number, stage: string) {
        if (!Number.isFinite(fraction) || signal.aborted) return;
        const t = now();
        if (t - last < interval) return;
        last = t;
        send({ rpc: RPC_TAG, kind: 'progress', id: call.id, fraction: Math.min(1, Math.max(0, fraction)), stage: String(stage) });
      },
    };
    try {
      if (!Object.hasOwn(methods, call.method)) {
        const known = Object.keys(methods).join(', ');
        throw Object.assign(new Error(`The worker has no method "${call.method}"; it serves: ${known}.`), { name: workerErrorNames.unknownMethod });
      }
      const method = methods[call.method] as (args: unknown, c: typeof ctx) => unknown;
      const value = await method(call.args, ctx);
      send({ rpc: RPC_TAG, kind: 'result', id: call.id, value });
    } catch (err) {
      send({ rpc: RPC_TAG, kind: 'error', id: call.id, error: toErrorShape(err) });
    } finally {
      running.delete(call.id);
    }
  };

  const unsubscribe = port.onMessage((message) => {
    if (closed || !isCallerMessage(message)) return;
    if (message.kind === 'cancel') {
      const signal = running.get(message.id);
      if (signal) signal.aborted = true;
      return;
    }
    void answer(message);
  });

  return {
    close() {
      closed = true;
      unsubscribe();
      for (const signal of running.values()) signal.aborted = true;
      running.clear();
    },
  };
}
