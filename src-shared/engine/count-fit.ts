/**
 * Poisson, quasi-Poisson and negative binomial (NB2) fits of a spec, with
 * fixed site effects as dense dummy columns (one per site, no intercept).
 *
 * Choices, for the record:
 * - Fixed sites: the site effects are the per-site intercepts; they are not
 *   listed among the coefficients but returned in `siteEffects`.
 * - Null deviance: the intercept-only model with the same offsets (and, for
 *   the negative binomial, the final theta), also when sites are fixed.
 * - `df` counts the mean parameters (site effects included) plus theta for
 *   the negative binomial, also when theta is on its boundary.
 * - `dispersion` (Pearson chi-square / df residual) is given for every
 *   family; only quasi-Poisson scales its SEs by it.
 * - `iterations`: IRLS steps in all (for the negative binomial, over every
 *   alternation with theta).
 * - Boundary theta (no overdispersion): theta null, alpha 0, the Poisson fit.
 */
import type { DataTable } from '../data/table';
import { requireColumn } from '../data/table';
import type { FitSummary } from '../model/fit-result';
import type { ModelSpec } from '../model/spec';
import { findAliased } from './design/aliasing';
import { aliasedWarning, buildDesign, termLabel } from './design/build';
import { emptyIndicatorColumns, moveEmptyReferences } from './design/empty-levels';
import { prependColumns, subsetDesign } from './design/subset';
import { negbinFamily } from './families/negbin';
import { poissonFamily, quasiPoissonFamily } from './families/poisson';
import type { Family } from './families/types';
import { frameOptions, modelFrame } from './frame';
import { clusterIndex, clusterSandwich } from './inference/sandwich';
import { informationCriteria, logLikelihood, pearsonChi2, totalDeviance } from './inference/likelihood';
import { scaleCovariance, waldRows } from './inference/wald';
import { irls } from './irls';
import { nullModelMeans } from './null-model';
import type { ColumnStructure } from './linalg/dense';
import { columnStructure } from './linalg/dense';
import { countTerms } from './model-terms';
import { fitNegbin } from './negbin/fit';
import { sanitizeSummary, warningSentences } from './summary';
import type { Design, FitControl, FitOutcome, Warning } from './types';
import { FitInputError, wantsInference } from './types';

/** termOf value of fixed-site dummy columns. */
const SITE_TERM = -2;

/** Below this many sites clustered SEs are unreliable (the few-clusters problem, Cameron & Miller 2015). */
const FEW_CLUSTERS = 20;

interface Prepared {
  design: Design;
  y: Float64Array;
  offset: Float64Array;
  rows: number[];
  warnings: Warning[];
  siteLevels: string[] | null;
  siteOfRow: Int32Array | null;
  /** The final design's column structure, computed once for every product with it. */
  structure: ColumnStructure;
}

function allZero(): FitInputError {
  return new FitInputError('all-zero', 'Every count in the rows used is zero, so no rate can be estimated. Check the response column and the rows selected.');
}

function siteDummies(table: DataTable, column: string, rows: readonly number[]): { data: Float64Array; names: string[]; levels: string[]; index: Int32Array } {
  const texts = requireColumn(table, column).texts;
  const { index, levels } = clusterIndex(rows.map((r) => texts[r]));
  const n = rows.length;
  const data = new Float64Array(n * levels.length);
  for (let i = 0; i < n; i++) data[index[i] * n + i] = 1;
  return { data, names: levels.map((l) => `${column}=${l}`), levels, index };
}

