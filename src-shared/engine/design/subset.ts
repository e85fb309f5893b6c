import type { Design } from '../types';

/** The design restricted to the given row positions and column positions (both in order). */
export function subsetDesign(d: Design, rows: readonly number[] | null, cols: readonly number[] | null): Design {
  const rr = rows ?? null;
  const cc = cols ?? Array.from({ length: d.p }, (_, j) => j);
  const n = rr ? rr.length : d.n;
  const data = new Float64Array(n * cc.length);
  cc.forEach((j, k) => {
    const src = d.data.subarray(j * d.n, (j + 1) * d.n);
    if (!rr) data.set(src, k * n);
    else for (let i = 0; i < n; i++) data[k * n + i] = src[rr[i]];
  });
  return { n, p: cc.length, data, names: cc.map((j) => d.names[j]), termOf: cc.map((j) => d.termOf[j]) };
}

/** Appends columns (column-major, same rows) in front of a design. */
export function prependColumns(d: Design, data: Float64Array, names: readonly string[], termOf: number): Design {
  const k = names.length;
  const out = new Float64Array(d.n * (k + d.p));
  out.set(data.subarray(0, d.n * k), 0);
  out.set(d.data, d.n * k);
  return { n: d.n, p: k + d.p, data: out, names: [...names, ...d.names], termOf: [...names.map(() => termOf), ...d.termOf] };
}
