/**
 * The structure of a design that makes its products cheaper: columns that
 * only hold 0 and 1 (the intercept, factor-level and site dummies, cells of
 * factor x factor interactions) are constant on each "cell", the set of
 * rows that share the same pattern of those columns. A model with two
 * factors of 3 and 4 levels and an intercept has at most 12 cells.
 *
 * With the rows grouped by cell,
 * - X'WX among the other ("dense") columns is the blocked kernel over those
 *   columns only, on a copy of them with the rows in cell order;
 * - an entry with an indicator column s is a sum over the cells where s
 *   is 1: of the cell's sums of w x_k (dense k), or of the cell's total
 *   weight (indicator k);
 * - X'v and X b need the indicator columns once per cell, not per row.
 * The sums are the same sums taken in another order.
 *
 * The grouping is used only when it saves work (cost model below); else
 * every column is treated as dense.
 */
import { allColumns, denseKernel } from './kernel';

export interface CellIndex {
  /** Number of cells. */
  readonly count: number;
  /** The cell of each row. */
  readonly cellOf: Int32Array;
  /** Rows in cell order (cell 0's rows first, each cell's rows increasing). */
  readonly order: Int32Array;
  /** Cell c holds order[start[c]] ... order[start[c + 1] - 1]. */
  readonly start: Int32Array;
  /** Indicator columns that are 1 on cell c: ones[onesStart[c]] ... ones[onesStart[c + 1] - 1] (increasing). */
  readonly onesStart: Int32Array;
  readonly ones: Int32Array;
  /** The dense columns copied with the rows in cell order (n x dense.length, column-major). */
  readonly denseSorted: Float64Array;
  /** Work space of n numbers for the weights in cell order (overwritten by every product). */
  readonly scratch: Float64Array;
}

export interface ColumnStructure {
  /** Positions of the dense columns, increasing. */
  readonly dense: Int32Array;
  /** Positions of the 0/1 columns handled cell by cell, increasing (empty when the grouping is not used). */
  readonly indicator: Int32Array;
  /** The cells; null when every column is treated as dense. */
  readonly cells: CellIndex | null;
}

/** Relative cost of a step over the rows in cell order (a gathered weight) against one of the kernel: measured, about 1.5. */
const GATHER_COST = 1.5;

/** Use the grouping only when it needs at most this share of the plain kernel's work. */
const WORTH = 0.8;

/** Every column dense: the plain kernel. */
export function plainStructure(p: number): ColumnStructure {
  return { dense: allColumns(p), indicator: new Int32Array(0), cells: null };
}

/**
 * Refines the cells by a column: writes (old cell, value) as new cell ids to
 * `out` and returns how many cells there are then, or -1 when the column
 * holds a value other than 0 and 1.
 */
function refine(x: Float64Array, o: number, n: number, cellOf: Int32Array, count: number, out: Int32Array): number {
  for (let i = 0; i < n; i++) {
    const v = x[o + i];
    if (v !== 0 && v !== 1) return -1;
  }
  const code = new Int32Array(2 * count).fill(-1);
  let next = 0;
  for (let i = 0; i < n; i++) {
    const key = (cellOf[i] << 1) | (x[o + i] === 1 ? 1 : 0);
    let c = code[key];
    if (c < 0) c = code[key] = next++;
    out[i] = c;
  }
  return next;
}

/**
 * Finds the 0/1 columns and the cells they make, and decides whether
 * grouping by cell saves work. Computed once per design.
 */
export function columnStructure(x: Float64Array, n: number, p: number): ColumnStructure {
  const dense: number[] = [];
  const indicator: number[] = [];
  // Cell of each row, refined column by column: new cell = (old cell, value).
  let cellOf = new Int32Array(n);
  let spare = new Int32Array(n);
  let count = 1;
  for (let j = 0; j < p; j++) {
    const next = n === 0 ? -1 : refine(x, j * n, n, cellOf, count, spare);
    // Not 0/1, or so many cells that nothing is gained: a dense column.
    if (next < 0 || next > n / 4) {
      dense.push(j);
      continue;
    }
    [cellOf, spare] = [spare, cellOf];
    count = next;
    indicator.push(j);
  }
  const d = dense.length;
  if (indicator.length === 0) return plainStructure(p);
  // Ones per cell (from each cell's first row).
  const first = new Int32Array(count).fill(-1);
  for (let i = 0; i < n; i++) if (first[cellOf[i]] < 0) first[cellOf[i]] = i;
  const onesStart = new Int32Array(count + 1);
  const ones: number[] = [];
  for (let c = 0; c < count; c++) {
    for (const s of indicator) if (x[s * n + first[c]] === 1) ones.push(s);
    onesStart[c + 1] = ones.length;
  }
  const plain = (n * p * (p + 1)) / 2;
  const grouped = (n * d * (d + 1)) / 2 + GATHER_COST * n * (d + 2) + ones.length * (d + ones.length / count + 1);
  if (grouped > WORTH * plain) return plainStructure(p);

  // Counting sort of the rows by cell.
  const start = new Int32Array(count + 1);
  for (let i = 0; i < n; i++) start[cellOf[i] + 1]++;
  for (let c = 0; c < count; c++) start[c + 1] += start[c];
  const fill = start.slice(0, count);
  const order = new Int32Array(n);
  // rank[i]: the position of row i in cell order.
  const rank = spare;
  for (let i = 0; i < n; i++) {
    const r = fill[cellOf[i]]++;
    order[r] = i;
    rank[i] = r;
  }
  const denseSorted = new Float64Array(n * d);
  for (let k = 0; k < d; k++) {
    const src = dense[k] * n;
    const dst = k * n;
    for (let i = 0; i < n; i++) denseSorted[dst + rank[i]] = x[src + i];
  }
  return {
    dense: Int32Array.from(dense),
    indicator: Int32Array.from(indicator),
    cells: { count, cellOf, order, start, onesStart, ones: Int32Array.from(ones), denseSorted, scratch: new Float64Array(n) },
  };
}

