/**
 * Builds the design matrix of a list of spec terms on the rows of a table.
 *
 * Coding (shared/cli-contract.md): treatment coding of factors against the
 * reference level (default: the first level in sorted order of the levels
 * present in the rows used); interactions are the products of the parts'
 * columns (a factor part contributes its non-reference dummies, so an
 * interaction adds the contrasts of a model that also has the main effects);
 * splines are natural cubic splines as in ./spline.ts. Column names:
 * `intercept`, `temp`, `habitat=sedge`, `a & b`, `x[ns1]`, `x[ns2]` ...
 * Linearly dependent columns are dropped (later ones first) with an
 * `aliased-column` warning.
 */
import type { DataTable, TableColumn } from '../../data/table';
import { requireColumn, sortLevels } from '../../data/table';
import type { Term } from '../../model/spec';
import type { Design, Warning } from '../types';
import { FitInputError } from '../types';
import { findAliased } from './aliasing';
import type { SplineKnots } from './spline';
import { naturalSplineBasis, splineKnots } from './spline';

export interface FactorCoding {
  readonly kind: 'factor';
  readonly column: string;
  /** Levels in sorted order (all levels present in the rows used). */
  readonly levels: readonly string[];
  readonly reference: string;
}
export interface NumericCoding {
  readonly kind: 'numeric';
  readonly column: string;
}
export type PartCoding = FactorCoding | NumericCoding;

/** How one term was coded: enough to rebuild the same columns on new rows. */
export type TermCoding =
  | PartCoding
  | { readonly kind: 'interaction'; readonly parts: readonly [PartCoding, PartCoding] }
  | { readonly kind: 'spline'; readonly column: string; readonly df: number; readonly knots: SplineKnots };

export interface BuildDesignOptions {
  intercept: boolean;
  /** 0-based table rows to use, in order (default: every row). */
  rows?: readonly number[];
  /** Codings from an earlier build (one per term): reuse its levels and knots, e.g. to predict. */
  coding?: readonly TermCoding[];
  /** Drop aliased columns (default true, but false when `coding` is given: new rows keep the fitted columns). */
  dropAliased?: boolean;
}

export interface BuiltDesign {
  design: Design;
  warnings: Warning[];
  /** One coding per term, in term order. */
  levels: TermCoding[];
  /** Names of the columns dropped as aliased. */
  aliased: string[];
}

/** A short name of a term for messages: `temp`, `habitat`, `a & b`. */
export function termLabel(term: Term): string {
  return term.type === 'interaction' ? term.columns.join(' & ') : term.column;
}

/** The `aliased-column` warning for a dropped column of the given term. */
export function aliasedWarning(column: string, term: string, note = ''): Warning {
  return {
    code: 'aliased-column',
    message: `Column "${column}" (term ${term}) is a linear combination of earlier columns, so its effect cannot be told apart from theirs; it was dropped${note}.`,
  };
}

/** Row numbers as people count them (1-based), at most `max` shown. */
export function rowList(rows: readonly number[], max = 10): string {
  const shown = rows.slice(0, max).map((r) => String(r + 1));
  return rows.length > max ? `${shown.join(', ')} and ${rows.length - max} more` : shown.join(', ');
}

function numericValues(col: TableColumn, rows: readonly number[], out: Float64Array = new Float64Array(rows.length)): Float64Array {
  const bad: number[] = [];
  const blank: number[] = [];
  for (let i = 0; i < rows.length; i++) {
    const v = col.values[rows[i]];
    if (Number.isNaN(v)) (col.texts[rows[i]] === '' ? blank : bad).push(rows[i]);
    out[i] = v;
  }
  if (bad.length) {
    const sample = col.texts[bad[0]];
    throw new FitInputError(
      'not-numeric',
      `Column "${col.name}" is used as a number, but data row${bad.length > 1 ? 's' : ''} ${rowList(bad)} hold${bad.length > 1 ? '' : 's'} text (e.g. "${sample}"). Correct those cells, exclude the rows, or use the column as a factor.`,
      bad,
    );
  }
  if (blank.length) {
    throw new FitInputError(
      'blank-value',
      `Column "${col.name}" is blank in data row${blank.length > 1 ? 's' : ''} ${rowList(blank)}. Fill in the value or exclude the rows.`,
      blank,
    );
  }
  return out;
}

/**
 * The texts of a factor column coded once per build: `codes[i]` is the
 * position in `seen` (first-seen order) of the text in row i of the build's
 * rows. Kept per column name for one buildDesign call (one set of rows), so
 * that each row's text is looked up once, not once for the levels and again
 * for the dummies.
 */
interface ColumnCodes {
  readonly codes: Int32Array;
  readonly seen: readonly string[];
}
type CodeCache = Map<string, ColumnCodes>;

