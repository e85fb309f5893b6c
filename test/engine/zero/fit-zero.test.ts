/**
 * Zero-inflated and hurdle fits against R's pscl (zeroinfl, hurdle) on the
 * bioChemists data it ships, with SEs also checked against numDeriv's
 * numerical Hessian and, for site-clustered SEs, the sandwich package.
 * Fixture: test/reference/zero/zero-fits.json, made by make-zero.R (pscl
 * 1.5.5, R 4.2.2, sandwich 3.0-2; versions in its `source`).
 */
import { describe, expect, it } from 'vitest';
import type { FitOutcome } from '@shared/engine/types';
import { fitZeroModel } from '@shared/engine/zero/fit-zero';
import { probabilityMass } from '@shared/engine/zero/pmf';
import type { CountDistribution } from '@shared/engine/zero/pmf';
import { parseModelSpec } from '@shared/model/spec';
import type { RefFit } from './reference-data';
import { bioChemists, ourTermName, reference, relOrAbs } from './reference-data';

const tol = reference.tolerance;
const table = bioChemists();
/** Invented grouping column of make-zero.R; with fixed sites pscl's first count coefficients are the per-site intercepts ("site - 1"). */
const SITE = 'site_invented';

function noNaN(value: unknown, path = 'summary'): void {
  if (typeof value === 'number') expect(Number.isNaN(value), path).toBe(false);
  else if (Array.isArray(value)) value.forEach((v, i) => noNaN(v, `${path}[${i}]`));
  else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) noNaN(v, `${path}.${k}`);
}

interface Case {
  ref: RefFit;
  out: FitOutcome;
  /** Reference count coefficients that are published (site intercepts left out). */
  refCount: RefFit['count'];
  refSites: RefFit['count'];
  /** Numerical-Hessian SEs of the published count and zero coefficients, in order. */
  seNum: number[];
}

const cases: Case[] = reference.fits.map((ref) => {
  const out = fitZeroModel(table, parseModelSpec(ref.spec));
  const isSite = (c: { name: string }) => c.name.startsWith(SITE);
  const all = ref.hessianCheck.seNumerical;
  const countSe = ref.count.map((c, j) => [c, all[j]] as const).filter(([c]) => !isSite(c)).map(([, v]) => v);
  return {
    ref,
    out,
    refCount: ref.count.filter((c) => !isSite(c)),
    refSites: ref.count.filter(isSite),
    seNum: [...countSe, ...all.slice(ref.count.length, ref.count.length + ref.zero.length)],
  };
});
const byId = (c: Case) => [c.ref.id, c] as const;

describe.each(cases.map(byId))('%s against pscl', (_id, { ref, out, refCount }) => {
  const s = out.summary;
  const spec = parseModelSpec(ref.spec);

  it('converges and counts every parameter (pscl logLik df)', () => {
    expect(s.converged).toBe(true);
    expect(s.nobs).toBe(ref.nobs);
    expect(s.df).toBe(ref.df);
    expect(s.dfResidual).toBe(ref.nobs - ref.df);
  });

  it('log-likelihood, AIC and BIC match pscl (logLik, AIC, BIC) to 1e-6', () => {
    expect(Math.abs(s.logLikelihood! - ref.logLik)).toBeLessThan(tol.logLikAbs);
    expect(Math.abs(s.aic! - ref.aic)).toBeLessThan(2 * tol.logLikAbs);
    expect(Math.abs(s.bic! - ref.bic)).toBeLessThan(2 * tol.logLikAbs);
  });

  it('coefficients and theta match pscl to 1e-4 (relative; absolute near zero)', () => {
    expect(s.coefficients.map((c) => c.term)).toEqual(refCount.map((c) => ourTermName(c.name)));
    expect(s.zeroCoefficients.map((c) => c.term)).toEqual(ref.zero.map((c) => ourTermName(c.name)));
    s.coefficients.forEach((c, j) => expect(relOrAbs(c.estimate, refCount[j].estimate), c.term).toBeLessThan(tol.coefficientRel));
    s.zeroCoefficients.forEach((c, j) => expect(relOrAbs(c.estimate, ref.zero[j].estimate), c.term).toBeLessThan(tol.coefficientRel));
    if (ref.theta !== null) expect(Math.abs(s.theta! - ref.theta) / ref.theta).toBeLessThan(tol.coefficientRel);
    else expect(s.theta).toBeNull();
  });

  it('Wald rows are consistent (z = est / se, 95% limits, two-sided p); no NaN anywhere', () => {
    for (const c of [...s.coefficients, ...s.zeroCoefficients]) {
      expect(c.z).toBeCloseTo(c.estimate / c.se, 10);
      expect(c.upper - c.estimate).toBeCloseTo(1.959964 * c.se, 5); // common practice: normal 97.5% point
      expect(c.p).toBeGreaterThanOrEqual(0);
      expect(c.p).toBeLessThanOrEqual(1);
    }
    expect(s.deviance).toBeNull();
    expect(s.nullDeviance).toBeNull();
    noNaN(s);
  });

  it('Pearson chi-square matches sum(residuals(type = "pearson")^2) from pscl to 1e-6 relative', () => {
    expect(Math.abs(s.pearsonChi2 - ref.pearsonChi2) / ref.pearsonChi2).toBeLessThan(1e-6);
  });

  it('fitted E[y] and P(y = 0..6) of the first rows match predict(type = "response"/"prob")', () => {
    for (let i = 0; i < 8; i++) {
      expect(Math.abs(out.expected[i] - ref.firstRows.expected[i]) / ref.firstRows.expected[i]).toBeLessThan(1e-5);
      for (let y = 0; y <= 6; y++) {
        const pr = probabilityMass(spec.distribution as CountDistribution, y, { mu: out.mu[i], theta: out.theta, zeroProb: out.zeroProb![i] });
        expect(Math.abs(pr - ref.firstRows.prob0to6[i][y])).toBeLessThan(1e-6);
      }
    }
  });
});