function prepare(table: DataTable, spec: ModelSpec): Prepared {
  const frame = modelFrame(table, frameOptions(spec));
  const warnings: Warning[] = [...frame.warnings];
  if (frame.y.every((v) => v === 0)) throw allZero();
  const siteFixed = spec.site?.effect === 'fixed';
  let terms = countTerms(table, spec, frame.rows);
  const build = () => buildDesign(table, terms, { intercept: !siteFixed, rows: frame.rows, dropAliased: false });
  let built = build();
  const moved = moveEmptyReferences(built.design, frame.y, terms, built.levels);
  if (moved.changed) {
    warnings.push(...moved.warnings);
    terms = moved.terms;
    built = build();
  }
  warnings.push(...built.warnings);
  let design = built.design;
  let siteLevels: string[] | null = null;
  let siteIdx: Int32Array | null = null;
  if (siteFixed) {
    const s = siteDummies(table, spec.site!.column, frame.rows);
    design = prependColumns(design, s.data, s.names, SITE_TERM);
    siteLevels = s.levels;
    siteIdx = s.index;
  }

  // Levels, cells and sites with only zero counts: drop their rows and column.
  let y = frame.y;
  let offset = frame.offset;
  let rows = frame.rows;
  // Repeated, since leaving rows out can leave another level with only zeros.
  for (let round = 0; round < 10; round++) {
    const empty = emptyIndicatorColumns(design, y, built.levels, SITE_TERM, spec.site?.column);
    if (!empty.columns.length) break;
    warnings.push(...empty.warnings);
    const dropRows = new Set(empty.rows);
    const keepRows = rows.map((_, i) => i).filter((i) => !dropRows.has(i));
    const keepCols = design.names.map((_, j) => j).filter((j) => !empty.columns.includes(j));
    design = subsetDesign(design, keepRows, keepCols);
    y = Float64Array.from(keepRows, (i) => y[i]);
    offset = Float64Array.from(keepRows, (i) => offset[i]);
    rows = keepRows.map((i) => rows[i]);
    if (siteIdx) {
      const idx = siteIdx;
      const keptSites = siteLevels!.map((_, g) => g).filter((g) => !empty.columns.includes(g));
      const remap = new Int32Array(siteLevels!.length).fill(-1);
      keptSites.forEach((g, k) => (remap[g] = k));
      siteIdx = Int32Array.from(keepRows, (i) => remap[idx[i]]);
      siteLevels = keptSites.map((g) => siteLevels![g]);
    }
    if (rows.length === 0) throw allZero();
  }

  // Aliased columns (later ones dropped; site columns come first and are kept).
  let structure = columnStructure(design.data, design.n, design.p);
  const aliased = findAliased(design.data, design.n, design.p, undefined, structure);
  if (aliased.length) {
    for (const j of aliased) {
      const t = design.termOf[j];
      const label = t === -1 ? 'intercept' : t === SITE_TERM ? `site ${spec.site!.column}` : termLabel(terms[t]);
      const note = t >= 0 && siteFixed ? ' (with fixed site effects, a predictor that does not vary within sites is absorbed by them)' : '';
      warnings.push(aliasedWarning(design.names[j], label, note));
    }
    design = subsetDesign(design, null, design.names.map((_, j) => j).filter((j) => !aliased.includes(j)));
    structure = columnStructure(design.data, design.n, design.p);
  }
  if (design.p === 0) throw new FitInputError('empty-model', 'The model has no column left to estimate. Add a predictor or the intercept.');
  if (design.n <= design.p) {
    throw new FitInputError('too-few-rows', `The model has ${design.p} coefficients but only ${design.n} usable rows. Use fewer predictors or more data.`);
  }
  return { design, y, offset, rows, warnings, siteLevels, siteOfRow: siteIdx, structure };
}

