import { FitCancelled } from '../engine/types';
import { callOver, type RpcClient } from './call';
import { errorFromShape, toErrorShape, WorkerCallError, workerErrorNames, type ErrorShape } from './errors';
import type { ArgsOf, MethodName, MethodTable, ResultOf, WorkerFactory, WorkerLike } from './port';

/** Workers for a machine with `cores` logical cores, keeping `reserve` of them free (the UI thread). */
export function defaultPoolSize(cores: number, reserve: 0 | 1): number {
  const n = Number.isFinite(cores) ? Math.floor(cores) : 1;
  return Math.max(1, n - reserve);
}

export interface PoolOptions {
  /** Most workers at once (default 1; adapters pass defaultPoolSize of the machine). */
  size?: number;
}

export interface RunOptions {
  onProgress?: (fraction: number, stage: string) => void;
  /** Cancels the call: a queued call leaves the queue, a running one has its worker stopped and replaced. */
  signal?: AbortSignal;
}

/** One finished item of `map`: its index in the input and its value or error shape. */
export type Settled<R> = { index: number; ok: true; value: R } | { index: number; ok: false; error: ErrorShape };

export interface MapOptions<R> {
  /** Called as each item finishes, in the order they finish. */
  onResult?: (result: Settled<R>) => void;
  onProgress?: (index: number, fraction: number, stage: string) => void;
  /** Cancels every item not yet finished; `map` then rejects with FitCancelled. */
  signal?: AbortSignal;
}

interface Task {
  method: string;
  args: unknown;
  onProgress?: (fraction: number, stage: string) => void;
  settled: boolean;
  slot: Slot | null;
  resolve(value: unknown): void;
  reject(error: Error): void;
}

interface Slot {
  worker: WorkerLike | null;
  client: RpcClient<MethodTable> | null;
  offFailure: () => void;
  task: Task | null;
}

/**
 * A fixed number of workers made on demand by the factory, each running one
 * call at a time, and a first-in first-out queue of calls. A fit is a
 * synchronous loop that no message can interrupt, so cancelling a running
 * call terminates its worker; the next call gets a fresh one. A worker that
 * dies fails its call with WorkerCrashed and is replaced the same way.
 */
export class WorkerPool<M extends MethodTable> {
  readonly size: number;
  private readonly slots: Slot[];
  private readonly queue: Task[] = [];
  private disposed = false;
  private created = 0;

  constructor(
    private readonly create: WorkerFactory,
    options: PoolOptions = {},
  ) {
    this.size = Math.max(1, Math.floor(options.size ?? 1));
    this.slots = Array.from({ length: this.size }, () => ({ worker: null, client: null, offFailure: () => {}, task: null }));
  }

  /** Workers started so far (replacements included). */
  get workersStarted(): number {
    return this.created;
  }

  /** Calls waiting for a worker. */
  get queued(): number {
    return this.queue.length;
  }

  run<K extends MethodName<M>>(method: K, args: ArgsOf<M, K>, options: RunOptions = {}): Promise<ResultOf<M, K>> {
    const { signal } = options;
    if (signal?.aborted) return Promise.reject(new FitCancelled());
    const { task, promise } = this.enqueue(method, args, options.onProgress);
    if (signal) {
      const onAbort = () => this.cancel(task);
      signal.addEventListener('abort', onAbort, { once: true });
      const off = () => signal.removeEventListener('abort', onAbort);
      promise.then(off, off);
    }
    return promise as Promise<ResultOf<M, K>>;
  }

