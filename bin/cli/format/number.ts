/** Numbers for reading, not for machines: fixed decimals in range, exponent form outside it. */
export function fmt(x: number | null | undefined, digits = 3): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '–';
  const a = Math.abs(x);
  if (a !== 0 && (a < 10 ** -digits || a >= 1e7)) return x.toExponential(2);
  return x.toFixed(digits);
}

/** A p-value: '< 1e-16' below double precision, otherwise 3 significant digits. */
export function fmtP(p: number): string {
  if (!Number.isFinite(p)) return '–';
  if (p < 1e-16) return '< 1e-16';
  if (p < 0.001) return p.toExponential(1);
  return p.toPrecision(2);
}

/** Pads cells into aligned columns: text columns left, number columns right. */
export function layoutColumns(rows: string[][], rightAligned: readonly boolean[]): string[] {
  const widths = rows[0].map((_c, j) => Math.max(...rows.map((r) => r[j].length)));
  return rows.map((r) => r.map((c, j) => (rightAligned[j] ? c.padStart(widths[j]) : c.padEnd(widths[j]))).join('  ').trimEnd());
}