function columnCodes(col: TableColumn, rows: readonly number[], cache: CodeCache): ColumnCodes {
  const hit = cache.get(col.name);
  if (hit) return hit;
  const index = new Map<string, number>();
  const seen: string[] = [];
  const codes = new Int32Array(rows.length);
  const texts = col.texts;
  for (let i = 0; i < rows.length; i++) {
    const t = texts[rows[i]];
    let k = index.get(t);
    if (k === undefined) {
      k = seen.length;
      index.set(t, k);
      seen.push(t);
    }
    codes[i] = k;
  }
  const out = { codes, seen };
  cache.set(col.name, out);
  return out;
}

function factorCoding(col: TableColumn, rows: readonly number[], reference: string | undefined, cache: CodeCache): FactorCoding {
  const { codes, seen } = columnCodes(col, rows, cache);
  const blankCode = seen.indexOf('');
  if (blankCode >= 0) {
    const blank: number[] = [];
    for (let i = 0; i < rows.length; i++) if (codes[i] === blankCode) blank.push(rows[i]);
    throw new FitInputError(
      'blank-value',
      `Column "${col.name}" is blank in data row${blank.length > 1 ? 's' : ''} ${rowList(blank)}. Fill in the value or exclude the rows.`,
      blank,
    );
  }
  const levels = sortLevels([...seen]);
  const ref = reference ?? levels[0];
  if (levels.length && !levels.includes(ref)) {
    throw new FitInputError(
      'unknown-reference',
      `The reference level "${ref}" of factor "${col.name}" does not occur in the rows used. Its levels are: ${levels.map((l) => `"${l}"`).join(', ')}. Choose one of them as the reference.`,
    );
  }
  return { kind: 'factor', column: col.name, levels, reference: ref };
}

interface Block {
  names: string[];
  cols: Float64Array[];
}

/** Hands out the storage of the next design column (zero-filled, n long). */
type ColumnStore = () => Float64Array;

const freshColumns = (n: number): ColumnStore => () => new Float64Array(n);

function partBlock(table: DataTable, part: PartCoding, rows: readonly number[], cache: CodeCache, store: ColumnStore = freshColumns(rows.length)): Block {
  const col = requireColumn(table, part.column);
  if (part.kind === 'numeric') return { names: [part.column], cols: [numericValues(col, rows, store())] };
  const index = new Map<string, number>();
  const nonRef = part.levels.filter((l) => l !== part.reference);
  nonRef.forEach((l, k) => index.set(l, k));
  // The reference maps to -1: one lookup per distinct text tells the three cases apart.
  index.set(part.reference, -1);
  const cols = nonRef.map(() => store());
  const { codes, seen } = columnCodes(col, rows, cache);
  const target = seen.map((t) => index.get(t));
  const unknown: number[] = [];
  for (let i = 0; i < rows.length; i++) {
    const k = target[codes[i]];
    if (k === undefined) unknown.push(rows[i]);
    else if (k >= 0) cols[k][i] = 1;
  }
  if (unknown.length) {
    throw new FitInputError(
      'unknown-level',
      `Column "${col.name}" has level "${col.texts[unknown[0]]}" in data row${unknown.length > 1 ? 's' : ''} ${rowList(unknown)}, which the model was not fitted with. Known levels: ${part.levels.map((l) => `"${l}"`).join(', ')}.`,
      unknown,
    );
  }
  return { names: nonRef.map((l) => `${part.column}=${l}`), cols };
}

function resolvePart(table: DataTable, terms: readonly Term[], column: string, rows: readonly number[], cache: CodeCache): PartCoding {
  const asFactor = terms.find((t) => t.type === 'factor' && t.column === column);
  if (asFactor && asFactor.type === 'factor') return factorCoding(requireColumn(table, column), rows, asFactor.reference, cache);
  const asNumeric = terms.find((t) => (t.type === 'numeric' || t.type === 'spline') && t.column === column);
  const col = requireColumn(table, column);
  if (asNumeric || col.numeric) return { kind: 'numeric', column };
  return factorCoding(col, rows, undefined, cache);
}

function codeTerm(table: DataTable, terms: readonly Term[], term: Term, rows: readonly number[], cache: CodeCache): TermCoding {
  switch (term.type) {
    case 'numeric':
      return { kind: 'numeric', column: term.column };
    case 'factor':
      return factorCoding(requireColumn(table, term.column), rows, term.reference, cache);
    case 'interaction':
      return { kind: 'interaction', parts: [resolvePart(table, terms, term.columns[0], rows, cache), resolvePart(table, terms, term.columns[1], rows, cache)] };
    case 'spline': {
      const x = numericValues(requireColumn(table, term.column), rows);
      const set = new Set<number>();
      for (let i = 0; i < x.length && set.size <= term.df; i++) set.add(x[i]);
      const distinct = set.size;
      if (distinct <= term.df) {
        throw new FitInputError(
          'spline-too-flexible',
          `The spline on "${term.column}" asks for ${term.df} degrees of freedom, but the column has only ${distinct} distinct value${distinct === 1 ? '' : 's'} in the rows used. Lower df or use the column as numeric or factor.`,
        );
      }
      return { kind: 'spline', column: term.column, df: term.df, knots: splineKnots(x, term.df) };
    }
  }
}

