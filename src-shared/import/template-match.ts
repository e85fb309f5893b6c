import type { Finding } from './findings';
import type { ColumnMap } from './mapping-template';
import { foldName, jaroWinkler } from './similarity';

/**
 * Matches a template's columns to a sheet's headers by name: exactly (case
 * and spaces folded), then renamed-looking pairs (similar names left over on
 * both sides), and reports what no longer matches.
 */
export interface TemplateMatch {
  /** Template column index -> table column index (-1 when missing). */
  readonly indexOf: readonly number[];
  readonly missing: readonly string[];
  readonly added: readonly string[];
  readonly renamed: readonly { readonly from: string; readonly to: string }[];
}

export function matchTemplate(columns: readonly ColumnMap[], headers: readonly string[]): TemplateMatch {
  const folded = headers.map(foldName);
  const used = new Set<number>();
  const indexOf = columns.map((c) => {
    const j = folded.findIndex((h, k) => !used.has(k) && h === foldName(c.header));
    if (j >= 0) used.add(j);
    return j;
  });
  const renamed: { from: string; to: string }[] = [];
  columns.forEach((c, i) => {
    if (indexOf[i] >= 0) return;
    let best = -1;
    let bestScore = 0.85;
    folded.forEach((h, k) => {
      if (used.has(k)) return;
      const s = jaroWinkler(foldName(c.header), h);
      if (s > bestScore) [best, bestScore] = [k, s];
    });
    if (best >= 0) {
      used.add(best);
      (indexOf as number[])[i] = best;
      renamed.push({ from: c.header, to: headers[best] });
    }
  });
  const missing = columns.filter((_, i) => indexOf[i] < 0).map((c) => c.header);
  const added = headers.filter((_, k) => !used.has(k));
  return { indexOf, missing, added, renamed };
}

/** The findings for a match: missing columns are errors, renamed-looking and new columns warnings. */
export function templateFindings(m: TemplateMatch, columns: readonly ColumnMap[], where: { file: string; sheet: string; headerRow: number; letterOf: (header: string) => string }): Finding[] {
  const base = { file: where.file, sheet: where.sheet, row: where.headerRow };
  const out: Finding[] = [];
  for (const h of m.missing) {
    const role = columns.find((c) => c.header === h)?.role;
    out.push({ ...base, code: 'template-missing-column', severity: 'error', columnName: h, message: `The template's column "${h}" (${role}) is not in this sheet.`, fix: 'Check the header row for a renamed or deleted column; fix the header, or edit the template.' });
  }
  for (const r of m.renamed) {
    out.push({ ...base, code: 'template-renamed-column', severity: 'warning', column: where.letterOf(r.to), columnName: r.to, message: `The template's column "${r.from}" is missing; "${r.to}" looks like it renamed, and was used in its place.`, fix: `If "${r.to}" is the same column, save the template again with the new name; if not, map it by hand.` });
  }
  for (const h of m.added) {
    out.push({ ...base, code: 'template-new-column', severity: 'warning', column: where.letterOf(h), columnName: h, message: `Column "${h}" is new: the template does not say what it holds, so it was not read.`, fix: 'Give it a role in the mapping (a new species count, a covariate, or ignore) and save the template.' });
  }
  return out;
}
