import { Worker, type MessagePort } from 'node:worker_threads';
import { workerErrorNames, type ErrorShape } from '@shared/worker/errors';
import type { MessagePortLike, WorkerLike } from '@shared/worker/port';

/**
 * worker_threads adapters for the RPC layer of src-shared/worker: the
 * caller's end of a Worker, and the worker's end of its parent port.
 */

/** Starts a worker thread from a module file and wraps it for the pool. */
export function nodeWorker(file: string | URL): WorkerLike {
  const worker = new Worker(file);
  return {
    postMessage: (m) => worker.postMessage(m),
    onMessage(listener) {
      worker.on('message', listener);
      return () => worker.off('message', listener);
    },
    onFailure(listener) {
      const crashed = (message: string): ErrorShape => ({ name: workerErrorNames.crashed, message });
      const onError = (e: Error) => listener(crashed(`A fit worker thread stopped with an error: ${e.message}`));
      const onExit = (code: number) => listener(crashed(`A fit worker thread ended unexpectedly (exit code ${code}).`));
      const onMessageError = () => listener(crashed('A fit worker thread sent a message that could not be read.'));
      worker.on('error', onError);
      worker.on('exit', onExit);
      worker.on('messageerror', onMessageError);
      return () => {
        worker.off('error', onError);
        worker.off('exit', onExit);
        worker.off('messageerror', onMessageError);
      };
    },
    terminate() {
      void worker.terminate();
    },
  };
}

/** The worker thread's end: its parent port as a MessagePortLike. */
export function parentPortAsPort(port: MessagePort): MessagePortLike {
  return {
    postMessage: (m) => port.postMessage(m),
    onMessage(listener) {
      port.on('message', listener);
      return () => port.off('message', listener);
    },
  };
}
