import type { MessagePortLike, MethodTable, WorkerLike } from './port';
import { serveMethods, type ServeOptions } from './serve';

/**
 * Two connected in-process ports. Messages are copied with structuredClone
 * (so what cannot cross a real worker boundary fails here too) and
 * delivered on a later turn of the event loop, as a real port does.
 */
export function localChannel(): [MessagePortLike, MessagePortLike] {
  const listeners: [Set<(m: unknown) => void>, Set<(m: unknown) => void>] = [new Set(), new Set()];
  const end = (mine: 0 | 1): MessagePortLike => ({
    postMessage(message) {
      const copy = structuredClone(message);
      const theirs = listeners[1 - mine];
      setTimeout(() => {
        for (const l of [...theirs]) l(copy);
      }, 0);
    },
    onMessage(listener) {
      listeners[mine].add(listener);
      return () => listeners[mine].delete(listener);
    },
  });
  return [end(0), end(1)];
}

/**
 * A "worker" that serves the methods in this thread: the pool's fallback
 * where no worker thread can be started (`--jobs 0`, tests). Terminating it
 * cuts the channel and marks running calls as cancelled; a synchronous
 * method already running still runs to its end, unseen.
 */
export function localWorker(methods: MethodTable, options: ServeOptions = {}): WorkerLike {
  const [callerEnd, workerEnd] = localChannel();
  const served = serveMethods(workerEnd, methods, options);
  let alive = true;
  const offs = new Set<() => void>();
  return {
    postMessage(message) {
      if (alive) callerEnd.postMessage(message);
    },
    onMessage(listener) {
      const off = callerEnd.onMessage((m) => {
        if (alive) listener(m);
      });
      offs.add(off);
      return () => {
        offs.delete(off);
        off();
      };
    },
    onFailure() {
      return () => {};
    },
    terminate() {
      alive = false;
      served.close();
      for (const off of offs) off();
      offs.clear();
    },
  };
}
