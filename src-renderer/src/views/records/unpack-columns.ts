import type { PackedColumn } from '@shared/host/contract';

/** A packed column from the bridge back to one value per record (see the contract). */
export function unpackColumn(c: PackedColumn, n: number): (string | number | null)[] {
  if (n === 0) return [];
  if ('numbers' in c) return c.numbers.split(',').map((t) => (t === '' ? null : Number(t)));
  return c.codes.split(',').map((t) => {
    const k = Number(t);
    return k < 0 ? null : c.levels[k];
  });
}
