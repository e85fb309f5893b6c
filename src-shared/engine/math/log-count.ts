/**
 * log(y) for a count y: read from a table of the first TABLE_SIZE integers
 * (the same numbers Math.log gives), computed for other values. Deviance sums
 * take log(y) once per row per IRLS step, and counts are mostly small.
 */
const TABLE_SIZE = 4096;

const LOGS = Float64Array.from({ length: TABLE_SIZE }, (_, k) => Math.log(k));

export function logCount(y: number): number {
  return y < TABLE_SIZE && (y | 0) === y ? LOGS[y] : Math.log(y);
}
