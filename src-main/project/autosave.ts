import { mkdir, stat, unlink } from 'node:fs/promises';
import { dirname } from 'node:path';
import type { ProjectDocument } from '@shared/project/document';
import { nodeErrorCode } from './node-error-code';
import { ProjectFileError } from './project-file-error';
import { encodeProject, loadProject } from './project-store';
import { recoveryPathFor } from './project-paths';
import { replaceFile } from './replace-file.mjs';

/**
 * Autosave to a recovery file, so nothing typed is lost to a crash.
 *
 * After a change the autosaver waits for a quiet moment (`quietMs` without
 * further changes) but never longer than `delayMs` after the first change
 * not yet written: continuous editing still saves every `delayMs`. Only the
 * latest document is written. The recovery file has the project file's own
 * format and is written atomically (no backup is kept of it).
 */
export interface AutosaverOptions {
  recoveryPath: string;
  /** Longest time from a change to its write (default 30 s). */
  delayMs?: number;
  /** Quiet time after the last change before writing (default 5 s, at most `delayMs`). */
  quietMs?: number;
  /** How a document is written; the recovery file by default (tests replace it). */
  write?: (doc: ProjectDocument, recoveryPath: string) => Promise<void>;
  onSaved?: (at: Date) => void;
  onError?: (error: unknown) => void;
}

export interface Autosaver {
  /** The document changed: remember it and schedule a write. */
  changed(doc: ProjectDocument): void;
  /** Write a waiting change now (before quitting, say). A failure goes to `onError` and the change stays pending. */
  flush(): Promise<void>;
  /** True while a change waits to be written. */
  readonly pending: boolean;
  /** Stop: cancel the timer and forget a waiting change (after the project was saved or closed). */
  dispose(): void;
}

async function writeRecoveryFile(doc: ProjectDocument, recoveryPath: string): Promise<void> {
  await mkdir(dirname(recoveryPath), { recursive: true });
  await replaceFile(recoveryPath, encodeProject(doc));
}

export function createAutosaver(options: AutosaverOptions): Autosaver {
  const delayMs = options.delayMs ?? 30_000;
  const quietMs = Math.min(options.quietMs ?? 5_000, delayMs);
  const write = options.write ?? writeRecoveryFile;
  let latest: ProjectDocument | undefined;
  let firstChangeAt: number | undefined;
  let timer: ReturnType<typeof setTimeout> | undefined;
  let writing: Promise<void> | undefined;
  let disposed = false;

  const clear = () => {
    if (timer !== undefined) clearTimeout(timer);
    timer = undefined;
  };

  const schedule = () => {
    clear();
    if (disposed || writing || latest === undefined || firstChangeAt === undefined) return;
    const wait = Math.max(0, Math.min(quietMs, firstChangeAt + delayMs - Date.now()));
    timer = setTimeout(() => {
      timer = undefined;
      void writeNow();
    }, wait);
  };

  const writeNow = async (): Promise<void> => {
    while (writing) await writing;
    const doc = latest;
    if (doc === undefined || disposed) return;
    latest = undefined;
    firstChangeAt = undefined;
    clear();
    const current = (async () => {
      try {
        await write(doc, options.recoveryPath);
        options.onSaved?.(new Date());
      } catch (err) {
        // keep the change so the next change or flush tries again
        if (latest === undefined) latest = doc;
        firstChangeAt ??= Date.now();
        options.onError?.(err);
      }
    })();
    writing = current;
    await current;
    if (writing === current) writing = undefined;
    schedule();
  };

  return {
    changed(doc) {
      if (disposed) return;
      latest = doc;
      firstChangeAt ??= Date.now();
      schedule();
    },
    flush: writeNow,
    get pending() {
      return latest !== undefined;
    },
    dispose() {
      disposed = true;
      latest = undefined;
      clear();
    },
  };
}

export interface RecoveryOffer {
  recoveryPath: string;
  /** When the recovery file was last written. */
  savedAt: Date;
  /** The recovered document, or null when the recovery file itself cannot be read. */
  document: ProjectDocument | null;
  /** Why the document is null. */
  problem?: string;
}

async function mtimeOf(path: string): Promise<number | undefined> {
  try {
    return (await stat(path)).mtimeMs;
  } catch (err) {
    if (nodeErrorCode(err) === 'ENOENT') return undefined;
    throw err;
  }
}

/**
 * Looks for unsaved work of a project: a recovery file newer than the project
 * file (or a recovery file of a project that no longer exists or was never
 * saved: `projectPath` null, `recoveryPath` given). Returns it so the app can
 * offer it, or null. Reads only.
 */
export async function checkRecovery(projectPath: string | null, recoveryPath?: string): Promise<RecoveryOffer | null> {
  const recovery = recoveryPath ?? (projectPath === null ? undefined : recoveryPathFor(projectPath));
  if (recovery === undefined) throw new Error('checkRecovery needs a project path or a recovery path');
  return offerIfNewer(projectPath, recovery);
}

async function offerIfNewer(projectPath: string | null, recoveryPath: string): Promise<RecoveryOffer | null> {
  const recoveryTime = await mtimeOf(recoveryPath);
  if (recoveryTime === undefined) return null;
  const projectTime = projectPath === null ? undefined : await mtimeOf(projectPath);
  if (projectTime !== undefined && recoveryTime <= projectTime) return null;
  const savedAt = new Date(recoveryTime);
  try {
    return { recoveryPath, savedAt, document: (await loadProject(recoveryPath)).document };
  } catch (err) {
    if (err instanceof ProjectFileError) return { recoveryPath, savedAt, document: null, problem: err.message };
    throw err;
  }
}

/** Deletes a recovery file (after the user saved, or declined the offer); no error if it is gone. */
export async function discardRecovery(recoveryPath: string): Promise<void> {
  try {
    await unlink(recoveryPath);
  } catch (err) {
    if (nodeErrorCode(err) !== 'ENOENT') throw err;
  }
}
