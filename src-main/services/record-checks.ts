import type { RecordFinding } from '@shared/host/contract';
import type { IdentifiedRecord } from './count-records';
import { foldName, variantGroups } from '@shared/import/similarity';

/**
 * Checks on the records of one import, each finding pointing at the sheet,
 * row and column of the cell and listing the records it concerns: count
 * codes, counts typed as text, missing effort, dates typed as text or not
 * readable, repeated visit rows and name variants.
 */
type Draft = Omit<RecordFinding, 'id'>;

function show(text: string): string {
  // A trailing space is invisible in quotes; say it.
  return `"${text}"${/\s$/.test(text) ? ' (ending in a space)' : ''}`;
}

const countMessages: Record<string, (r: IdentifiedRecord) => Omit<Draft, 'recordIds' | 'file' | 'sheet' | 'row' | 'column'> | null> = {
  'not-surveyed': (r) => ({
    code: 'count-not-surveyed', severity: 'info', field: 'count',
    message: `${r.species} was not surveyed on this visit (${r.code.trim() === '' ? 'blank cell' : show(r.code)}); it is kept as missing, not as zero.`,
    fix: 'Nothing to do if the species was not listened for; type the count if it was.',
  }),
  present: (r) => ({
    code: 'count-present-only', severity: 'warning', field: 'count',
    message: `${r.species} was noted as present (${show(r.code)}) but not counted; it stays missing in the analysis.`,
    fix: 'Type the count from the field card if there is one, or leave it missing.',
  }),
  'at-least': (r) => ({
    code: 'count-lower-bound', severity: 'warning', field: 'count',
    message: `${r.species}: ${show(r.code)} gives only a lower bound (at least ${r.count}).`,
    fix: 'Keep the bound as the count, type the true count if it is known, or leave the record out.',
  }),
  approximate: (r) => ({
    code: 'count-approximate', severity: 'info', field: 'count',
    message: `${r.species}: ${show(r.code)} is an estimate, read as ${r.count}.`,
    fix: 'Nothing to do if estimates are acceptable; type the exact count if it is known.',
  }),
  invalid: (r) => ({
    code: 'count-unreadable', severity: 'error', field: 'count',
    message: r.formulaError ? `${r.species}: the cell holds a formula error (${show(r.code)}), not a count.` : `${r.species}: ${show(r.code)} is not a count or a known field code.`,
    fix: 'Type the count, or leave the record out with a reason.',
  }),
};

export function checkRecords(records: readonly IdentifiedRecord[], file: string, hasEffort: boolean): RecordFinding[] {
  const drafts: Draft[] = [];
  const place = (r: IdentifiedRecord, column?: string) => ({ file, sheet: r.sheet, row: r.row, column: column ?? r.column });

  // Per count cell.
  for (const r of records) {
    const make = r.status === 'counted' ? null : countMessages[r.status]?.(r);
    if (make) drafts.push({ ...make, ...place(r), recordIds: [r.id] });
    else if (r.countAsText) {
      drafts.push({
        code: 'count-as-text', severity: 'info', field: 'count', ...place(r), recordIds: [r.id],
        message: `${r.species}: the count ${show(r.code)} was typed as text; it is read as the number ${r.count}.`,
        fix: 'Nothing to do; retype it as a number in the workbook to silence this next season.',
      });
    }
  }

  // Per visit row (the records of one table row share site, date and effort).
  const rows = new Map<number, IdentifiedRecord[]>();
  for (const r of records) {
    const list = rows.get(r.tableRow);
    if (list) list.push(r);
    else rows.set(r.tableRow, [r]);
  }
  const seen = new Map<string, IdentifiedRecord>();
  // A date typed as text stands out only among real date cells (in a CSV every date is text).
  const hasRealDates = records.some((r) => r.dateKind === 'date');
  for (const visit of rows.values()) {
    const first = visit[0];
    const ids = visit.map((r) => r.id);
    if (hasEffort && first.effort === null) {
      drafts.push({
        code: 'effort-missing', severity: 'warning', field: 'effort', ...place(first, first.columns.effort), recordIds: ids,
        message: first.effortText.trim() === '' ? `The effort of this visit to ${first.site.trim()} is blank.` : `The effort ${show(first.effortText)} of this visit to ${first.site.trim()} is not a number.`,
        fix: 'Type the effort from the field card; without it the effort offset cannot be used for this visit.',
      });
    }
    if (first.dateKind === 'text' && first.date !== null) {
      if (hasRealDates) drafts.push({
        code: 'date-as-text', severity: 'info', field: 'date', ...place(first, first.columns.date), recordIds: ids,
        message: `The date ${show(first.dateText)} was typed as text; it is read as ${first.date}.`,
        fix: 'Check the reading; retype it as a real date in the workbook to be sure.',
      });
    } else if (first.columns.date && first.date === null) {
      drafts.push({
        code: 'date-unreadable', severity: 'error', field: 'date', ...place(first, first.columns.date), recordIds: ids,
        message: first.dateText.trim() === '' ? 'This visit has no date.' : `The date ${show(first.dateText)} cannot be read as a date.`,
        fix: 'Type the date as year-month-day (2019-05-03).',
      });
    }
    const key = JSON.stringify([first.site, first.date ?? first.dateText, first.visit, first.observer, first.effortText, ...visit.map((r) => r.code)]);
    const earlier = seen.get(key);
    if (earlier && first.date !== null) {
      drafts.push({
        code: 'repeated-visit', severity: 'warning', ...place(first, first.columns.site), recordIds: ids, repeats: earlier.row,
        message: `Row ${first.row} repeats row ${earlier.row} cell for cell (${first.site.trim()}, ${first.date}, visit ${first.visit || '?'}); its counts would be counted twice.`,
        fix: `Leave this copy out of the analysis (or check the field cards if row ${first.row} is a different visit).`,
      });
    } else seen.set(key, first);
  }

  // Name variants of sites (and of species in long sheets).
  const fields: ('site' | 'species')[] = records.length && records[0].columns.species ? ['site', 'species'] : ['site'];
  for (const field of fields) {
    const frequency = new Map<string, number>();
    const holders = new Map<string, IdentifiedRecord[]>();
    for (const r of records) {
      const v = r[field];
      frequency.set(v, (frequency.get(v) ?? 0) + 1);
      const list = holders.get(v);
      if (list) list.push(r);
      else holders.set(v, [r]);
    }
    const variants = variantGroups(frequency).flatMap((g) => g.variants.map((v) => ({ from: v.name, into: g.keep, why: foldName(v.name) === foldName(g.keep) ? 'spacing' : 'spelling' })));
    for (const variant of variants) {
      const held = holders.get(variant.from)!;
      const first = held[0];
      drafts.push({
        code: 'name-variant', severity: 'warning', field, ...place(first, first.columns[field]), recordIds: held.map((r) => r.id),
        merge: { field, from: variant.from, into: variant.into },
        message: `The ${field} name ${show(variant.from)} looks like a variant of ${show(variant.into)} (${variant.why === 'spacing' ? 'they differ only in capitals or spaces' : 'the spellings are very close'}).`,
        fix: `Merge ${show(variant.from)} into ${show(variant.into)} if they are the same ${field}.`,
      });
    }
  }
  return drafts.map((d, i) => ({ id: `f${i + 1}`, ...d }));
}
