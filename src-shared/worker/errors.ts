import { FitCancelled } from '../engine/types';

/**
 * An error as it crosses a worker boundary: a stable `name` callers can
 * branch on and a plain message. Engine errors keep their own names
 * (FitInputError, SpecError, TableError, FitCancelled); the names below are
 * the ones the worker layer itself produces.
 */
export interface ErrorShape {
  name: string;
  message: string;
  /** The engine's error code when the error had one (FitInputError, TableError). */
  code?: string;
  /** 0-based table rows the error is about, when the engine named some (FitInputError). */
  rows?: number[];
}

export const workerErrorNames = {
  /** The call was cancelled (the same name the engine's FitCancelled carries). */
  cancelled: 'FitCancelled',
  /** The worker thread died while running the call (uncaught error, exit, unreadable message). */
  crashed: 'WorkerCrashed',
  /** No method of that name is served. */
  unknownMethod: 'UnknownMethod',
  /** The result could not be copied across (a function or other uncloneable value in it). */
  notCloneable: 'NotCloneable',
  /** The pool was disposed before the call finished. */
  disposed: 'PoolDisposed',
  /** Any other failure without a name of its own. */
  failure: 'WorkerFailure',
} as const;

/** An error rebuilt on the calling side from an ErrorShape: same name, message and code. */
export class WorkerCallError extends Error {
  readonly code?: string;
  readonly rows?: readonly number[];
  constructor(name: string, message: string, code?: string, rows?: readonly number[]) {
    super(message);
    this.name = name;
    if (code !== undefined) this.code = code;
    if (rows !== undefined) this.rows = rows;
  }
}

/** Turns anything thrown into an ErrorShape; a plain `Error` gets the name WorkerFailure. */
export function toErrorShape(err: unknown): ErrorShape {
  const e = err as { name?: unknown; message?: unknown; code?: unknown } | null;
  const name = typeof e?.name === 'string' && e.name !== '' && e.name !== 'Error' ? e.name : workerErrorNames.failure;
  const message = typeof e?.message === 'string' && e.message !== '' ? e.message : String(err);
  const shape: ErrorShape = { name, message };
  if (typeof e?.code === 'string') shape.code = e.code;
  const rows = (err as { rows?: unknown } | null)?.rows;
  if (Array.isArray(rows) && rows.length > 0 && rows.every((r) => Number.isInteger(r))) shape.rows = [...rows];
  return shape;
}

/** Rebuilds an Error from its shape; a cancelled call becomes the engine's FitCancelled. */
export function errorFromShape(shape: ErrorShape): Error {
  if (shape.name === workerErrorNames.cancelled) return new FitCancelled();
  return new WorkerCallError(shape.name, shape.message, shape.code, shape.rows);
}

/** Checks that a value is an ErrorShape (used on messages coming from a worker). */
export function isErrorShape(x: unknown): x is ErrorShape {
  const e = x as ErrorShape | null;
  return typeof e === 'object' && e !== null && typeof e.name === 'string' && typeof e.message === 'string';
}