/**
 * Per cell c: the sums of w x_k over its rows for each dense column k (at
 * c * (d + 1) + k) and its total weight (at c * (d + 1) + d), four columns
 * a pass so that each weight is read once for four sums.
 */
function cellSums(n: number, count: number, start: Int32Array, d: number, xs: Float64Array, wp: Float64Array | null): Float64Array {
  const sums = new Float64Array(count * (d + 1));
  for (let c = 0; c < count; c++) {
    const r0 = start[c];
    const r1 = start[c + 1];
    const base = c * (d + 1);
    let t = 0;
    if (wp) for (let r = r0; r < r1; r++) t += wp[r];
    else t = r1 - r0;
    sums[base + d] = t;
    let k = 0;
    for (; k + 3 < d; k += 4) {
      const o0 = k * n;
      const o1 = o0 + n;
      const o2 = o1 + n;
      const o3 = o2 + n;
      let s0 = 0;
      let s1 = 0;
      let s2 = 0;
      let s3 = 0;
      for (let r = r0; r < r1; r++) {
        const v = wp ? wp[r] : 1;
        s0 += v * xs[o0 + r];
        s1 += v * xs[o1 + r];
        s2 += v * xs[o2 + r];
        s3 += v * xs[o3 + r];
      }
      sums[base + k] = s0;
      sums[base + k + 1] = s1;
      sums[base + k + 2] = s2;
      sums[base + k + 3] = s3;
    }
    for (; k < d; k++) {
      const o = k * n;
      let s = 0;
      for (let r = r0; r < r1; r++) s += (wp ? wp[r] : 1) * xs[o + r];
      sums[base + k] = s;
    }
  }
  return sums;
}

/**
 * Adds X'WX, grouped by cell, to `out` (p x p): entry (j, k) with j <= k at
 * k * p + j, as the kernel leaves it; w null means unit weights.
 */
export function cellCrossprod(n: number, p: number, w: Float64Array | null, st: ColumnStructure, out: Float64Array): void {
  const cells = st.cells!;
  const { count, order, start, onesStart, ones, denseSorted, scratch } = cells;
  const dense = st.dense;
  const d = dense.length;
  let wp: Float64Array | null = null;
  if (w) {
    wp = scratch;
    for (let r = 0; r < n; r++) wp[r] = w[order[r]];
  }
  // Dense x dense.
  if (d > 0) {
    const dd = new Float64Array(d * d);
    denseKernel(denseSorted, n, d, wp, allColumns(d), dd);
    for (let b = 0; b < d; b++) for (let a = 0; a <= b; a++) out[dense[b] * p + dense[a]] += dd[b * d + a];
  }
  const sums = cellSums(n, count, start, d, denseSorted, wp);
  // Entries with an indicator column: sums over the cells where it is 1.
  for (let c = 0; c < count; c++) {
    const base = c * (d + 1);
    const total = sums[base + d];
    for (let q = onesStart[c]; q < onesStart[c + 1]; q++) {
      const s = ones[q];
      for (let k = 0; k < d; k++) {
        const j = dense[k];
        if (j < s) out[s * p + j] += sums[base + k];
        else out[j * p + s] += sums[base + k];
      }
      // ones is increasing within a cell, so t >= s.
      for (let r = q; r < onesStart[c + 1]; r++) out[ones[r] * p + s] += total;
    }
  }
}

/** out[j] += sum_i x_ij v_i for the indicator columns j, by cell. */
export function cellCrossprodVec(n: number, v: Float64Array, st: ColumnStructure, out: Float64Array): void {
  const { count, cellOf, onesStart, ones } = st.cells!;
  const per = new Float64Array(count);
  for (let i = 0; i < n; i++) per[cellOf[i]] += v[i];
  for (let c = 0; c < count; c++) for (let q = onesStart[c]; q < onesStart[c + 1]; q++) out[ones[q]] += per[c];
}

/** out_i += sum_j x_ij b_j over the indicator columns j, by cell. */
export function cellMatVec(n: number, b: ArrayLike<number>, st: ColumnStructure, out: Float64Array): void {
  const { count, cellOf, onesStart, ones } = st.cells!;
  const per = new Float64Array(count);
  for (let c = 0; c < count; c++) {
    let s = 0;
    for (let q = onesStart[c]; q < onesStart[c + 1]; q++) s += b[ones[q]];
    per[c] = s;
  }
  for (let i = 0; i < n; i++) out[i] += per[cellOf[i]];
}
