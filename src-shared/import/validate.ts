import { CellKind } from './cells';
import type { Finding } from './findings';
import type { ImportedTable } from './imported-table';
import { linkFindings, type FindingLinks, type LinkedFinding } from './linked-findings';
import { placeOf } from './imported-table';
import type { CountRecord } from './records';
import { foldName, variantGroups } from './similarity';
import { effortUnits, effortUnitInfo, type EffortUnit } from './units';

/**
 * Checks count records for what needs a person's eye before modelling. Each
 * finding has a stable code, a severity, its place and the usual fix;
 * `validateRecordsLinked` also gives the records each one concerns.
 */
export interface ValidateOptions {
  readonly file: string;
  /** Canonical effort unit of the records ('hours', 'km' ...), when effort is mapped. */
  readonly effortUnit?: string;
  /** Plausible effort per visit in the canonical unit; the default comes from the unit. */
  readonly effortRange?: readonly [number, number];
  /** The season's date range as month-day, e.g. { from: '03-01', to: '06-30' }. */
  readonly seasonWindow?: { readonly from: string; readonly to: string };
  readonly hasArea?: boolean;
  readonly hasDate?: boolean;
  /** An ambiguous-date-order question is still open (or the column mixes orders): numeric dates are not flagged as unreadable. */
  readonly dateOrderPending?: boolean;
}

function plausibleRange(unit: string | undefined): readonly [number, number] | undefined {
  const u = effortUnits.find((e) => effortUnitInfo(e as EffortUnit).canonical === unit);
  return u ? effortUnitInfo(u).plausible : undefined;
}

function fmt(n: number): string {
  return Number.isInteger(n) ? String(n) : String(Number(n.toPrecision(4)));
}

/** Formula errors (#DIV/0!, #REF!, #N/A ...) anywhere in the table's data. */
export function formulaErrors(table: ImportedTable): Finding[] {
  const out: Finding[] = [];
  table.columns.forEach((col, j) => {
    for (let i = 0; i < table.nrows; i++) {
      if (col.kinds[i] !== CellKind.error) continue;
      out.push({
        code: 'formula-error', severity: 'error', file: table.file, ...placeOf(table, j, i), columnName: col.name,
        message: `The cell holds the formula error ${col.texts[i]}, not a value.`,
        fix: 'Fix the formula in the workbook (or type the value), then read the file again.',
      });
    }
  });
  return out;
}

export function validateRecords(records: readonly CountRecord[], options: ValidateOptions): Finding[] {
  return runChecks(records, options, new Map());
}

/** The same findings, each with the records it concerns (see linked-findings.ts). */
export function validateRecordsLinked(records: readonly CountRecord[], options: ValidateOptions): LinkedFinding[] {
  const links = new Map<Finding, Partial<FindingLinks>>();
  return linkFindings(runChecks(records, options, links), records, links);
}

/** Indices of the records whose field holds this exact text. */
function holding(records: readonly CountRecord[], field: 'site' | 'species', text: string): number[] {
  const out: number[] = [];
  records.forEach((r, i) => r[field] === text && out.push(i));
  return out;
}

