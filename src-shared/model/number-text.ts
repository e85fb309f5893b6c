/** Numbers as the Models stage shows them: never NaN, "—" where a value does not apply. */
export function fmt(v: number | null | undefined, digits = 4): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  const a = Math.abs(v);
  if (a !== 0 && (a >= 1e6 || a < 1e-3)) return v.toExponential(2);
  if (a >= 1000) return v.toFixed(1);
  return Number(v.toPrecision(digits)).toString();
}

/** A p-value: "< 0.001" below a thousandth; with `relation`, "= 0.03" / "< 0.001". */
export function fmtP(p: number | null | undefined, relation = false): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return '—';
  if (p < 0.001) return '< 0.001';
  const s = p < 0.01 ? p.toFixed(3) : p.toFixed(2);
  return relation ? `= ${s}` : s;
}
