/**
 * Influence of each site on the fit: how much a chosen coefficient (say the
 * time slope) and the count-part coefficients as a whole move when the
 * site's records are left out, in the spirit of Cook's distance.
 *
 * Two ways, and the result says which was used:
 * - `one-step` (default, cheap): one Newton step from the full fit on the
 *   data without the site, delta = -(I - I_g)^-1 U_g, with U_g and I_g the
 *   score and observed information of the site's records at the full fit
 *   (the DFBETA of a cluster). Theta is held at its fitted value. Fixed
 *   site effects are profiled out (the left-out site's effect goes with
 *   it); random site effects likewise, as penalized effects with their
 *   normal prior's precision 1 / sd^2 added (the joint-mode view).
 *   Against exact refits (test/diagnostics/site-influence.test.ts) the
 *   changes agree to a few per cent of the largest change; the random case
 *   is checked only indirectly (against fixed-site refits, little shrinkage).
 * - `refit` (exact): the caller's refit function fits the model again
 *   without the site, so the caller decides where refits run (a worker pool).
 *
 * Cook's-style distance: D_g = delta' V^-1 delta / p over the count-part
 * coefficients, with V the fit's covariance of them.
 */
import { CholeskyDecomposition, Matrix, solve } from 'ml-matrix';
import type { DataTable } from '../data/table';
import { findColumn, selectRows, sortLevels } from '../data/table';
import { FitCancelled } from '../engine/types';
import type { FitOutcome } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import { hasZeroPart } from '../model/spec';
import type { DiagnosticsControl } from './cancellable';
import { checkCancelled, reportProgress } from './cancellable';
import { countPartTerms, designColumns } from './design-columns';
import { DiagnosticsInputError, fittedDistribution } from './fitted-distribution';
import { observationDerivatives } from './observation-derivatives';

export type InfluenceMethod = 'one-step' | 'refit';

export interface SiteInfluenceRow {
  readonly site: string;
  /** Table rows of the site's records. */
  readonly rows: number[];
  /** The chosen coefficient without this site (null when it cannot be estimated without it). */
  readonly estimateWithout: number | null;
  /** estimateWithout - estimate. */
  readonly change: number | null;
  /** change / SE of the coefficient (a DFBETAS). */
  readonly scaledChange: number | null;
  readonly cooksDistance: number | null;
  /** Why a value is missing, else null. */
  readonly problem: string | null;
}

export interface SiteInfluence {
  readonly coefficient: string;
  readonly estimate: number;
  readonly se: number;
  readonly siteColumn: string;
  readonly method: InfluenceMethod;
  /** One sentence on how the changes were computed. */
  readonly methodNote: string;
  readonly sites: SiteInfluenceRow[];
}

export interface SiteInfluenceOptions {
  /** The coefficient to follow, by its published term name (e.g. "year"). */
  readonly coefficient: string;
  /** Column that names the sites (default the spec's site column). */
  readonly siteColumn?: string;
  readonly control?: DiagnosticsControl;
}

/** Fits the spec to a table (the records of every other site); may run elsewhere. */
export type RefitFunction = (table: DataTable, spec: ModelSpec, leftOut: string) => FitOutcome | Promise<FitOutcome>;

export interface RefitInfluenceOptions extends SiteInfluenceOptions {
  readonly refit: RefitFunction;
  /** Refits asked for at once (default 2). */
  readonly concurrency?: number;
}

export const ONE_STEP_NOTE =
  'Approximate: one Newton step from the full fit without the site (score and observed information of its records), theta held fixed; site effects profiled out (random ones as penalized effects).';
export const REFIT_NOTE = 'Exact: the model was refitted without each site in turn.';

interface Setup {
  siteColumn: string;
  siteNames: string[];
  /** Per used row: index into siteNames. */
  siteOf: Int32Array;
  coefIndex: number;
  estimate: number;
  se: number;
  /** Inverse of the covariance of the count-part coefficients, p x p. */
  vInverse: Matrix;
}

function setup(table: DataTable, spec: ModelSpec, fit: FitOutcome, options: SiteInfluenceOptions): Setup {
  const siteColumn = options.siteColumn ?? spec.site?.column;
  if (!siteColumn) throw new DiagnosticsInputError('no-site', 'Name the column that identifies the sites: the model spec has no site term.');
  const col = findColumn(table, siteColumn);
  if (!col) throw new DiagnosticsInputError('missing-column', `There is no site column "${siteColumn}". The columns are: ${table.columns.map((c) => `"${c.name}"`).join(', ')}.`);
  const coefIndex = fit.betaNames.indexOf(options.coefficient);
  if (coefIndex < 0) {
    throw new DiagnosticsInputError('unknown-coefficient', `The model has no coefficient "${options.coefficient}"; its coefficients are ${fit.betaNames.map((b) => `"${b}"`).join(', ')}.`);
  }
  const texts = Array.from(fit.rows, (r) => col.texts[r]);
  const siteNames = sortLevels([...new Set(texts)]);
  const index = new Map(siteNames.map((s, k) => [s, k]));
  const siteOf = Int32Array.from(texts, (t) => index.get(t) as number);
  const p = fit.beta.length;
  const k = p + fit.gamma.length;
  const v = new Matrix(p, p);
  for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) v.set(a, b, fit.covariance[b * k + a]);
  const se = Math.sqrt(v.get(coefIndex, coefIndex));
  let vInverse: Matrix;
  try {
    vInverse = solve(v, Matrix.eye(p));
  } catch {
    vInverse = Matrix.zeros(p, p);
  }
  return { siteColumn, siteNames, siteOf, coefIndex, estimate: fit.beta[coefIndex], se, vInverse };
}

