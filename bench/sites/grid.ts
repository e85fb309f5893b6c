/**
 * Invented site x season grids for the site-effect benchmark: negative
 * binomial counts (theta 2) with a site effect N(0.8, 0.9^2), a season
 * effect, a within-site covariate "cover" and an effort offset; a share of
 * the site-seasons missing at random. Seeded, so every run sees the same data.
 */
import { columnFromNumbers, columnFromTexts } from '../../src-shared/data/table';
import type { DataTable } from '../../src-shared/data/table';
import { createRng } from '../../src-shared/demo/prng';
import { sampleNegBinomial, sampleNormal } from '../../src-shared/demo/samplers';

export interface Grid {
  table: DataTable;
  csv: string;
}

export function makeGrid(sites: number, seasons: number, missing: number, seed = 7): Grid {
  const rng = createRng(seed + sites * 1000 + seasons);
  const siteEffect = Array.from({ length: sites }, () => sampleNormal(rng, 0.8, 0.9));
  const seasonEffect = Array.from({ length: seasons }, (_, t) => 0.02 * t + 0.15 * Math.sin(t));
  const site: string[] = [];
  const season: number[] = [];
  const cover: number[] = [];
  const effort: number[] = [];
  const count: number[] = [];
  for (let s = 0; s < sites; s++) {
    for (let t = 0; t < seasons; t++) {
      if (rng.uniform() < missing) continue;
      const c = Math.round(rng.uniform() * 1000) / 1000;
      const e = Math.round((0.5 + 2.5 * rng.uniform()) * 100) / 100;
      const mu = Math.exp(siteEffect[s] + seasonEffect[t] - 0.5 * c + Math.log(e));
      site.push(`P${String(s + 1).padStart(4, '0')}`);
      season.push(2001 + t);
      cover.push(c);
      effort.push(e);
      count.push(sampleNegBinomial(rng, mu, 2));
    }
  }
  const table: DataTable = {
    nrows: count.length,
    columns: [columnFromNumbers('count', count), columnFromNumbers('season', season), columnFromNumbers('cover', cover), columnFromNumbers('effort', effort), columnFromTexts('site', site)],
  };
  const lines = ['count,season,cover,effort,site'];
  for (let i = 0; i < count.length; i++) lines.push(`${count[i]},${season[i]},${cover[i]},${effort[i]},${site[i]}`);
  return { table, csv: lines.join('\n') + '\n' };
}