/** Fits a Poisson, quasi-Poisson or negative binomial model of the spec. */
export function fitCountGlm(table: DataTable, spec: ModelSpec, control: FitControl = {}): FitOutcome {
  const dist = spec.distribution;
  if (dist !== 'poisson' && dist !== 'quasipoisson' && dist !== 'negbin') {
    throw new FitInputError('wrong-distribution', `fitCountGlm fits poisson, quasipoisson and negbin, not ${dist}.`);
  }
  control.onProgress?.(0, 'design');
  const prep = prepare(table, spec);
  const { design, y, offset } = prep;
  const { n, p } = design;
  const hasOffset = spec.offsets.length > 0;
  const off = hasOffset ? offset : null;
  const warnings = [...prep.warnings];
  const inference = wantsInference(control);

  let family: Family;
  let fit;
  let theta: number | null = null;
  let boundary = false;
  let iterations: number;
  let converged: boolean;
  let nbLogLik: number | null = null;
  if (dist === 'negbin') {
    const nb = fitNegbin({ x: design.data, n, p, y, offset: off, control, structure: prep.structure, covariance: inference });
    fit = nb.irls;
    theta = nb.theta;
    boundary = nb.boundary;
    family = nb.boundary ? poissonFamily : negbinFamily(nb.theta!);
    iterations = nb.iterations;
    converged = nb.converged;
    nbLogLik = nb.logLik;
    warnings.push(...nb.warnings);
  } else {
    family = dist === 'poisson' ? poissonFamily : quasiPoissonFamily;
    fit = irls({ x: design.data, n, p, y, offset: off, family, control, structure: prep.structure, covariance: inference });
    iterations = fit.iterations;
    converged = fit.converged;
    warnings.push(...fit.warnings);
  }
  control.onProgress?.(0.9, 'inference');

  const mu = fit.mu;
  const dfResidual = n - p;
  const pearson = pearsonChi2(family, y, mu);
  const dispersion = pearson / dfResidual;
  // The fit's own deviance is at these means (and, for the negative binomial, the final theta).
  const deviance = fit.deviance;
  const nullDeviance = inference ? totalDeviance(family, y, nullModelMeans(y, off, family.name === 'negbin' ? theta : null)) : Number.NaN;

  // Covariance: model-based (scaled for quasi-Poisson) or site-clustered sandwich.
  let cov: Float64Array = inference ? Float64Array.from(fit.xtwxInverse) : new Float64Array(p * p).fill(Number.NaN);
  if (family.hasDispersion) scaleCovariance(cov, dispersion);
  let seType: FitSummary['seType'] = 'model';
  if (spec.robust === 'site' && !spec.site) {
    throw new FitInputError('robust-needs-site', 'Site-robust standard errors need a site column: add "site" to the model spec or set "robust" to "none".');
  }
  if (spec.robust === 'site' && inference) {
    const texts = requireColumn(table, spec.site!.column).texts;
    const cl = clusterIndex(prep.rows.map((r) => texts[r]));
    const score = new Float64Array(n);
    for (let i = 0; i < n; i++) score[i] = ((y[i] - mu[i]) * family.link.muEta(fit.eta[i])) / family.variance(mu[i]);
    cov = clusterSandwich({ x: design.data, n, p, score, bread: fit.xtwxInverse, cluster: cl.index, clusters: cl.levels.length });
    seType = 'site-robust';
    warnings.push({
      code: 'robust-se',
      message: `Standard errors are site-clustered sandwich estimates (clustered by "${spec.site!.column}", ${cl.levels.length} sites, small-sample factor G/(G-1)·(n-1)/(n-p)), reported in place of the model-based ones.`,
    });
    if (cl.levels.length < FEW_CLUSTERS) {
      warnings.push({
        code: 'few-sites',
        message: `Only ${cl.levels.length} sites: clustered standard errors are unreliable with so few sites and tend to be too small.`,
      });
    }
  }

  // Published coefficients: every column but the fixed-site dummies.
  const listed = design.names.map((_, j) => j).filter((j) => design.termOf[j] !== SITE_TERM);
  const k = listed.length;
  const betaNames = listed.map((j) => design.names[j]);
  const beta = Float64Array.from(listed, (j) => fit.beta[j]);
  const covListed = new Float64Array(k * k);
  listed.forEach((a, ia) => listed.forEach((b, ib) => (covListed[ib * k + ia] = cov[b * p + a])));

  // The negative binomial fit has it already (at the same means and theta).
  const ll = nbLogLik ?? logLikelihood(family, y, mu);
  const df = p + (dist === 'negbin' ? 1 : 0);
  const ic = ll === null ? null : informationCriteria(ll, df, n);
  const summary: FitSummary = sanitizeSummary({
    converged,
    iterations,
    nobs: n,
    distribution: dist,
    logLikelihood: dist === 'quasipoisson' ? null : ll,
    aic: dist === 'quasipoisson' ? null : (ic?.aic ?? null),
    bic: dist === 'quasipoisson' ? null : (ic?.bic ?? null),
    df,
    deviance,
    nullDeviance,
    dfResidual,
    pearsonChi2: pearson,
    dispersion,
    theta: dist === 'negbin' && !boundary ? theta : null,
    alpha: dist === 'negbin' ? (boundary ? 0 : 1 / theta!) : null,
    coefficients: waldRows(betaNames, beta, covListed),
    zeroCoefficients: [],
    random: null,
    seType,
    warnings: warningSentences(warnings),
  }, inference);

  let siteEffects: FitOutcome['siteEffects'];
  if (prep.siteLevels && prep.siteOfRow) {
    const cols = design.names.map((_, j) => j).filter((j) => design.termOf[j] === SITE_TERM);
    const byName = new Map(cols.map((j) => [design.names[j], j]));
    const column = spec.site!.column;
    const effect = new Float64Array(prep.siteLevels.length);
    const sd = new Float64Array(prep.siteLevels.length);
    prep.siteLevels.forEach((lvl, g) => {
      const j = byName.get(`${column}=${lvl}`);
      effect[g] = j === undefined ? 0 : fit.beta[j];
      sd[g] = j === undefined ? 0 : Math.sqrt(cov[j * p + j]);
    });
    siteEffects = { levels: prep.siteLevels, effect, sd, siteOfRow: prep.siteOfRow };
  }
  control.onProgress?.(1, 'done');
  return {
    summary,
    distribution: dist,
    betaNames,
    beta,
    gammaNames: [],
    gamma: new Float64Array(0),
    covariance: covListed,
    theta: summary.theta,
    rows: Int32Array.from(prep.rows),
    y,
    mu,
    expected: mu,
    ...(siteEffects ? { siteEffects } : {}),
    warnings,
  };
}