/** Cook's-style distance over the coefficients given (indices into beta); null when none. */
function cooks(s: Setup, delta: Float64Array, which: readonly number[]): number | null {
  if (!which.length) return null;
  let d = 0;
  for (const a of which) for (const b of which) d += delta[a] * s.vInverse.get(a, b) * delta[b];
  return Number.isFinite(d) ? Math.max(0, d) / which.length : null;
}

function rowsOfSites(fit: FitOutcome, s: Setup): number[][] {
  const out: number[][] = s.siteNames.map(() => []);
  s.siteOf.forEach((g, i) => out[g].push(fit.rows[i]));
  return out;
}

function influenceRow(s: Setup, site: string, rows: number[], delta: Float64Array | null, cookOver: readonly number[], problem: string | null): SiteInfluenceRow {
  const change = delta ? delta[s.coefIndex] : null;
  const ok = change !== null && Number.isFinite(change);
  return {
    site,
    rows,
    estimateWithout: ok ? s.estimate + (change as number) : null,
    change: ok ? change : null,
    scaledChange: ok && s.se > 0 ? (change as number) / s.se : null,
    cooksDistance: ok && delta ? cooks(s, delta, cookOver) : null,
    problem: ok ? null : (problem ?? 'The coefficient cannot be estimated without this site.'),
  };
}

/** Columns of X (n x p) that are constant within every site: absorbed by fixed site effects. */
function absorbedColumns(X: Float64Array, n: number, p: number, siteOf: Int32Array, sites: number): Set<number> {
  const out = new Set<number>();
  for (let j = 0; j < p; j++) {
    const first = new Float64Array(sites).fill(Number.NaN);
    let constant = true;
    for (let i = 0; i < n && constant; i++) {
      const v = X[j * n + i];
      const g = siteOf[i];
      if (Number.isNaN(first[g])) first[g] = v;
      else if (Math.abs(first[g] - v) > 1e-12 * (1 + Math.abs(v))) constant = false;
    }
    if (constant) out.add(j);
  }
  return out;
}