describe.each(cases.filter((c) => c.ref.clusterSe === null).map(byId))('%s model-based SEs', (_id, { ref, out, refCount, seNum }) => {
  const s = out.summary;
  it('match the numerical Hessian of the log-likelihood (numDeriv::hessian in make-zero.R) to 1e-4', () => {
    expect(s.seType).toBe('model');
    const ours = [...s.coefficients, ...s.zeroCoefficients].map((c) => c.se);
    ours.forEach((se, j) => expect(Math.abs(se - seNum[j]) / seNum[j]).toBeLessThan(tol.seRel));
  });

  it("match pscl's reported SEs to 5e-4 (pscl's optim Hessian uses finite-difference steps of 1e-3)", () => {
    // The fixture records how far pscl's own SEs are from the numerical Hessian (hessianCheck.maxRelSeDiff, up to about 2.6e-4).
    const refSe = [...refCount, ...ref.zero].map((c) => c.se);
    const ours = [...s.coefficients, ...s.zeroCoefficients].map((c) => c.se);
    ours.forEach((se, j) => expect(Math.abs(se - refSe[j]) / refSe[j]).toBeLessThan(5e-4));
  });
});

describe.each(cases.filter((c) => c.ref.clusterSe !== null).map(byId))('%s site-clustered SEs', (_id, { ref, out, refCount, refSites }) => {
  it('match sandwich::meatCL(type = "HC1") with a numerical-Hessian bread (1e-4) and sandwich::vcovCL (1e-3)', () => {
    // vcovCL's own bread is pscl's vcov, from optim's finite-difference Hessian (errors up to ~5e-4 in the SEs);
    // make-zero.R also stores the same sandwich with the numDeriv Hessian as bread.
    const s = out.summary;
    const cl = ref.clusterSe!;
    const at = (name: string) => cl.names.indexOf(name);
    const check = (ours: number, name: string) => {
      expect(at(name), name).toBeGreaterThanOrEqual(0);
      expect(Math.abs(ours - cl.seNumericalBread[at(name)]) / ours, name).toBeLessThan(1e-4);
      expect(Math.abs(ours - cl.se[at(name)]) / ours, name).toBeLessThan(1e-3);
    };
    expect(s.seType).toBe('site-robust');
    s.coefficients.forEach((c, j) => check(c.se, `count_${refCount[j].name}`));
    s.zeroCoefficients.forEach((c, j) => check(c.se, `zero_${ref.zero[j].name}`));
    refSites.forEach((c, g) => check(out.siteEffects!.sd[g], `count_${c.name}`));
    expect(out.warnings.map((w) => w.code)).toContain('robust-se');
  });
});

describe.each(cases.filter((c) => c.refSites.length > 0).map(byId))('%s fixed sites', (_id, { ref, out, refSites }) => {
  it("per-site intercepts match pscl's site coefficients (1e-4); model-based SEs match the numerical Hessian (1e-4)", () => {
    const se = out.siteEffects!;
    expect(se.levels).toEqual(refSites.map((c) => c.name.slice(SITE.length)));
    refSites.forEach((c, g) => {
      expect(relOrAbs(se.effect[g], c.estimate)).toBeLessThan(tol.coefficientRel);
      if (out.summary.seType === 'model') expect(Math.abs(se.sd[g] - ref.hessianCheck.seNumerical[g]) / se.sd[g]).toBeLessThan(tol.seRel);
    });
    expect(out.summary.coefficients.some((c) => c.term === 'intercept')).toBe(false);
    expect(se.siteOfRow.length).toBe(out.rows.length);
  });
});