/** Number of design columns a coded term makes. */
function termWidth(coding: TermCoding): number {
  switch (coding.kind) {
    case 'numeric':
      return 1;
    case 'factor':
      // As partBlock: one dummy per level other than the reference.
      return coding.levels.filter((l) => l !== coding.reference).length;
    case 'interaction':
      return termWidth(coding.parts[0]) * termWidth(coding.parts[1]);
    case 'spline':
      return coding.df;
  }
}

function termBlock(table: DataTable, coding: TermCoding, rows: readonly number[], cache: CodeCache, store: ColumnStore): Block {
  switch (coding.kind) {
    case 'numeric':
    case 'factor':
      return partBlock(table, coding, rows, cache, store);
    case 'interaction': {
      const a = partBlock(table, coding.parts[0], rows, cache);
      const b = partBlock(table, coding.parts[1], rows, cache);
      const names: string[] = [];
      const cols: Float64Array[] = [];
      // The first part varies fastest (the customary column order, so reference fits line up).
      for (let k = 0; k < b.cols.length; k++) {
        for (let j = 0; j < a.cols.length; j++) {
          const c = store();
          const ca = a.cols[j];
          const cb = b.cols[k];
          for (let i = 0; i < rows.length; i++) c[i] = ca[i] * cb[i];
          names.push(`${a.names[j]} & ${b.names[k]}`);
          cols.push(c);
        }
      }
      return { names, cols };
    }
    case 'spline': {
      const x = numericValues(requireColumn(table, coding.column), rows);
      const basis = naturalSplineBasis(x, coding.knots);
      const n = rows.length;
      const names: string[] = [];
      const cols: Float64Array[] = [];
      for (let j = 0; j < coding.df; j++) {
        names.push(`${coding.column}[ns${j + 1}]`);
        const c = store();
        c.set(basis.subarray(j * n, (j + 1) * n));
        cols.push(c);
      }
      return { names, cols };
    }
  }
}

function allRows(n: number): number[] {
  return Array.from({ length: n }, (_, i) => i);
}

export function buildDesign(table: DataTable, terms: readonly Term[], opts: BuildDesignOptions): BuiltDesign {
  const rows = opts.rows ?? allRows(table.nrows);
  const n = rows.length;
  const warnings: Warning[] = [];
  const names: string[] = [];
  const termOf: number[] = [];
  const cache: CodeCache = new Map();
  const levels = terms.map((term, ti) => opts.coding?.[ti] ?? codeTerm(table, terms, term, rows, cache));
  // Every column is written in place into the design (no copies of the columns).
  const p = (opts.intercept ? 1 : 0) + levels.reduce((s, c) => s + termWidth(c), 0);
  const data = new Float64Array(n * p);
  let next = 0;
  const store: ColumnStore = () => data.subarray(n * next, n * ++next);
  if (opts.intercept) {
    names.push('intercept');
    termOf.push(-1);
    store().fill(1);
  }
  terms.forEach((term, ti) => {
    const coding = levels[ti];
    const block = termBlock(table, coding, rows, cache, store);
    if (block.cols.length === 0) {
      warnings.push({
        code: 'other',
        message: `Factor "${termLabel(term)}" has a single level in the rows used, so it adds nothing to the model and was left out.`,
      });
    }
    block.names.forEach((nm) => {
      names.push(nm);
      termOf.push(ti);
    });
  });
  if (next !== p) throw new Error(`buildDesign: ${next} columns written for ${p} counted`);
  const aliased: string[] = [];
  if ((opts.dropAliased ?? !opts.coding) && p > 0 && n > 0) {
    const drop = findAliased(data, n, p);
    if (drop.length) {
      const keep = new Set(allRows(p).filter((j) => !drop.includes(j)));
      for (const j of drop) {
        const label = termOf[j] < 0 ? 'intercept' : termLabel(terms[termOf[j]]);
        aliased.push(names[j]);
        warnings.push(aliasedWarning(names[j], label));
      }
      const keptIdx = [...keep];
      const data2 = new Float64Array(n * keptIdx.length);
      keptIdx.forEach((j, k) => data2.set(data.subarray(j * n, (j + 1) * n), k * n));
      const design: Design = { n, p: keptIdx.length, data: data2, names: keptIdx.map((j) => names[j]), termOf: keptIdx.map((j) => termOf[j]) };
      return { design, warnings, levels, aliased };
    }
  }
  return { design: { n, p, data, names, termOf }, warnings, levels, aliased };
}
