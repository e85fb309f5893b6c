import { describePlace } from './import-error';

/**
 * One thing a check found in the data: a stable code, how serious it is,
 * where it is (sheet, row, column letter) and, in plain words, what is wrong
 * and the usual fix.
 */
export type Severity = 'error' | 'warning' | 'info';

export interface Finding {
  readonly code: string;
  readonly severity: Severity;
  readonly file?: string;
  readonly sheet?: string;
  readonly row?: number;
  /** Column letter (A, B, ... AA). */
  readonly column?: string;
  /** The header text of that column, when there is one. */
  readonly columnName?: string;
  readonly message: string;
  readonly fix: string;
}

/** Errors and warnings need the user's action; notes do not. */
export function needsAction(findings: readonly Finding[]): boolean {
  return findings.some((f) => f.severity !== 'info');
}

const severityRank: Record<Severity, number> = { error: 0, warning: 1, info: 2 };

/** Sorted by severity, then sheet, row and column. */
export function sortFindings(findings: readonly Finding[]): Finding[] {
  return [...findings].sort(
    (a, b) =>
      severityRank[a.severity] - severityRank[b.severity] ||
      (a.sheet ?? '').localeCompare(b.sheet ?? '') ||
      (a.row ?? 0) - (b.row ?? 0) ||
      (a.column ?? '').length - (b.column ?? '').length ||
      (a.column ?? '').localeCompare(b.column ?? ''),
  );
}

/** One finding as two plain lines: where and what, then the fix. */
export function formatFinding(f: Finding): string {
  const col = f.column ? (f.columnName ? `${f.column} ("${f.columnName}")` : f.column) : undefined;
  const where = describePlace({ file: f.file, sheet: f.sheet, row: f.row, column: col });
  return `${f.severity}: ${where ? `${where}: ` : ''}${f.message} [${f.code}]\n  fix: ${f.fix}`;
}

/** Many findings of one code collapse to a few examples and a count, so a 200k-row problem does not print 200k lines. */
export function capFindings(findings: readonly Finding[], perCode: number): Finding[] {
  const byCode = new Map<string, Finding[]>();
  for (const f of findings) {
    const list = byCode.get(f.code);
    if (list) list.push(f);
    else byCode.set(f.code, [f]);
  }
  const out: Finding[] = [];
  for (const [code, list] of byCode) {
    out.push(...list.slice(0, perCode));
    if (list.length > perCode) {
      const first = list[0];
      out.push({
        code,
        severity: first.severity,
        file: first.file,
        sheet: first.sheet,
        message: `${list.length - perCode} more like this (${list.length} in all).`,
        fix: first.fix,
      });
    }
  }
  return out;
}
