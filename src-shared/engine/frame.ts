/**
 * The model frame: which table rows a fit uses, the response and the offset.
 *
 * - Rows with a blank cell in any used column are left out, with a
 *   `dropped-rows` warning that says how many and names the first rows.
 * - The response must be a non-negative integer in every row kept;
 *   otherwise FitInputError lists the rows (1-based data-row numbers).
 * - Offsets add up; `log: true` takes the log, and a non-positive value is a
 *   FitInputError naming the rows and the column.
 */
import type { DataTable } from '../data/table';
import { requireColumn } from '../data/table';
import type { ModelSpec, Offset, Term } from '../model/spec';
import { hasZeroPart } from '../model/spec';
import { rowList } from './design/build';
import type { Warning } from './types';
import { FitInputError } from './types';

export interface FrameOptions {
  response: string;
  offsets: readonly Offset[];
  /** Every other column the model uses (predictors, zero part, site, time). */
  columns: readonly string[];
  /** Candidate rows (0-based); default every row. */
  rows?: readonly number[];
}

export interface ModelFrame {
  /** Table rows used (0-based), in order. */
  readonly rows: number[];
  readonly y: Float64Array;
  /** Sum of the offsets per row used; all zeros when there is none. */
  readonly offset: Float64Array;
  readonly hasOffset: boolean;
  readonly warnings: Warning[];
}

function termColumns(terms: readonly Term[]): string[] {
  return terms.flatMap((t) => (t.type === 'interaction' ? [...t.columns] : [t.column]));
}

/** The columns a spec uses besides the response and the offsets (zero-part columns only for models with a zero part). */
export function specColumns(spec: ModelSpec): string[] {
  const cols = [...termColumns(spec.predictors), ...(hasZeroPart(spec.distribution) ? termColumns(spec.zeroPredictors) : [])];
  if (spec.site) cols.push(spec.site.column);
  if (spec.time) cols.push(spec.time.column);
  return [...new Set(cols)];
}

/** Frame options for a spec. */
export function frameOptions(spec: ModelSpec): FrameOptions {
  return { response: spec.response, offsets: spec.offsets, columns: specColumns(spec) };
}

export function modelFrame(table: DataTable, opts: FrameOptions): ModelFrame {
  const warnings: Warning[] = [];
  const response = requireColumn(table, opts.response);
  const offsetCols = opts.offsets.map((o) => requireColumn(table, o.column));
  const used = [...new Set([opts.response, ...opts.offsets.map((o) => o.column), ...opts.columns])].map((c) => requireColumn(table, c));
  const candidates = opts.rows ?? Array.from({ length: table.nrows }, (_, i) => i);

  const rows: number[] = [];
  const dropped: number[] = [];
  const blankIn = new Set<string>();
  const blank = new Uint8Array(candidates.length);
  for (const c of used) {
    const texts = c.texts;
    const values = c.values;
    for (let k = 0; k < candidates.length; k++) {
      // A blank cell parses to NaN (see TableColumn), so only NaN cells need their text read.
      const r = candidates[k];
      if (Number.isNaN(values[r]) && texts[r] === '') {
        blank[k] = 1;
        blankIn.add(c.name);
      }
    }
  }
  for (let k = 0; k < candidates.length; k++) (blank[k] ? dropped : rows).push(candidates[k]);
  if (dropped.length) {
    const cols = [...blankIn].map((c) => `"${c}"`).join(', ');
    warnings.push({
      code: 'dropped-rows',
      message: `${dropped.length} row${dropped.length > 1 ? 's were' : ' was'} left out because a used column is blank (data row${dropped.length > 1 ? 's' : ''} ${rowList(dropped)}; column${blankIn.size > 1 ? 's' : ''} ${cols}).`,
    });
  }
  if (rows.length === 0) {
    throw new FitInputError('no-rows', `No row has all the columns the model uses filled in (${used.map((c) => `"${c.name}"`).join(', ')}). Fill in the blanks or remove columns from the model.`);
  }

  const y = new Float64Array(rows.length);
  const badY: number[] = [];
  for (let i = 0; i < rows.length; i++) {
    const v = response.values[rows[i]];
    if (!(v >= 0) || !Number.isInteger(v)) badY.push(rows[i]);
    y[i] = v;
  }
  if (badY.length) {
    const example = response.texts[badY[0]];
    throw new FitInputError(
      'bad-response',
      `The response "${response.name}" must be a whole number of 0 or more (a count), but data row${badY.length > 1 ? 's' : ''} ${rowList(badY)} ${badY.length > 1 ? 'do' : 'does'} not hold one (e.g. "${example}"). Correct those cells or exclude the rows.`,
      badY,
    );
  }

  const offset = new Float64Array(rows.length);
  opts.offsets.forEach((o, k) => {
    const col = offsetCols[k];
    const bad: number[] = [];
    for (let i = 0; i < rows.length; i++) {
      const v = col.values[rows[i]];
      if (!Number.isFinite(v) || (o.log && v <= 0)) bad.push(rows[i]);
      else offset[i] += o.log ? Math.log(v) : v;
    }
    if (bad.length) {
      const why = o.log ? 'a positive number (its log is taken)' : 'a number';
      throw new FitInputError(
        'bad-offset',
        `The offset column "${col.name}" must hold ${why}, but data row${bad.length > 1 ? 's' : ''} ${rowList(bad)} ${bad.length > 1 ? 'do' : 'does'} not (e.g. "${col.texts[bad[0]]}"). Set effort to a positive value or exclude the record.`,
        bad,
      );
    }
  });
  return { rows, y, offset, hasOffset: opts.offsets.length > 0, warnings };
}
