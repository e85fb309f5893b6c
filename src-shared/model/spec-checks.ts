import { findColumn, levelsOf, type DataTable, type TableColumn } from '../data/table';
import { hasZeroPart, type ModelSpec, type Term } from './spec';
import type { TableRoles } from './table-roles';

/**
 * Checks a spec against the rows of each species before anything is sent to
 * the worker, and says in plain words what is wrong and what to do. The
 * engine checks again; these catch the usual slips early and name the
 * species, column and analysis rows (site and season) at fault.
 */
export interface SpeciesRows {
  readonly species: string;
  readonly table: DataTable;
}

/** A random intercept's spread is poorly estimated from very few sites (common practice: at least 5). */
export const MIN_RANDOM_SITES = 5;

function distinct(table: DataTable, column: string): string[] {
  const col = findColumn(table, column);
  return col ? levelsOf(col) : [];
}

function placeOf(table: DataTable, row: number, roles: TableRoles): string {
  const site = findColumn(table, roles.site)?.texts[row] ?? '';
  const season = findColumn(table, roles.season)?.texts[row] ?? '';
  return `${site || 'no site'}, ${season || 'no season'}`;
}

function examples(table: DataTable, rows: readonly number[], roles: TableRoles): string {
  const shown = rows.slice(0, 3).map((r) => placeOf(table, r, roles));
  return `${shown.join('; ')}${rows.length > 3 ? ` and ${rows.length - 3} more` : ''}`;
}

function termColumns(t: Term): string[] {
  return 'column' in t ? [t.column] : t.columns;
}

function notNumberRows(col: TableColumn): number[] {
  const bad: number[] = [];
  col.texts.forEach((text, i) => {
    if (text !== '' && !Number.isFinite(col.values[i])) bad.push(i);
  });
  return bad;
}

/** Faults of the term list itself, whatever the rows: an interaction of a column with itself, a term given twice. */
function checkTermList(terms: readonly Term[], part: string, out: string[]): void {
  const seen = new Set<string>();
  for (const t of terms) {
    if (t.type === 'interaction' && t.columns[0] === t.columns[1]) {
      out.push(`The ${part} interaction "${t.columns[0]} × ${t.columns[1]}" pairs a column with itself, which adds nothing the column does not; remove it, or pair "${t.columns[0]}" with another column.`);
    }
    const key = t.type === 'interaction' ? [...t.columns].sort().join(' × ') : t.column;
    if (seen.has(key)) out.push(`The ${part} "${key}" is given more than once; keep one.`);
    seen.add(key);
  }
}

function checkTerms(terms: readonly Term[], part: string, s: SpeciesRows, roles: TableRoles, out: string[]): void {
  for (const t of terms) {
    for (const name of termColumns(t)) {
      const col = findColumn(s.table, name);
      if (!col) {
        out.push(`The ${part} "${name}" is not a column of the analysis table; remove it.`);
        continue;
      }
      const values = levelsOf(col);
      if (values.length < 2) {
        out.push(`The ${part} "${name}" has only one value${values.length ? ` ("${values[0]}")` : ''} in the ${s.species} rows, so its effect cannot be estimated; remove it for this species.`);
      }
      if (t.type === 'numeric' || t.type === 'spline') {
        const bad = notNumberRows(col);
        const fix = t.type === 'spline' ? 'a smooth curve needs numbers; correct the cells or use the column as a factor' : 'treat it as a factor or correct the cells';
        if (bad.length) out.push(`The ${part} "${name}" is not a number in ${bad.length} ${s.species} row${bad.length > 1 ? 's' : ''} (${examples(s.table, bad, roles)}); ${fix}.`);
      }
      if (t.type === 'spline' && values.length >= 2 && t.df >= values.length) {
        const few = name === roles.season ? `come from only ${values.length} seasons` : `have only ${values.length} distinct values of it`;
        out.push(`The smooth curve in "${name}" asks for ${t.df} degrees of freedom, but the ${s.species} rows ${few}; choose at most ${values.length - 1} degrees of freedom.`);
      }
      if (t.type === 'factor' && t.reference && !values.includes(t.reference)) {
        out.push(`The reference level "${t.reference}" of "${name}" does not occur in the ${s.species} rows; choose one of ${values.map((v) => `"${v}"`).join(', ')}.`);
      }
    }
  }
}

/** Whether the column holds one value within each site (so fixed site effects absorb it). */
function constantWithinSites(table: DataTable, site: string, col: TableColumn): boolean {
  const sites = findColumn(table, site);
  if (!sites) return false;
  const first = new Map<string, string>();
  for (let i = 0; i < table.nrows; i++) {
    const seen = first.get(sites.texts[i]);
    if (seen === undefined) first.set(sites.texts[i], col.texts[i]);
    else if (seen !== col.texts[i]) return false;
  }
  return first.size > 1;
}

