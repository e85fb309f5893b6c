/**
 * Mean and variance of the counts by site, the first look at overdispersion:
 * Poisson counts have variance = mean; negative-binomial counts
 * variance = mean + mean^2 / theta. With an effort column the counts are
 * taken per unit effort, and the reference curves are scaled to the mean
 * effort per record e: Poisson var = m / e, negative binomial
 * var = m / e + m^2 / theta (common practice; exact only when effort is equal).
 */
import type { DataTable } from '../data/table';
import { findColumn, sortLevels } from '../data/table';
import type { FitForDiagnostics } from './fitted-distribution';
import { DiagnosticsInputError } from './fitted-distribution';

export interface SiteMoments {
  readonly site: string;
  readonly n: number;
  readonly mean: number;
  /** Sample variance (divisor n - 1). */
  readonly variance: number;
  /** Table rows of the site's records. */
  readonly rows: number[];
}

export interface CurvePoint {
  readonly mean: number;
  readonly variance: number;
}

export interface MeanVariance {
  readonly siteColumn: string;
  readonly effortColumn: string | null;
  readonly sites: SiteMoments[];
  /** Sites with a single record (no variance), left out of `sites`. */
  readonly singleRecordSites: string[];
  readonly poisson: CurvePoint[];
  /** The fitted negative-binomial curve; null without a theta. */
  readonly negbin: CurvePoint[] | null;
  readonly theta: number | null;
  /** Mean effort per record used to scale the curves (1 without an effort column). */
  readonly meanEffort: number;
}

export interface MeanVarianceOptions {
  readonly siteColumn: string;
  /** Divide each count by this column (e.g. hours of effort). */
  readonly effortColumn?: string;
  /** Points on each reference curve (default 40). */
  readonly curvePoints?: number;
}

function column(table: DataTable, name: string, what: string) {
  const col = findColumn(table, name);
  if (!col) {
    const names = table.columns.map((c) => `"${c.name}"`).join(', ');
    throw new DiagnosticsInputError('missing-column', `There is no ${what} column "${name}". The columns are: ${names}.`);
  }
  return col;
}

/** Means spaced evenly on the log scale across the sites' means (linear from 0 when the smallest is 0). */
function meanGrid(sites: readonly SiteMoments[], points: number): number[] {
  const means = sites.map((s) => s.mean).filter((m) => m > 0);
  if (!means.length) return [];
  const lo = Math.min(...means);
  const hi = Math.max(...means);
  if (hi === lo) return [lo];
  return Array.from({ length: points }, (_, k) => lo * Math.pow(hi / lo, k / (points - 1)));
}

export function meanVarianceBySite(table: DataTable, fit: FitForDiagnostics, options: MeanVarianceOptions): MeanVariance {
  const siteCol = column(table, options.siteColumn, 'site');
  const effortCol = options.effortColumn ? column(table, options.effortColumn, 'effort') : null;
  const groups = new Map<string, number[]>();
  let effortSum = 0;
  for (let i = 0; i < fit.rows.length; i++) {
    const r = fit.rows[i];
    const site = siteCol.texts[r];
    if (site === '') throw new DiagnosticsInputError('blank-site', `Column "${siteCol.name}" is blank in data row ${r + 1}; fill in the site or leave the record out of the fit.`);
    if (effortCol) {
      const e = effortCol.values[r];
      if (!(e > 0)) {
        throw new DiagnosticsInputError('bad-effort', `The effort column "${effortCol.name}" must hold a positive number, but data row ${r + 1} holds "${effortCol.texts[r]}". Correct the cell or leave the record out.`);
      }
      effortSum += e;
    }
    const g = groups.get(site);
    if (g) g.push(i);
    else groups.set(site, [i]);
  }
  const sites: SiteMoments[] = [];
  const singleRecordSites: string[] = [];
  for (const site of sortLevels([...groups.keys()])) {
    const idx = groups.get(site) as number[];
    if (idx.length < 2) {
      singleRecordSites.push(site);
      continue;
    }
    const values = idx.map((i) => fit.y[i] / (effortCol ? effortCol.values[fit.rows[i]] : 1));
    const mean = values.reduce((s, v) => s + v, 0) / values.length;
    const variance = values.reduce((s, v) => s + (v - mean) * (v - mean), 0) / (values.length - 1);
    sites.push({ site, n: idx.length, mean, variance, rows: idx.map((i) => fit.rows[i]) });
  }
  const meanEffort = effortCol ? effortSum / fit.rows.length : 1;
  const grid = meanGrid(sites, options.curvePoints ?? 40);
  const theta = fit.theta;
  return {
    siteColumn: siteCol.name,
    effortColumn: effortCol ? effortCol.name : null,
    sites,
    singleRecordSites,
    poisson: grid.map((m) => ({ mean: m, variance: m / meanEffort })),
    negbin: theta !== null && theta > 0 ? grid.map((m) => ({ mean: m, variance: m / meanEffort + (m * m) / theta })) : null,
    theta,
    meanEffort,
  };
}
