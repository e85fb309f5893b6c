import type { ErrorShape } from './errors';

/**
 * The two transports the RPC layer runs over, reduced to what it needs.
 * Adapters wrap a Web Worker (src-renderer/src/worker), a worker_threads
 * Worker (bin/cli/worker) or an in-process channel (./local-worker.ts).
 */
export interface MessagePortLike {
  /** Sends a message (copied by structured clone). */
  postMessage(message: unknown): void;
  /** Subscribes to incoming messages; returns the unsubscribe function. */
  onMessage(listener: (message: unknown) => void): () => void;
}

/** The caller's end of one worker: a port it can also stop. */
export interface WorkerLike extends MessagePortLike {
  /** Stops the worker at once, whatever it is running. */
  terminate(): void;
  /** Subscribes to the worker failing on its own (uncaught error, exit, unreadable message). */
  onFailure(listener: (error: ErrorShape) => void): () => void;
}

export type WorkerFactory = () => WorkerLike;

/** What a method sees besides its arguments; it fits where the engine takes a FitControl. */
export interface CallContext {
  /** Reports a fraction done (0..1) and a stage name; the worker throttles what it sends. */
  onProgress(fraction: number, stage: string): void;
  /** Set when the caller sent a cancel message (seen between steps of an asynchronous method). */
  readonly signal: { readonly aborted: boolean };
}

/** A method a worker serves: one argument (a tuple for several) and the call context. */
export type WorkerMethod = (args: never, ctx: CallContext) => unknown;
export type MethodTable = { readonly [name: string]: WorkerMethod };

export type MethodName<M extends MethodTable> = keyof M & string;
export type ArgsOf<M extends MethodTable, K extends MethodName<M>> = M[K] extends (args: infer A, ctx: CallContext) => unknown ? A : never;
export type ResultOf<M extends MethodTable, K extends MethodName<M>> = M[K] extends (args: never, ctx: CallContext) => infer R ? Awaited<R> : never;

/** What a caller may pass with a call. */
export interface CallOptions {
  onProgress?: (fraction: number, stage: string) => void;
  signal?: AbortSignal;
}
