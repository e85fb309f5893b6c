import { FitCancelled } from '../engine/types';
import { errorFromShape } from './errors';
import type { ArgsOf, CallOptions, MessagePortLike, MethodName, MethodTable, ResultOf } from './port';
import { isWorkerMessage, RPC_TAG, type CallerMessage } from './protocol';

/** The caller side of one port: typed calls by method name. */
export interface RpcClient<M extends MethodTable> {
  /**
   * Calls a method; resolves with its result or rejects with the error
   * rebuilt from its shape (FitCancelled when cancelled). Aborting the
   * signal sends a cancel message and rejects at once.
   */
  call<K extends MethodName<M>>(method: K, args: ArgsOf<M, K>, options?: CallOptions): Promise<ResultOf<M, K>>;
  /** Rejects every call still waiting with this error (the worker was stopped or died). */
  failAll(error: Error): void;
  /** Calls sent and not yet answered. */
  readonly pending: number;
  /** Stops listening; later answers are ignored. */
  close(): void;
}

interface Waiting {
  resolve(value: unknown): void;
  reject(error: Error): void;
  onProgress?: (fraction: number, stage: string) => void;
}

export function callOver<M extends MethodTable>(port: MessagePortLike): RpcClient<M> {
  const waiting = new Map<number, Waiting>();
  let nextId = 1;

  const unsubscribe = port.onMessage((message) => {
    if (!isWorkerMessage(message)) return;
    const w = waiting.get(message.id);
    if (!w) return; // answered, cancelled or not ours
    if (message.kind === 'progress') {
      w.onProgress?.(message.fraction, message.stage);
      return;
    }
    waiting.delete(message.id);
    if (message.kind === 'result') w.resolve(message.value);
    else w.reject(errorFromShape(message.error));
  });

  return {
    call<K extends MethodName<M>>(method: K, args: ArgsOf<M, K>, options: CallOptions = {}): Promise<ResultOf<M, K>> {
      const { signal, onProgress } = options;
      if (signal?.aborted) return Promise.reject(new FitCancelled());
      const id = nextId++;
      return new Promise<ResultOf<M, K>>((resolve, reject) => {
        const onAbort = () => {
          if (!waiting.delete(id)) return;
          port.postMessage({ rpc: RPC_TAG, kind: 'cancel', id } satisfies CallerMessage);
          reject(new FitCancelled());
        };
        const done = () => signal?.removeEventListener('abort', onAbort);
        waiting.set(id, {
          resolve: (v) => (done(), resolve(v as ResultOf<M, K>)),
          reject: (e) => (done(), reject(e)),
          onProgress,
        });
        signal?.addEventListener('abort', onAbort, { once: true });
        try {
          port.postMessage({ rpc: RPC_TAG, kind: 'call', id, method, args } satisfies CallerMessage);
        } catch (err) {
          waiting.delete(id);
          done();
          reject(err instanceof Error ? err : new Error(String(err)));
        }
      });
    },
    failAll(error: Error) {
      const all = [...waiting.values()];
      waiting.clear();
      for (const w of all) w.reject(error);
    },
    get pending() {
      return waiting.size;
    },
    close() {
      unsubscribe();
    },
  };
}