  /**
   * Runs one call per argument across the pool. Resolves with every item's
   * outcome in input order once all have finished; `onResult` streams them
   * in completion order. A failed item does not stop the others.
   */
  async map<K extends MethodName<M>>(method: K, argsList: readonly ArgsOf<M, K>[], options: MapOptions<ResultOf<M, K>> = {}): Promise<Settled<ResultOf<M, K>>[]> {
    const { signal, onResult, onProgress } = options;
    if (signal?.aborted) throw new FitCancelled();
    const tasks: Task[] = [];
    const results = new Array<Settled<ResultOf<M, K>>>(argsList.length);
    const finished = argsList.map((args, index) => {
      const { task, promise } = this.enqueue(method, args, onProgress && ((f, s) => onProgress(index, f, s)));
      tasks.push(task);
      return promise.then(
        (value): Settled<ResultOf<M, K>> => ({ index, ok: true, value: value as ResultOf<M, K> }),
        (err): Settled<ResultOf<M, K>> => ({ index, ok: false, error: toErrorShape(err) }),
      ).then((r) => {
        results[index] = r;
        if (!signal?.aborted) onResult?.(r);
      });
    });
    const onAbort = () => tasks.forEach((t) => this.cancel(t));
    signal?.addEventListener('abort', onAbort, { once: true });
    try {
      await Promise.all(finished);
    } finally {
      signal?.removeEventListener('abort', onAbort);
    }
    if (signal?.aborted) throw new FitCancelled();
    return results;
  }

  /** Stops every worker; calls not finished reject with PoolDisposed. The pool takes no more calls. */
  dispose(): void {
    if (this.disposed) return;
    this.disposed = true;
    const error = new WorkerCallError(workerErrorNames.disposed, 'The fitting was stopped before this call finished.');
    for (const task of this.queue.splice(0)) this.settle(task, null, error);
    for (const slot of this.slots) {
      if (slot.task) this.settle(slot.task, null, error);
      this.retire(slot);
    }
  }

  private enqueue(method: string, args: unknown, onProgress?: (fraction: number, stage: string) => void): { task: Task; promise: Promise<unknown> } {
    let task!: Task;
    const promise = new Promise<unknown>((resolve, reject) => {
      task = { method, args, onProgress, settled: false, slot: null, resolve, reject };
    });
    if (this.disposed) {
      this.settle(task, null, new WorkerCallError(workerErrorNames.disposed, 'The worker pool has been disposed; make a new one.'));
    } else {
      this.queue.push(task);
      this.dispatch();
    }
    return { task, promise };
  }

  private cancel(task: Task): void {
    if (task.settled) return;
    const slot = task.slot;
    if (slot) {
      this.retire(slot);
    } else {
      const at = this.queue.indexOf(task);
      if (at >= 0) this.queue.splice(at, 1);
    }
    this.settle(task, null, new FitCancelled());
    this.dispatch();
  }

  private settle(task: Task, value: unknown, error: Error | null): void {
    if (task.settled) return;
    task.settled = true;
    task.slot = null;
    if (error) task.reject(error);
    else task.resolve(value);
  }

  private dispatch(): void {
    for (const slot of this.slots) {
      if (this.disposed || this.queue.length === 0) return;
      if (slot.task) continue;
      const task = this.queue.shift()!;
      try {
        this.ensureWorker(slot);
      } catch (err) {
        this.settle(task, null, errorFromShape(toErrorShape(err)));
        continue;
      }
      this.start(slot, task);
    }
  }

  private ensureWorker(slot: Slot): void {
    if (slot.worker) return;
    const worker = this.create();
    this.created++;
    slot.worker = worker;
    slot.client = callOver<MethodTable>(worker);
    slot.offFailure = worker.onFailure((shape) => {
      const task = slot.task;
      this.retire(slot);
      if (task) this.settle(task, null, errorFromShape({ ...shape, name: workerErrorNames.crashed }));
      this.dispatch();
    });
  }

  private start(slot: Slot, task: Task): void {
    slot.task = task;
    task.slot = slot;
    const client = slot.client!;
    const done = (value: unknown, error: Error | null) => {
      if (slot.task === task) slot.task = null;
      this.settle(task, value, error);
      this.dispatch();
    };
    (client.call as (m: string, a: unknown, o: object) => Promise<unknown>)(task.method, task.args, { onProgress: task.onProgress }).then(
      (v) => done(v, null),
      (e: Error) => done(null, e),
    );
  }

  /** Stops a slot's worker and forgets it; the slot gets a new worker when next needed. */
  private retire(slot: Slot): void {
    slot.offFailure();
    slot.offFailure = () => {};
    slot.client?.close();
    slot.client?.failAll(new FitCancelled());
    try {
      slot.worker?.terminate();
    } catch {
      // already gone
    }
    slot.worker = null;
    slot.client = null;
    slot.task = null;
  }
}