/** The one-step (DFBETA-style) approximation; see the module comment. */
export function siteInfluenceOneStep(table: DataTable, spec: ModelSpec, fit: FitOutcome, options: SiteInfluenceOptions): SiteInfluence {
  const s = setup(table, spec, fit, options);
  const dist = fittedDistribution(fit);
  const n = dist.n;
  const p = fit.beta.length;
  const q = fit.gamma.length;
  const withZero = hasZeroPart(dist.distribution);
  const X = designColumns(table, fit.rows, fit.betaNames, countPartTerms(table, spec, fit.rows), 'count-part');
  const Z = q ? designColumns(table, fit.rows, fit.gammaNames, spec.zeroPredictors, 'zero-part') : new Float64Array(0);
  const G = s.siteNames.length;
  const ownSites = spec.site !== undefined && s.siteColumn === spec.site.column;
  const fixed = ownSites && spec.site?.effect === 'fixed';
  // Random site effects are profiled like fixed ones but with their normal prior's precision added
  // (the joint-mode view of the random-intercept model); other site columns are not profiled.
  const sd = fit.summary.random?.sd;
  const randomPrecision = ownSites && spec.site?.effect === 'random' && sd !== undefined && sd > 0 ? 1 / (sd * sd) : null;
  const profiled = fixed || randomPrecision !== null;
  const absorbed = fixed ? absorbedColumns(X, n, p, s.siteOf, G) : new Set<number>();
  if (absorbed.has(s.coefIndex)) {
    throw new DiagnosticsInputError('absorbed-coefficient', `The coefficient "${options.coefficient}" does not vary within sites, so with fixed site effects leaving a site out cannot be approximated for it; use refits.`);
  }
  // Parameters followed: the count columns not absorbed, then the zero part.
  const active = Array.from({ length: p }, (_, j) => j).filter((j) => !absorbed.has(j));
  const m = active.length + q;
  const U = Array.from({ length: G }, () => new Float64Array(m));
  const I = Array.from({ length: G }, () => new Float64Array(m * m));
  const b = Array.from({ length: G }, () => new Float64Array(m));
  const c = new Float64Array(G);
  const J = new Float64Array(2 * m); // row i's derivatives of (eta, zeta) by each parameter
  for (let i = 0; i < n; i++) {
    if (i % 256 === 0) checkCancelled(options.control);
    const g = s.siteOf[i];
    active.forEach((j, a) => (J[a] = X[j * n + i]));
    for (let a = 0; a < q; a++) J[m + active.length + a] = Z[a * n + i];
    const d = observationDerivatives(dist, i, fit.y[i], withZero);
    const [iee, iez, izz] = d.info;
    const Ug = U[g];
    const Ig = I[g];
    const bg = b[g];
    for (let a = 0; a < m; a++) {
      const xa = J[a];
      const za = J[m + a];
      Ug[a] += xa * d.g[0] + za * d.g[1];
      bg[a] += xa * iee + za * iez;
      for (let e = 0; e < m; e++) Ig[e * m + a] += xa * iee * J[e] + (xa * J[m + e] + za * J[e]) * iez + za * izz * J[m + e];
    }
    c[g] += iee;
  }
  // Whole-data information (profiled over fixed site effects), then minus each site's part.
  const site = (g: number) => {
    const out = Float64Array.from(I[g]);
    const cg = c[g] + (randomPrecision ?? 0);
    if (profiled && cg > 0) for (let a = 0; a < m; a++) for (let e = 0; e < m; e++) out[e * m + a] -= (b[g][a] * b[g][e]) / cg;
    return out;
  };
  const parts = Array.from({ length: G }, (_, g) => site(g));
  const total = new Float64Array(m * m);
  for (const part of parts) for (let k = 0; k < m * m; k++) total[k] += part[k];
  const siteRows = rowsOfSites(fit, s);
  const sites = s.siteNames.map((name, g) => {
    reportProgress(options.control, g / G, 'site influence');
    const M = new Matrix(m, m);
    for (let a = 0; a < m; a++) for (let e = 0; e < m; e++) M.set(a, e, total[e * m + a] - parts[g][e * m + a]);
    const chol = new CholeskyDecomposition(M);
    if (!chol.isPositiveDefinite()) return influenceRow(s, name, siteRows[g], null, [], 'Without this site the model cannot be estimated (a level or predictor occurs only there).');
    const step = chol.solve(Matrix.columnVector(Array.from(U[g]))).to1DArray();
    const delta = new Float64Array(p).fill(Number.NaN);
    active.forEach((j, a) => (delta[j] = -step[a]));
    return influenceRow(s, name, siteRows[g], delta, active, null);
  });
  reportProgress(options.control, 1, 'site influence');
  return { coefficient: options.coefficient, estimate: s.estimate, se: s.se, siteColumn: s.siteColumn, method: 'one-step', methodNote: ONE_STEP_NOTE, sites };
}

/** Exact leave-one-site-out refits through the caller's refit function. */
export async function siteInfluenceByRefit(table: DataTable, spec: ModelSpec, fit: FitOutcome, options: RefitInfluenceOptions): Promise<SiteInfluence> {
  const s = setup(table, spec, fit, options);
  const siteRows = rowsOfSites(fit, s);
  const G = s.siteNames.length;
  const results: SiteInfluenceRow[] = new Array(G);
  let next = 0;
  let done = 0;
  const one = async (g: number): Promise<void> => {
    checkCancelled(options.control);
    const leftOut = new Set(siteRows[g]);
    const keep = Array.from(fit.rows).filter((r) => !leftOut.has(r));
    const name = s.siteNames[g];
    try {
      const without = await options.refit(selectRows(table, keep), spec, name);
      const delta = new Float64Array(fit.beta.length).fill(Number.NaN);
      const common: number[] = [];
      fit.betaNames.forEach((nm, j) => {
        const k = without.betaNames.indexOf(nm);
        if (k >= 0) {
          delta[j] = without.beta[k] - fit.beta[j];
          common.push(j);
        }
      });
      const problem = without.summary.converged ? null : 'The refit without this site did not converge.';
      results[g] = influenceRow(s, name, siteRows[g], problem ? null : delta, common, problem);
    } catch (e) {
      if (e instanceof FitCancelled) throw e;
      const why = e instanceof Error ? e.message : String(e);
      results[g] = influenceRow(s, name, siteRows[g], null, [], `The model could not be refitted without this site: ${why}`);
    }
    done++;
    reportProgress(options.control, done / G, 'site influence');
  };
  const worker = async () => {
    while (next < G) await one(next++);
  };
  const lanes = Math.max(1, Math.min(G, options.concurrency ?? 2));
  await Promise.all(Array.from({ length: lanes }, worker));
  return { coefficient: options.coefficient, estimate: s.estimate, se: s.se, siteColumn: s.siteColumn, method: 'refit', methodNote: REFIT_NOTE, sites: results };
}

/** Refits when a refit function is given, else the one-step approximation. */
export async function siteInfluence(
  table: DataTable,
  spec: ModelSpec,
  fit: FitOutcome,
  options: SiteInfluenceOptions & { refit?: RefitFunction; concurrency?: number },
): Promise<SiteInfluence> {
  if (options.refit) return siteInfluenceByRefit(table, spec, fit, { ...options, refit: options.refit });
  return siteInfluenceOneStep(table, spec, fit, options);
}
