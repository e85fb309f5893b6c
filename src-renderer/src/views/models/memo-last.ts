/**
 * A function that remembers its last call: same arguments (by identity),
 * same result. The Models stage's derived data (cleaned records, analysis
 * table) outlive the view this way, so coming back to the stage costs nothing.
 */
export function memoLast<A extends readonly unknown[], R>(fn: (...args: A) => R): (...args: A) => R {
  let last: { args: A; result: R } | null = null;
  return (...args: A) => {
    if (last && last.args.length === args.length && last.args.every((a, i) => a === args[i])) return last.result;
    const result = fn(...args);
    last = { args, result };
    return result;
  };
}
