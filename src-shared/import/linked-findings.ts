import type { Finding } from './findings';
import type { CountRecord } from './records';

/**
 * A finding together with the records it concerns, so that a screen can go
 * from the finding to its rows and back: the indices of those records (into
 * the records checked), the record field it is about, the merge a name
 * variant suggests and the row a repeated row repeats. The plain Finding
 * (what `check` prints) stays as it is; the links travel beside it.
 */
export type LinkedField = 'site' | 'species' | 'date' | 'count' | 'effort';

export interface FindingLinks {
  /** Indices into the records checked. */
  readonly records: readonly number[];
  /** The record field the finding is about; none for a whole-row finding such as a repeated row. */
  readonly field?: LinkedField;
  /** A name variant's suggested merge. */
  readonly merge?: { readonly field: 'site' | 'species'; readonly from: string; readonly into: string };
  /** Spreadsheet row that this one repeats (same sheet). */
  readonly repeats?: number;
}

export interface LinkedFinding {
  readonly finding: Finding;
  readonly links: FindingLinks;
}

/** The field each finding code is about (codes not listed concern a whole row, or no record). */
const fieldOfCode: Record<string, LinkedField> = {
  'site-missing': 'site',
  'single-visit-site': 'site',
  'similar-site-name': 'site',
  'area-missing': 'site',
  'similar-species-name': 'species',
  'invalid-count': 'count',
  'formula-error': 'count',
  'count-as-text': 'count',
  'not-surveyed-code': 'count',
  'present-not-counted': 'count',
  'at-least-count': 'count',
  'approximate-count': 'count',
  'count-not-finite': 'count',
  'huge-count': 'count',
  'negative-count': 'count',
  'non-integer-count': 'count',
  'date-missing': 'date',
  'date-unreadable': 'date',
  'date-as-text': 'date',
  'date-outside-season': 'date',
  'season-few-records': 'date',
  'effort-missing': 'effort',
  'effort-zero': 'effort',
  'effort-negative': 'effort',
  'effort-implausible': 'effort',
};

/**
 * Links findings to records: by the links a check gave (a name variant
 * names every record of the variant spelling), else by place: the record of
 * the count cell the finding points at, else every record of its row (the
 * species of one visit row share its site, date and effort cells). A
 * finding about no record's row (a header, the template) links to none.
 */
export function linkFindings(findings: readonly Finding[], records: readonly CountRecord[], given: ReadonlyMap<Finding, Partial<FindingLinks>> = new Map()): LinkedFinding[] {
  const byCell = new Map<string, number>();
  const byRow = new Map<string, number[]>();
  records.forEach((r, i) => {
    byCell.set(`${r.sheet}|${r.row}|${r.column}`, i);
    const key = `${r.sheet}|${r.row}`;
    const list = byRow.get(key);
    if (list) list.push(i);
    else byRow.set(key, [i]);
  });
  return findings.map((finding) => {
    const extra = given.get(finding) ?? {};
    let linked = extra.records;
    const cell = finding.row === undefined ? undefined : byCell.get(`${finding.sheet}|${finding.row}|${finding.column}`);
    if (!linked && finding.row !== undefined) linked = cell !== undefined ? [cell] : (byRow.get(`${finding.sheet}|${finding.row}`) ?? []);
    // A formula error is about the count only when it sits in a count cell.
    const field = finding.code === 'formula-error' && cell === undefined ? undefined : fieldOfCode[finding.code];
    return { finding, links: { ...extra, records: linked ?? [], ...(field ? { field } : {}) } };
  });
}