function checkSiteAbsorbed(spec: ModelSpec, s: SpeciesRows, roles: TableRoles, out: string[]): void {
  if (spec.site?.effect !== 'fixed') return;
  for (const t of spec.predictors) {
    if (t.type === 'interaction') continue;
    const col = findColumn(s.table, t.column);
    // A missing column or one with a single value is reported by checkTerms.
    if (col && levelsOf(col).length > 1 && constantWithinSites(s.table, roles.site, col)) {
      out.push(`The predictor "${t.column}" does not change within any site in the ${s.species} rows, so the fixed site effect (one term per site) takes it in and its effect cannot be estimated; choose a random site effect to estimate it, or remove "${t.column}".`);
    }
  }
}

function checkOffsets(spec: ModelSpec, s: SpeciesRows, roles: TableRoles, out: string[]): void {
  for (const o of spec.offsets) {
    const col = findColumn(s.table, o.column);
    const what = o.column === roles.effort?.column ? `Effort (${roles.effort.unit})` : o.column === roles.area?.column ? `Area (${roles.area.unit})` : `The offset "${o.column}"`;
    if (!col) {
      out.push(`${what} is not in the analysis table; untick that offset.`);
      continue;
    }
    const bad: number[] = [];
    col.values.forEach((v, i) => {
      if (o.log ? !(v > 0) : !Number.isFinite(v)) bad.push(i);
    });
    if (bad.length) {
      const fix = o.column === roles.effort?.column ? 'correct the effort in Records' : 'give every site its value';
      out.push(`${what} is zero or missing in ${bad.length} ${s.species} row${bad.length > 1 ? 's' : ''} (${examples(s.table, bad, roles)}); its log cannot be taken. ${fix[0].toUpperCase()}${fix.slice(1)}, or untick that offset.`);
    }
  }
}

/** Problems that stop the fit, in plain sentences; empty when the spec can be fitted. */
export function checkSpec(spec: ModelSpec, species: readonly SpeciesRows[], roles: TableRoles): string[] {
  const out: string[] = [];
  if (!species.length) return ['Choose at least one species to fit.'];
  if (spec.site?.effect === 'random' && hasZeroPart(spec.distribution)) {
    out.push('A random site effect is available only with the Poisson and negative binomial models; choose a fixed site effect, or one of those two.');
  }
  if (spec.site?.effect === 'random' && !(spec.site.quadraturePoints >= 1 && spec.site.quadraturePoints <= 50 && Number.isInteger(spec.site.quadraturePoints))) {
    out.push('The number of quadrature points must be a whole number from 1 (the Laplace approximation) to 50.');
  }
  checkTermList(spec.predictors, 'predictor', out);
  checkTermList(spec.zeroPredictors, 'zero-part predictor', out);
  for (const s of species) {
    if (s.table.nrows === 0) {
      out.push(`${s.species} has no rows with a usable count.`);
      continue;
    }
    const counts = findColumn(s.table, roles.response)?.values ?? new Float64Array();
    if (counts.every((c) => c === 0)) out.push(`Every ${s.species} count is zero, so there is nothing to model; leave the species out.`);
    if (spec.site?.effect === 'random') {
      const sites = distinct(s.table, roles.site).length;
      if (sites < MIN_RANDOM_SITES) out.push(`A random site effect needs at least ${MIN_RANDOM_SITES} sites to estimate the spread between them, but ${s.species} has rows from ${sites} site${sites === 1 ? '' : 's'}; use a fixed site effect or none.`);
    }
    if (spec.time) {
      const seasons = distinct(s.table, spec.time.column);
      if (seasons.length < 2) out.push(`${s.species} has rows from one season only, so a season term cannot be estimated; choose "no season term".`);
      if (spec.time.trend === 'linear' && seasons.some((v) => !Number.isFinite(Number(v)))) {
        out.push(`A linear trend needs seasons written as numbers, but ${s.species} has the season "${seasons.find((v) => !Number.isFinite(Number(v)))}"; use one effect per season.`);
      }
    }
    checkTerms(spec.predictors, 'predictor', s, roles, out);
    checkSiteAbsorbed(spec, s, roles, out);
    checkTerms(spec.zeroPredictors, 'zero-part predictor', s, roles, out);
    checkOffsets(spec, s, roles, out);
  }
  return [...new Set(out)];
}
