/**
 * Site-block resampling: draw as many sites as there are, with replacement,
 * and keep every row of each drawn site (all its seasons and visits), so
 * that correlation within a site survives (the cluster bootstrap: Davison &
 * Hinkley 1997, Bootstrap Methods and their Application, section 3.8). A
 * site drawn twice enters as two sites (`pond7~1`, `pond7~2`), each with its
 * own site effect.
 */
import type { DataTable, TableColumn } from '../data/table';
import { requireColumn, selectRows, sortLevels } from '../data/table';
import type { Rng } from '../demo/prng';

/** Rows of each site (blank site cells belong to none), sites in sorted order. */
export function rowsBySite(table: DataTable, siteColumn: string): { sites: string[]; rows: number[][] } {
  const col = requireColumn(table, siteColumn);
  const map = new Map<string, number[]>();
  col.texts.forEach((t, i) => {
    if (t === '') return;
    const list = map.get(t);
    if (list) list.push(i);
    else map.set(t, [i]);
  });
  const sites = sortLevels([...map.keys()]);
  return { sites, rows: sites.map((s) => map.get(s)!) };
}

/** The sites of one replicate: as many draws as there are sites, with replacement (indices into `groups.sites`). */
export function drawSites(groups: { sites: string[] }, rng: Rng): number[] {
  const m = groups.sites.length;
  const picks: number[] = [];
  for (let k = 0; k < m; k++) picks.push(Math.min(m - 1, Math.floor(rng.uniform() * m)));
  return picks;
}

/** One resampled table; `groups` from rowsBySite (computed once for many replicates). */
export function resampleSites(table: DataTable, siteColumn: string, groups: { sites: string[]; rows: number[][] }, rng: Rng): DataTable {
  return tableOfSites(table, siteColumn, groups, drawSites(groups, rng));
}

/** The site label of draw k (0-based) of `site` in tableOfSites. */
function drawLabel(site: string, k: number): string {
  return `${site}~${k + 1}`;
}

/** Per-site values of the full data (e.g. site effects) under the labels tableOfSites gives the draws. */
export function valuesOfDraws(values: ReadonlyMap<string, number>, groups: { sites: string[] }, picks: readonly number[]): Map<string, number> {
  const out = new Map<string, number>();
  picks.forEach((s, k) => {
    const v = values.get(groups.sites[s]);
    if (v !== undefined) out.set(drawLabel(groups.sites[s], k), v);
  });
  return out;
}

/** The table of the drawn sites (`picks` from drawSites), each draw a site of its own. */
export function tableOfSites(table: DataTable, siteColumn: string, groups: { sites: string[]; rows: number[][] }, picks: readonly number[]): DataTable {
  const rows: number[] = [];
  const labels: string[] = [];
  picks.forEach((s, k) => {
    for (const r of groups.rows[s]) {
      rows.push(r);
      labels.push(drawLabel(groups.sites[s], k));
    }
  });
  const picked = selectRows(table, rows);
  const columns: TableColumn[] = picked.columns.map((c) => (c.name === siteColumn ? { name: c.name, texts: labels, values: new Float64Array(labels.length).fill(Number.NaN), numeric: false } : c));
  return { nrows: picked.nrows, columns };
}
