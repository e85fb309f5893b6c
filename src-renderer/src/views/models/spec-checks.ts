import { findColumn, levelsOf, type DataTable } from '@shared/data/table';
import { hasZeroPart, type ModelSpec, type Term } from '@shared/model/spec';
import type { TableRoles } from './spec-draft';

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
      if (t.type === 'numeric') {
        const bad: number[] = [];
        col.texts.forEach((text, i) => {
          if (text !== '' && !Number.isFinite(col.values[i])) bad.push(i);
        });
        if (bad.length) out.push(`The ${part} "${name}" is not a number in ${bad.length} ${s.species} row${bad.length > 1 ? 's' : ''} (${examples(s.table, bad, roles)}); treat it as a factor or correct the cells.`);
      }
      if (t.type === 'factor' && t.reference && !values.includes(t.reference)) {
        out.push(`The reference level "${t.reference}" of "${name}" does not occur in the ${s.species} rows; choose one of ${values.map((v) => `"${v}"`).join(', ')}.`);
      }
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
    checkTerms(spec.zeroPredictors, 'zero-part predictor', s, roles, out);
    checkOffsets(spec, s, roles, out);
  }
  return [...new Set(out)];
}
