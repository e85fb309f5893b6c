import { describe, expect, it } from 'vitest';
import type { DataTable } from '@shared/data/table';
import { columnFromTexts } from '@shared/data/table';
import { parseModelSpec } from '@shared/model/spec';
import { compositeTrend } from '@shared/trend/composite';
import { simulateProgramme } from '@shared/trend/power-simulation';
import { analyseTrend } from '@shared/trend/trend-analysis';

// Composite index = weighted geometric mean of species indices (Buckland,
// Magurran, Green & Fewster 2005, Phil. Trans. R. Soc. B 360:243-254;
// Gregory et al. 2005, Phil. Trans. R. Soc. B 360:269-288). Seeded
// simulation: two species on the same 20 sites, one declining 6% a season,
// one rising 2%; the true composite log index at season t is
// t (log 0.94 + log 1.02) / 2.
function twoSpecies(): DataTable {
  const a = simulateProgramme({ sites: 20, seasons: 6, visits: 2, meanCount: 6, theta: 3, siteSd: 0.4, annualChange: -0.06, alpha: 0.05 }, 11);
  const b = simulateProgramme({ sites: 20, seasons: 6, visits: 2, meanCount: 4, theta: 3, siteSd: 0.4, annualChange: 0.02, alpha: 0.05 }, 12);
  const columns = a.columns.map((c, j) => columnFromTexts(c.name, [...c.texts, ...b.columns[j].texts]));
  return { nrows: a.nrows + b.nrows, columns: [...columns, columnFromTexts('species', [...Array(a.nrows).fill('A'), ...Array(b.nrows).fill('B')])] };
}
const spec = parseModelSpec({ response: 'count', distribution: 'negbin', site: { column: 'site', effect: 'fixed' }, time: { column: 'season', trend: 'annual' } });

describe('multi-species composite', () => {
  const table = twoSpecies();
  it('is the geometric mean of the species indices, with bootstrap limits covering the truth at the last season', async () => {
    const r = await compositeTrend(table, spec, 'species', { replicates: 40, seed: 7 });
    expect(r.species.map((s) => s.group)).toEqual(['A', 'B']);
    r.composite.indices.forEach((row, i) => {
      expect(row.index).toBeCloseTo(Math.sqrt(r.species[0].indices[i].index * r.species[1].indices[i].index), 9);
      if (i > 0) expect(row.lower).toBeLessThan(row.index), expect(row.upper).toBeGreaterThan(row.index);
    });
    const last = r.composite.indices[5];
    const truth = 100 * Math.exp((5 * (Math.log(0.94) + Math.log(1.02))) / 2);
    expect(last.lower).toBeLessThan(truth);
    expect(last.upper).toBeGreaterThan(truth);
    expect(r.composite.failedReplicates).toBe(0);
  });
  it('a zero weight leaves a species out: the composite is then the other species index', async () => {
    const r = await compositeTrend(table, spec, 'species', { replicates: 20, seed: 7, weights: { A: 1, B: 0 } });
    const alone = await analyseTrend({ ...table, ...onlySpecies(table, 'A') }, spec);
    r.composite.indices.forEach((row, i) => expect(row.index).toBeCloseTo(alone.indices[i].index, 8));
  });
  it('weights for an unknown species are named', async () => {
    await expect(compositeTrend(table, spec, 'species', { replicates: 20, weights: { C: 1 } })).rejects.toThrow(/"C"/);
  });
});

function onlySpecies(t: DataTable, key: string): DataTable {
  const sp = t.columns.find((c) => c.name === 'species')!;
  const rows = sp.texts.flatMap((s, i) => (s === key ? [i] : []));
  return { nrows: rows.length, columns: t.columns.map((c) => columnFromTexts(c.name, rows.map((i) => c.texts[i]))) };
}
