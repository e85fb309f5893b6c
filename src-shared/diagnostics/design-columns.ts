/**
 * Rebuilds, from the table, the design columns a fit's coefficients belong
 * to, by their published names: `intercept`, a numeric column `x`, a factor
 * level `habitat=sedge`, an interaction `a & b` (product of its parts), and
 * anything else (spline columns) as the engine's design builder names it.
 * Diagnostics that need the design (the one-step site influence) use it,
 * since a FitOutcome carries the fitted values but not the design.
 */
import type { DataTable } from '../data/table';
import { findColumn } from '../data/table';
import { buildDesign, countTerms } from '../engine';
import type { Term } from '../model/spec';
import type { ModelSpec } from '../model/spec';
import { DiagnosticsInputError } from './fitted-distribution';

/** The column of one name part (`x` or `col=level`), or null when the name is not of that form. */
function partColumn(table: DataTable, part: string, rows: ArrayLike<number>): Float64Array | null {
  const n = rows.length;
  if (part === 'intercept') return new Float64Array(n).fill(1);
  const eq = part.indexOf('=');
  if (eq > 0) {
    const col = findColumn(table, part.slice(0, eq));
    if (!col) return null;
    const level = part.slice(eq + 1);
    return Float64Array.from({ length: n }, (_, i) => (col.texts[rows[i]] === level ? 1 : 0));
  }
  const col = findColumn(table, part);
  if (!col || !col.numeric) return null;
  return Float64Array.from({ length: n }, (_, i) => col.values[rows[i]]);
}

function namedColumn(table: DataTable, name: string, rows: ArrayLike<number>): Float64Array | null {
  const parts = name.split(' & ');
  const cols = parts.map((p) => partColumn(table, p, rows));
  if (cols.some((c) => c === null)) return null;
  const out = (cols[0] as Float64Array).slice();
  for (const c of cols.slice(1)) for (let i = 0; i < out.length; i++) out[i] *= (c as Float64Array)[i];
  return out;
}

/** The builder's columns for terms, by name (empty when the builder refuses the rows). */
function builtColumns(table: DataTable, terms: readonly Term[], rows: readonly number[]): Map<string, Float64Array> {
  const out = new Map<string, Float64Array>();
  try {
    const { design } = buildDesign(table, terms, { intercept: true, rows, dropAliased: false });
    design.names.forEach((nm, j) => out.set(nm, design.data.slice(j * design.n, (j + 1) * design.n)));
  } catch {
    // Names that parse (the usual case) are rebuilt below; the others are reported there.
  }
  return out;
}

/**
 * Columns for the given coefficient names on the fit's rows, column-major
 * (n x names.length). `part` says which part of the model, for messages.
 */
export function designColumns(table: DataTable, rows: ArrayLike<number>, names: readonly string[], terms: readonly Term[], part: string): Float64Array {
  const n = rows.length;
  const rowList = Array.from(rows);
  let built: Map<string, Float64Array> | null = null;
  const data = new Float64Array(n * names.length);
  names.forEach((name, j) => {
    let col = namedColumn(table, name, rows);
    if (!col) {
      built ??= builtColumns(table, terms, rowList);
      col = built.get(name) ?? null;
    }
    if (!col) {
      throw new DiagnosticsInputError('unknown-term', `The ${part} coefficient "${name}" cannot be rebuilt from the table's columns; was the model fitted to this table?`);
    }
    data.set(col, j * n);
  });
  return data;
}

/** The count-part terms of a spec on the fit's rows (predictors and the time term). */
export function countPartTerms(table: DataTable, spec: ModelSpec, rows: ArrayLike<number>): Term[] {
  return countTerms(table, spec, Array.from(rows));
}
