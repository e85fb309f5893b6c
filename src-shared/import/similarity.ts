/**
 * Name similarity for spotting variant spellings of one site or species:
 * names are folded (case, surrounding and repeated spaces), then compared by
 * Jaro-Winkler similarity (Winkler 1990) and Levenshtein distance. Names
 * whose numbers differ ("Pond 12", "Pond 13") are never variants.
 */
export function foldName(name: string): string {
  return name.trim().replace(/\s+/g, ' ').toLowerCase();
}

export function levenshtein(a: string, b: string): number {
  if (a === b) return 0;
  if (a.length === 0) return b.length;
  if (b.length === 0) return a.length;
  let prev = new Array<number>(b.length + 1);
  let cur = new Array<number>(b.length + 1);
  for (let j = 0; j <= b.length; j++) prev[j] = j;
  for (let i = 1; i <= a.length; i++) {
    cur[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const cost = a.charCodeAt(i - 1) === b.charCodeAt(j - 1) ? 0 : 1;
      cur[j] = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + cost);
    }
    [prev, cur] = [cur, prev];
  }
  return prev[b.length];
}

/** Jaro similarity (0..1). */
export function jaro(a: string, b: string): number {
  if (a === b) return 1;
  if (!a.length || !b.length) return 0;
  const window = Math.max(0, Math.floor(Math.max(a.length, b.length) / 2) - 1);
  const aMatch = new Uint8Array(a.length);
  const bMatch = new Uint8Array(b.length);
  let matches = 0;
  for (let i = 0; i < a.length; i++) {
    const lo = Math.max(0, i - window);
    const hi = Math.min(b.length - 1, i + window);
    for (let j = lo; j <= hi; j++) {
      if (bMatch[j] || a[i] !== b[j]) continue;
      aMatch[i] = bMatch[j] = 1;
      matches++;
      break;
    }
  }
  if (!matches) return 0;
  let t = 0;
  let k = 0;
  for (let i = 0; i < a.length; i++) {
    if (!aMatch[i]) continue;
    while (!bMatch[k]) k++;
    if (a[i] !== b[k]) t++;
    k++;
  }
  return (matches / a.length + matches / b.length + (matches - t / 2) / matches) / 3;
}

/** Jaro-Winkler similarity with prefix scale 0.1 over up to 4 characters (the usual constants). */
export function jaroWinkler(a: string, b: string): number {
  const j = jaro(a, b);
  let prefix = 0;
  while (prefix < 4 && prefix < a.length && prefix < b.length && a[prefix] === b[prefix]) prefix++;
  return j + prefix * 0.1 * (1 - j);
}

function digits(s: string): string {
  return (s.match(/\d+/g) ?? []).join(' ');
}

/** The test on folded names (fa, fb) and their numbers (da, db). */
function foldedVariant(fa: string, fb: string, da: string, db: string): boolean {
  if (fa === fb) return true;
  if (da !== db) return false;
  if (Math.max(fa.length, fb.length) < 4 || Math.abs(fa.length - fb.length) > 2) return false;
  return jaroWinkler(fa, fb) >= 0.92 && levenshtein(fa, fb) <= 2;
}

/** Whether two names look like spellings of one name: equal when folded, or close (Jaro-Winkler >= 0.92 and at most 2 edits) with the same numbers. */
export function looksLikeVariant(a: string, b: string): boolean {
  const fa = foldName(a);
  const fb = foldName(b);
  return foldedVariant(fa, fb, digits(fa), digits(fb));
}

export interface VariantGroup {
  /** The spelling to keep: the most frequent (ties: the first seen). */
  readonly keep: string;
  /** The other spellings with how often each occurs. */
  readonly variants: readonly { readonly name: string; readonly count: number }[];
  readonly keepCount: number;
}

/** Groups names that look like variants of one another (counts = how often each spelling occurs). */
export function variantGroups(counts: ReadonlyMap<string, number>): VariantGroup[] {
  const names = [...counts.keys()].filter((n) => n.trim() !== '');
  const folded = names.map(foldName);
  const nums = folded.map(digits);
  const parent = names.map((_, i) => i);
  const find = (i: number): number => (parent[i] === i ? i : (parent[i] = find(parent[i])));
  for (let i = 0; i < names.length; i++) {
    for (let j = i + 1; j < names.length; j++) {
      if (foldedVariant(folded[i], folded[j], nums[i], nums[j])) parent[find(j)] = find(i);
    }
  }
  const groups = new Map<number, string[]>();
  names.forEach((n, i) => {
    const r = find(i);
    const g = groups.get(r);
    if (g) g.push(n);
    else groups.set(r, [n]);
  });
  const out: VariantGroup[] = [];
  for (const g of groups.values()) {
    if (g.length < 2) continue;
    const sorted = [...g].sort((a, b) => counts.get(b)! - counts.get(a)!);
    const keep = sorted[0];
    out.push({ keep, keepCount: counts.get(keep)!, variants: sorted.slice(1).map((name) => ({ name, count: counts.get(name)! })) });
  }
  return out;
}
