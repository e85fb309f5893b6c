/** The composite's point value: the weighted mean of the species' log indices over shared seasons. */
import { TrendError } from './errors';
import type { LogIndices } from './indices';

/** Weighted mean of log indices over species that share the seasons; weights default to 1. */
export function compositeLog(species: readonly { key: string; log: LogIndices }[], weights: Readonly<Record<string, number>> = {}): Float64Array {
  if (species.length === 0) throw new TrendError('no-species', 'A composite index needs at least one species.');
  const levels = species[0].log.time.levels;
  const out = new Float64Array(levels.length);
  let total = 0;
  for (const s of species) {
    const w = weights[s.key] ?? 1;
    if (!(w >= 0 && Number.isFinite(w))) throw new TrendError('bad-weight', `The weight of "${s.key}" must be a number of at least 0, not ${w}.`);
    total += w;
    levels.forEach((l, i) => {
      const j = s.log.time.levels.indexOf(l);
      if (j < 0) throw new TrendError('species-missing-season', `The species "${s.key}" has no rows in season ${l}, so it cannot enter a composite over that season. Leave the species out or restrict the seasons.`);
      out[i] += w * s.log.log[j];
    });
  }
  if (!(total > 0)) throw new TrendError('bad-weight', 'The species weights add up to 0; give at least one species a positive weight.');
  for (let i = 0; i < out.length; i++) out[i] /= total;
  return out;
}
