import { workerErrorNames } from '@shared/worker/errors';
import type { MessagePortLike, WorkerLike } from '@shared/worker/port';

/**
 * Web Worker adapters for the RPC layer of src-shared/worker: the page's end
 * of a Worker, and the worker's end of its global scope. Both only need
 * postMessage and message events, so a MessagePort fits as well.
 */
export interface MessageEventSource {
  postMessage(message: unknown): void;
  addEventListener(type: string, listener: (event: Event) => void): void;
  removeEventListener(type: string, listener: (event: Event) => void): void;
}

function listen(target: MessageEventSource, type: string, listener: (event: Event) => void): () => void {
  target.addEventListener(type, listener);
  return () => target.removeEventListener(type, listener);
}

function onData(target: MessageEventSource, listener: (message: unknown) => void): () => void {
  return listen(target, 'message', (e) => listener((e as MessageEvent).data));
}

/** Wraps a Worker (anything with postMessage, message/error events and terminate) for the pool. */
export function webWorker(worker: MessageEventSource & { terminate(): void }): WorkerLike {
  return {
    postMessage: (m) => worker.postMessage(m),
    onMessage: (listener) => onData(worker, listener),
    onFailure(listener) {
      const offError = listen(worker, 'error', (e) => {
        const detail = (e as ErrorEvent).message;
        listener({ name: workerErrorNames.crashed, message: `The fit worker stopped with an error${detail ? `: ${detail}` : ''}.` });
      });
      const offMessageError = listen(worker, 'messageerror', () => {
        listener({ name: workerErrorNames.crashed, message: 'The fit worker sent a message that could not be read.' });
      });
      return () => {
        offError();
        offMessageError();
      };
    },
    terminate: () => worker.terminate(),
  };
}

/** The worker's own end: its global scope (`self`) as a MessagePortLike. */
export function workerScopePort(scope: MessageEventSource): MessagePortLike {
  return {
    postMessage: (m) => scope.postMessage(m),
    onMessage: (listener) => onData(scope, listener),
  };
}
