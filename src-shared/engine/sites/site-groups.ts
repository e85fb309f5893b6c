/**
 * Rows grouped by site: a stable ordering of the rows by site index and the
 * boundaries of each site's block (the rows of site s are
 * order[start[s]] .. order[start[s + 1] - 1]).
 */
export function groupBySite(site: Int32Array, nSites: number): { order: Int32Array; start: Int32Array } {
  const start = new Int32Array(nSites + 1);
  for (let i = 0; i < site.length; i++) start[site[i] + 1]++;
  for (let s = 0; s < nSites; s++) start[s + 1] += start[s];
  const fill = start.slice(0, nSites);
  const order = new Int32Array(site.length);
  for (let i = 0; i < site.length; i++) order[fill[site[i]]++] = i;
  return { order, start };
}

/** The numbers every site-effect fitter starts from. */
export interface SiteRows {
  readonly y: Float64Array;
  /** Column-major n x p covariates. */
  readonly x: Float64Array;
  readonly n: number;
  readonly p: number;
  /** Offset per row (log scale), or null. */
  readonly offset: Float64Array | null;
  /** Site index per row, 0..nSites-1. */
  readonly site: Int32Array;
  readonly nSites: number;
}
