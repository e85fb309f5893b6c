import { ZodError } from 'zod';
import { ProjectDocumentError } from './document';
import { CURRENT_FORMAT_VERSION } from './schema';
import { v0ToV1 } from './migrations/v0-to-v1';
import { v1ToV2 } from './migrations/v1-to-v2';
import { v2ToV3 } from './migrations/v2-to-v3';

/**
 * Migrations: an ordered list, each turning a document of version k into
 * version k + 1. Loading an older file runs the steps from its version up to
 * the current one, in memory; the file on disk is only rewritten when the
 * user saves (and the old file is kept as the backup).
 *
 * Each step reads the older shape with its own schema, so a malformed old
 * file is reported rather than half-converted. Steps are never edited once
 * released; a change of shape adds a step.
 */
export interface Migration {
  from: number;
  to: number;
  /** What the step changes, for the log and the docs. */
  summary: string;
  upgrade(doc: unknown): unknown;
}

export const migrations: readonly Migration[] = [v0ToV1, v1ToV2, v2ToV3];

/** The version a document body says it has: `formatVersion`, or `version` in the first shape. */
export function versionOf(body: unknown): number | undefined {
  if (typeof body !== 'object' || body === null) return undefined;
  const b = body as Record<string, unknown>;
  const v = b.formatVersion ?? b.version;
  return typeof v === 'number' && Number.isInteger(v) && v >= 0 ? v : undefined;
}

export interface MigrationResult {
  doc: unknown;
  fromVersion: number;
  /** Summaries of the steps run, oldest first; empty when the document was current. */
  steps: string[];
}

/** Brings a document body of any known older version up to `target` (the current version by default). */
export function migrateToCurrent(body: unknown, steps: readonly Migration[] = migrations, target = CURRENT_FORMAT_VERSION): MigrationResult {
  const fromVersion = versionOf(body);
  if (fromVersion === undefined) throw new ProjectDocumentError('the project does not say which format version it has');
  if (fromVersion > target) throw new ProjectDocumentError(`the project has format version ${fromVersion}, newer than ${target}`);
  let doc = body;
  const done: string[] = [];
  for (let v = fromVersion; v < target; v++) {
    const step = steps.find((m) => m.from === v && m.to === v + 1);
    if (!step) throw new ProjectDocumentError(`there is no way to convert format version ${v} to ${v + 1}`);
    try {
      doc = step.upgrade(doc);
    } catch (err) {
      const detail = err instanceof ZodError ? err.issues.slice(0, 3).map((i) => `${i.path.join('.') || '(top level)'}: ${i.message}`).join('; ') : String(err);
      throw new ProjectDocumentError(`the project is in format version ${v} but does not have that version's content (${detail})`);
    }
    done.push(`${v} -> ${v + 1}: ${step.summary}`);
  }
  return { doc, fromVersion, steps: done };
}
