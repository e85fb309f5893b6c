import type { RecordFinding, SourceSummary } from '@shared/host/contract';
import type { LinkedFinding } from '@shared/import/linked-findings';

/**
 * The shared checks' findings (src-shared/import/check-table.ts, the ones
 * `tallywise check` reports) as the Records page receives them: each with
 * the ids of the records it concerns, under the page's code where the page
 * has its own name for that kind of finding. A finding about no record
 * (the header row, the mapping) becomes a note on the source instead.
 */
export const pageCodes: Readonly<Record<string, string>> = {
  'not-surveyed-code': 'count-not-surveyed',
  'present-not-counted': 'count-present-only',
  'at-least-count': 'count-lower-bound',
  'approximate-count': 'count-approximate',
  'invalid-count': 'count-unreadable',
  'duplicate-record': 'repeated-visit',
  'similar-site-name': 'name-variant',
  'similar-species-name': 'name-variant',
  'date-missing': 'date-unreadable',
};

function pageCode(l: LinkedFinding): string {
  if (l.finding.code === 'formula-error' && l.links.field === 'count') return 'count-unreadable';
  return pageCodes[l.finding.code] ?? l.finding.code;
}

export interface PageFindings {
  findings: RecordFinding[];
  notes: SourceSummary['notes'];
}

export function toPageFindings(linked: readonly LinkedFinding[], recordIds: readonly string[]): PageFindings {
  const findings: RecordFinding[] = [];
  const notes: SourceSummary['notes'] = [];
  for (const l of linked) {
    const f = l.finding;
    if (l.links.records.length === 0) {
      notes.push({ code: f.code, severity: f.severity, message: f.message, fix: f.fix, sheet: f.sheet, row: f.row });
      continue;
    }
    findings.push({
      id: `f${findings.length + 1}`,
      code: pageCode(l),
      severity: f.severity,
      file: f.file,
      sheet: f.sheet,
      row: f.row,
      column: f.column,
      ...(l.links.field ? { field: l.links.field } : {}),
      message: f.message,
      fix: f.fix,
      recordIds: l.links.records.map((i) => recordIds[i]),
      ...(l.links.merge ? { merge: { ...l.links.merge } } : {}),
      ...(l.links.repeats !== undefined ? { repeats: l.links.repeats } : {}),
    });
  }
  return { findings, notes };
}
