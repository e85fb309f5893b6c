/**
 * Factor levels (and factor x factor cells, and fixed sites) whose rows all
 * have a zero count. Their effect is minus infinity on the log scale: the
 * maximum-likelihood fit puts a zero mean on those rows, which then carry no
 * information about any other parameter. The engine therefore leaves those
 * rows and that column out, which is exactly the limit of the fit, and says
 * so in an `all-zero-level` (or `all-zero-site`) warning. When the reference
 * level itself has only zeros every contrast against it is infinite, so the
 * reference is moved to the first level (in sorted order) with a non-zero
 * count, and a warning says so.
 */
import type { Term } from '../../model/spec';
import type { Design, Warning } from '../types';
import type { TermCoding } from './build';

/**
 * Factor terms whose reference level has only zero counts, found from the
 * design (reference rows are those where none of the term's dummies is 1),
 * and the terms with their references moved to the first level in sorted
 * order with a non-zero count. `changed` is false when nothing moved.
 */
export function moveEmptyReferences(
  d: Design,
  y: Float64Array,
  terms: readonly Term[],
  coding: readonly TermCoding[],
): { terms: Term[]; warnings: Warning[]; changed: boolean } {
  const warnings: Warning[] = [];
  let changed = false;
  const out = terms.map((t, ti): Term => {
    const c = coding[ti];
    if (t.type !== 'factor' || c.kind !== 'factor') return t;
    const cols = d.termOf.map((tt, j) => (tt === ti ? j : -1)).filter((j) => j >= 0);
    if (cols.length === 0) return t;
    const totals = new Float64Array(cols.length);
    const { data, n } = d;
    // Rows at the reference level: none of the term's dummies is non-zero.
    const other = new Uint8Array(n);
    for (let q = 0; q < cols.length; q++) {
      const o = cols[q] * n;
      let s = 0;
      for (let i = 0; i < n; i++) {
        if (data[o + i] !== 0) {
          s += y[i];
          other[i] = 1;
        }
      }
      totals[q] = s;
    }
    let refTotal = 0;
    let refRows = 0;
    for (let i = 0; i < n; i++) {
      if (other[i]) continue;
      refTotal += y[i];
      refRows++;
    }
    if (refRows === 0 || refTotal > 0) return t;
    const q = cols.findIndex((_, k) => totals[k] > 0);
    if (q < 0) return t;
    const replacement = d.names[cols[q]].slice(t.column.length + 1);
    warnings.push({
      code: 'all-zero-level',
      message: `Every count at the reference level ${t.column}=${c.reference} is zero, so no effect can be measured against it; the reference was changed to ${t.column}=${replacement}.`,
    });
    changed = true;
    return { ...t, reference: replacement };
  });
  return { terms: out, warnings, changed };
}

/** Whether design column j is a 0/1 indicator of a factor level, a factor x factor cell or a site. */
function isIndicatorColumn(d: Design, j: number, coding: readonly TermCoding[], siteTerm: number): boolean {
  const t = d.termOf[j];
  if (t === siteTerm) return true;
  if (t < 0) return false;
  const c = coding[t];
  return c.kind === 'factor' || (c.kind === 'interaction' && c.parts[0].kind === 'factor' && c.parts[1].kind === 'factor');
}

export interface EmptyColumns {
  /** Column positions to drop. */
  readonly columns: number[];
  /** Row positions (into the design) to drop. */
  readonly rows: number[];
  readonly warnings: Warning[];
}

/** Indicator columns whose rows all have y = 0, and those rows. */
export function emptyIndicatorColumns(d: Design, y: Float64Array, coding: readonly TermCoding[], siteTerm: number, siteColumn?: string): EmptyColumns {
  const columns: number[] = [];
  const drop = new Set<number>();
  const warnings: Warning[] = [];
  for (let j = 0; j < d.p; j++) {
    if (!isIndicatorColumn(d, j, coding, siteTerm)) continue;
    const off = j * d.n;
    const { data, n } = d;
    let total = 0;
    let count = 0;
    for (let i = 0; i < n; i++) {
      if (data[off + i] !== 0) {
        total += y[i];
        count++;
      }
    }
    if (count === 0 || total > 0) continue;
    columns.push(j);
    for (let i = 0; i < d.n; i++) if (d.data[off + i] !== 0) drop.add(i);
    const isSite = d.termOf[j] === siteTerm;
    warnings.push({
      code: isSite ? 'all-zero-site' : 'all-zero-level',
      message: isSite
        ? `Every count at site "${d.names[j].slice((siteColumn ?? '').length + 1)}" (${count} row${count > 1 ? 's' : ''}) is zero, so its effect cannot be estimated (its rate is zero); those rows and its effect were left out of the fit.`
        : `Every count at ${d.names[j]} (${count} row${count > 1 ? 's' : ''}) is zero, so its effect cannot be estimated (its rate is zero); those rows and the coefficient "${d.names[j]}" were left out of the fit.`,
    });
  }
  return { columns, rows: [...drop].sort((a, b) => a - b), warnings };
}
