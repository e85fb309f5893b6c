import type { FitSummary } from '../model/fit-result';
import type { ErrorShape } from './errors';
import type { GroupResult } from './fit-batch';

/**
 * One line of a batch fit's output (JSON lines, one group a line):
 *   {"group": "heron", "fit": { ...the `fit --json` object... }}
 *   {"group": "gull", "error": {"name": "FitInputError", "message": "..."}}
 * The same lines are what `merge` joins.
 */
export type GroupLine = { group: string; fit: FitSummary } | { group: string; error: { name: string; message: string } };

export function groupLine(result: GroupResult): GroupLine {
  if ('outcome' in result) return { group: result.group, fit: result.outcome.summary };
  const { name, message } = result.error satisfies ErrorShape;
  return { group: result.group, error: { name, message } };
}

/** A group whose fit failed or did not converge: something the user must act on. */
export function needsAttention(line: GroupLine): boolean {
  return 'error' in line || !line.fit.converged;
}

/** Reads one output line; throws an Error whose message names `where` (file and line) and what is wrong. */
export function parseGroupLine(text: string, where: string): GroupLine {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    throw new Error(`${where} is not a JSON line. Give the files that \`fit --by\` wrote, unchanged.`);
  }
  const o = json as { group?: unknown; fit?: unknown; error?: unknown } | null;
  if (typeof o !== 'object' || o === null || Array.isArray(o) || typeof o.group !== 'string') {
    throw new Error(`${where} has no "group" text. Each line must be {"group": ..., "fit": ...} or {"group": ..., "error": ...} as \`fit --by\` writes them.`);
  }
  const hasFit = typeof o.fit === 'object' && o.fit !== null && typeof (o.fit as { converged?: unknown }).converged === 'boolean';
  const e = o.error as { name?: unknown; message?: unknown } | null | undefined;
  const hasError = typeof e === 'object' && e !== null && typeof e.name === 'string' && typeof e.message === 'string';
  if (hasFit === hasError) {
    throw new Error(`${where} (group "${o.group}") must hold either a "fit" object with "converged" or an "error" with "name" and "message".`);
  }
  return json as GroupLine;
}
