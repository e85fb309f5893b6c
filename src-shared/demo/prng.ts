/**
 * A small seeded pseudo-random generator for the demo programme and for
 * seeded simulation tests: mulberry32 (32-bit state, period 2^32), which is
 * plenty for a few thousand draws per run and reproducible everywhere.
 */
export interface Rng {
  /** A uniform number strictly between 0 and 1. */
  uniform(): number;
}

/** mulberry32 from a 32-bit seed. */
export function createRng(seed: number): Rng {
  let state = seed >>> 0;
  return {
    uniform(): number {
      state = (state + 0x6d2b79f5) >>> 0;
      let t = state;
      t = Math.imul(t ^ (t >>> 15), t | 1);
      t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
      const bits = (t ^ (t >>> 14)) >>> 0;
      // (bits + 0.5) / 2^32 keeps the value away from 0 and 1, so log(u) is finite.
      return (bits + 0.5) / 4294967296;
    },
  };
}

/**
 * A seed for an independent stream, derived from a base seed and a label
 * (FNV-1a over the seed's bytes and the label's, then a final mix), so that adding draws to one
 * stream (say the mess planted in the sheets) never shifts another (the counts).
 */
export function deriveSeed(seed: number, label: string): number {
  let h = 0x811c9dc5;
  const mix = (byte: number) => {
    h ^= byte & 0xff;
    h = Math.imul(h, 0x01000193) >>> 0;
  };
  const s = seed >>> 0;
  for (let shift = 0; shift < 32; shift += 8) mix(s >>> shift);
  for (let i = 0; i < label.length; i++) {
    const code = label.charCodeAt(i);
    mix(code);
    mix(code >>> 8);
  }
  // Final avalanche (the 32-bit finaliser of MurmurHash3).
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b) >>> 0;
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35) >>> 0;
  h ^= h >>> 16;
  return h >>> 0;
}

/** A whole number from lo to hi inclusive. */
export function intBetween(rng: Rng, lo: number, hi: number): number {
  return lo + Math.floor(rng.uniform() * (hi - lo + 1));
}

/** One element of a non-empty list, each equally likely. */
export function pick<T>(rng: Rng, items: readonly T[]): T {
  if (items.length === 0) throw new RangeError('pick() needs at least one item to choose from.');
  return items[Math.floor(rng.uniform() * items.length)];
}

/** One element chosen with the given (non-negative, not all zero) weights. */
export function pickWeighted<T>(rng: Rng, items: readonly { value: T; weight: number }[]): T {
  const total = items.reduce((s, it) => s + it.weight, 0);
  if (!(total > 0)) throw new RangeError('pickWeighted() needs weights that add up to more than 0.');
  let u = rng.uniform() * total;
  for (const it of items) {
    u -= it.weight;
    if (u < 0) return it.value;
  }
  return items[items.length - 1].value;
}