/** The findings, with the links a check knows beyond a finding's place (name variants, repeated rows) put in `links`. */
export function runChecks(records: readonly CountRecord[], options: ValidateOptions, links: Map<Finding, Partial<FindingLinks>>): Finding[] {
  const out: Finding[] = [];
  const seen = new Set<string>();
  const add = (f: Finding, link?: Partial<FindingLinks>) => {
    const key = `${f.code}|${f.sheet}|${f.row}|${f.column}`;
    if (seen.has(key)) return;
    seen.add(key);
    out.push(f);
    if (link) links.set(f, link);
  };
  // A date typed as text stands out only among real date cells (in a CSV every date is text).
  const hasRealDates = records.some((r) => r.dateKind === 'date');
  const file = options.file;
  const range = options.effortRange ?? plausibleRange(options.effortUnit);
  const firstRow = new Map<string, CountRecord>();
  const siteCounts = new Map<string, number>();
  const speciesCounts = new Map<string, number>();
  const visitsOfSite = new Map<string, Set<string>>();
  const firstOfSite = new Map<string, CountRecord>();
  const foldedSites = new Map<string, string>();
  const firstOfSpecies = new Map<string, CountRecord>();

  for (const r of records) {
    const at = { file, sheet: r.sheet, row: r.row };
    const hasNumber = r.count !== null;
    const observed = r.status !== 'not-surveyed' && r.status !== 'invalid';
    if (r.site === '') add({ ...at, column: r.columns.site, code: 'site-missing', severity: 'error', message: 'The row has counts but no site name.', fix: 'Type the site name, or delete the row if it is not data.' });
    siteCounts.set(r.site, (siteCounts.get(r.site) ?? 0) + 1);
    speciesCounts.set(r.species, (speciesCounts.get(r.species) ?? 0) + 1);
    if (!firstOfSite.has(r.site)) firstOfSite.set(r.site, r);
    if (!firstOfSpecies.has(r.species)) firstOfSpecies.set(r.species, r);
    if (r.status === 'invalid' && !r.formulaError) {
      add({ ...at, column: r.column, code: 'invalid-count', severity: 'error', message: `The count cell holds "${r.code.trim()}", which is neither a number nor a known field code.`, fix: 'Type the count, or add this code to the field-code table with what it means.' });
    }
    if (r.rule === 'number-as-text') {
      add({ ...at, column: r.column, code: 'count-as-text', severity: 'info', message: `The count "${r.code}" was typed as text; it was read as ${fmt(r.count!)}.`, fix: 'Nothing to do; to silence this, retype the cell as a number.' });
    } else if (r.status === 'present') {
      add({ ...at, column: r.column, code: 'present-not-counted', severity: 'info', message: `"${r.code.trim()}" means present but not counted; it is left out of the counts.`, fix: 'Nothing to do unless a count was made; then type the number.' });
    } else if (r.status === 'at-least' || r.status === 'approximate') {
      const what = r.status === 'at-least' ? `at least ${fmt(r.count!)}` : `about ${fmt(r.count!)}`;
      add({ ...at, column: r.column, code: `${r.status}-count`, severity: 'info', message: `"${r.code.trim()}" is read as ${what} and used as ${fmt(r.count!)} in the counts.`, fix: 'Nothing to do if that is right; type the exact count if it is known.' });
    } else if (r.status === 'not-surveyed' && r.code.trim() !== '') {
      add({ ...at, column: r.column, code: 'not-surveyed-code', severity: 'info', message: `"${r.code.trim()}" means not surveyed; the record is kept as missing, not as zero.`, fix: 'Nothing to do if the species was not looked for; type the count if it was.' });
    }
    if (hasNumber && !Number.isFinite(r.count!)) {
      add({ ...at, column: r.column, code: 'count-not-finite', severity: 'error', message: `The count "${r.code.trim()}" is too large to be a number.`, fix: 'Correct the count from the field sheet.' });
    } else if (hasNumber && r.count! > 1e6) {
      add({ ...at, column: r.column, code: 'huge-count', severity: 'warning', message: `The count ${r.code.trim()} is very large (over a million).`, fix: 'Check for a typing slip or a pasted identifier in the count column.' });
    }
    if (hasNumber && r.status === 'counted' && Number.isFinite(r.count!)) {
      if (r.count! < 0) add({ ...at, column: r.column, code: 'negative-count', severity: 'error', message: `The count is negative (${fmt(r.count!)}).`, fix: 'Counts cannot be below zero: correct the number from the field sheet.' });
      else if (!Number.isInteger(r.count!)) add({ ...at, column: r.column, code: 'non-integer-count', severity: 'error', message: `The count ${fmt(r.count!)} is not a whole number.`, fix: 'Correct it to the whole number counted; an average belongs in a note, not in the count column.' });
    }
    if (options.hasDate) {
      if (r.dateText === '') add({ ...at, column: r.columns.date, code: 'date-missing', severity: 'error', message: 'The row has no date.', fix: 'Fill in the visit date from the field sheet.' });
      else if (r.dateKind === 'text' && r.date !== null && hasRealDates) {
        add({ ...at, column: r.columns.date, code: 'date-as-text', severity: 'info', message: `The date "${r.dateText}" was typed as text; it was read as ${r.date}.`, fix: 'Check the reading; to be sure, retype it as a real date in the workbook.' });
      } else if (r.date === null && !(options.dateOrderPending && /^\d{1,2}[/-]\d{1,2}[/-]\d{2,4}$/.test(r.dateText))) {
        add({ ...at, column: r.columns.date, code: 'date-unreadable', severity: 'error', message: `"${r.dateText}" cannot be read as a date.`, fix: 'Type the date as year-month-day (2019-05-03) or format the cell as a date.' });
      }
    }
    if (options.effortUnit && observed) {
      const col = r.columns.effort;
      if (r.effort === null) {
        const what = r.effortText === '' ? 'missing' : `"${r.effortText}", not a number`;
        add({ ...at, column: col, code: 'effort-missing', severity: 'error', message: `A count was made but the effort is ${what}.`, fix: 'Fill in the effort from the field sheet; without it the count cannot be used with an effort offset.' });
      } else if (r.effort === 0) {
        add({ ...at, column: col, code: 'effort-zero', severity: 'error', message: 'A count was made but the effort is zero.', fix: 'Correct the effort; a count needs some time or distance spent.' });
      } else if (r.effort < 0) {
        add({ ...at, column: col, code: 'effort-negative', severity: 'error', message: `The effort is negative (${r.effortText}).`, fix: 'Correct the effort from the field sheet.' });
      } else if (range && (r.effort < range[0] || r.effort > range[1])) {
        add({ ...at, column: col, code: 'effort-implausible', severity: 'warning', message: `The effort ${r.effortText} (${fmt(r.effort)} ${options.effortUnit}) is outside the plausible range for one visit (${fmt(range[0])} to ${fmt(range[1])} ${options.effortUnit}).`, fix: 'Check the number and the unit of the effort column (minutes typed as hours?).' });
      }
    }
    if (options.hasArea && r.area === null && observed) {
      add({ ...at, column: r.columns.area ?? r.columns.site, code: 'area-missing', severity: 'warning', message: `Site "${r.site}" has no area, so an area offset cannot be used for it.`, fix: 'Add the area to the site list (or the area column) for this site.' });
    }
    if (r.status !== 'not-surveyed') {
      let folded = foldedSites.get(r.site);
      if (folded === undefined) foldedSites.set(r.site, (folded = foldName(r.site)));
      // Two visits on one day are two visits when the sheet numbers its visits.
      const key = `${folded}|${r.date ?? `visit ${r.visit}|${r.dateText}`}|${r.date && r.columns.visit ? r.visit : ''}|${r.species}`;
      const first = firstRow.get(key);
      if (first && !(first.sheet === r.sheet && first.row === r.row)) {
        const place = `${first.sheet === r.sheet ? '' : `sheet "${first.sheet}" `}row ${first.row}`;
        const when = r.date ? `${r.date}${r.columns.visit && r.visit ? `, visit ${r.visit}` : ''}` : r.dateText || `visit ${r.visit}`;
        add({ ...at, column: r.columns.site, code: 'duplicate-record', severity: 'error', message: `This row repeats ${place}: site "${r.site}", ${when}, species "${r.species}" is recorded in both.`, fix: 'Delete the repeated row, or correct its site or date if it is a different visit.' }, first.sheet === r.sheet ? { repeats: first.row } : undefined);
      } else if (!first) firstRow.set(key, r);
      const visitKey = r.date ?? `${r.visit}|${r.dateText}`;
      const sv = visitsOfSite.get(r.site);
      if (sv) sv.add(visitKey);
      else visitsOfSite.set(r.site, new Set([visitKey]));
    }
    if (options.seasonWindow && r.date) {
      const md = r.date.slice(5, 10);
      const { from, to } = options.seasonWindow;
      const inside = from <= to ? md >= from && md <= to : md >= from || md <= to;
      if (!inside) add({ ...at, column: r.columns.date, code: 'date-outside-season', severity: 'warning', message: `The date ${r.date} is outside the season (${from} to ${to}, month-day).`, fix: 'Check the date for a typing slip (day and month swapped, wrong year); change the season window if the survey really ran then.' });
    }
    if (r.date && /^\d{4}$/.test(r.season) && r.date.slice(0, 4) !== r.season && r.columns.season) {
      add({ ...at, column: r.columns.date, code: 'date-outside-season', severity: 'warning', message: `The date ${r.date} is not in season ${r.season}.`, fix: 'Check the year of the date and the season column.' });
    }
  }

  // Sites seen on one visit only, when sites usually get several ("most sites" needs three sites or more).
  const visitCounts = [...visitsOfSite.values()].map((s) => s.size).sort((a, b) => a - b);
  const median = visitCounts.length ? visitCounts[Math.floor(visitCounts.length / 2)] : 0;
  if (median >= 2 && visitCounts.length >= 3) {
    for (const [site, visits] of visitsOfSite) {
      if (visits.size !== 1 || site === '') continue;
      const r = firstOfSite.get(site)!;
      add({ file, sheet: r.sheet, row: r.row, column: r.columns.site, code: 'single-visit-site', severity: 'warning', message: `Site "${site}" was visited only once, while most sites have ${median} or more visits.`, fix: 'Check for a misspelt site name (see similar names) or a missing visit.' });
    }
  }
  for (const g of variantGroups(siteCounts)) {
    for (const v of g.variants) {
      const r = firstOfSite.get(v.name)!;
      add({ file, sheet: r.sheet, row: r.row, column: r.columns.site, code: 'similar-site-name', severity: 'warning', message: `Site "${v.name}" (${v.count} record${v.count > 1 ? 's' : ''}) looks like a variant of "${g.keep}" (${g.keepCount}).`, fix: `Merge it into "${g.keep}" if it is the same site; otherwise give the sites clearly different names.` }, { records: holding(records, 'site', v.name), merge: { field: 'site', from: v.name, into: g.keep } });
    }
  }
  // Species names typed in a species column; the headers of a wide sheet are names the sheet's author chose once, not typing slips.
  const typedSpecies = records.some((r) => r.columns.species !== undefined);
  for (const g of typedSpecies ? variantGroups(speciesCounts) : []) {
    for (const v of g.variants) {
      const r = firstOfSpecies.get(v.name)!;
      add({ file, sheet: r.sheet, row: r.row, column: r.columns.species ?? r.column, code: 'similar-species-name', severity: 'warning', message: `Species "${v.name}" (${v.count} record${v.count > 1 ? 's' : ''}) looks like a variant of "${g.keep}" (${g.keepCount}).`, fix: `Merge it into "${g.keep}" if it is the same species; otherwise give the species clearly different names.` }, { records: holding(records, 'species', v.name), merge: { field: 'species', from: v.name, into: g.keep } });
    }
  }
  return out;
}
