/**
 * Random site intercept by adaptive Gauss-Hermite quadrature against
 * lme4::glmer (poisson, nAGQ = 9 and 1; lme4 1.1-31), glmmTMB::glmmTMB
 * (poisson and nbinom2, Laplace; glmmTMB 1.1.5) and lme4::glmer.nb on
 * lme4::grouseticks and MASS::epil; values in
 * test/reference/sites/sites-random.json (made by make-sites.R), with
 * each site's integral also computed in R by stats::integrate.
 */
import { describe, expect, it } from 'vitest';
import { parseModelSpec } from '@shared/model/spec';
import { fitRandomSite } from '@shared/engine/sites/random';
import { marginalEvaluator } from '@shared/engine/sites/aghq-marginal';
import { groupBySite } from '@shared/engine/sites/site-groups';
import { siteFrame } from '@shared/engine/sites/site-frame';
import { FitCancelled } from '@shared/engine/types';
import type { RefCase } from './fixtures';
import { close, dataset, randomCases, refTheta } from './fixtures';

const fits = new Map<string, ReturnType<typeof fitRandomSite>>();
function fitOf(ref: RefCase) {
  let f = fits.get(ref.name);
  if (!f) {
    f = fitRandomSite(dataset(ref.dataset), parseModelSpec(ref.spec));
    fits.set(ref.name, f);
  }
  return f;
}

/** The marginal evaluator on a fixture's data, with the reference's parameters. */
function atReference(ref: RefCase, q: number) {
  const spec = parseModelSpec(ref.spec);
  const sf = siteFrame(dataset(ref.dataset), spec, true, 'random');
  const d = sf.design;
  const { order, start } = groupBySite(sf.site, sf.levels.length);
  const x = new Float64Array(d.n * d.p);
  for (let j = 0; j < d.p; j++) for (let i = 0; i < d.n; i++) x[j * d.n + i] = d.data[j * d.n + order[i]];
  const negbin = spec.distribution === 'negbin';
  const g = { y: Float64Array.from(order, (i) => sf.y[i]), x, n: d.n, p: d.p, offset: null, start, nSites: sf.levels.length, negbin };
  const par = new Float64Array(d.p + (negbin ? 2 : 1));
  d.names.forEach((nm, j) => (par[j] = ref.coefficients.find((c) => c.term === nm)!.estimate));
  par[d.p] = Math.log(ref.sd!);
  if (negbin) par[d.p + 1] = Math.log(refTheta(ref)!);
  return { ev: marginalEvaluator(g, q), par, g };
}

// glmer.nb's Laplace step uses IRLS weights rather than the exact curvature
// and treats theta as known for SEs: checked separately with loose limits.
const exactCases = randomCases.cases.filter((c) => !c.name.endsWith('glmer.nb'));

describe('random site intercept against R', () => {
  for (const ref of exactCases) {
    it(`${ref.name} (${ref.source})`, () => {
      const fit = fitOf(ref);
      const tol = ref.tolerance;
      expect(fit.summary.converged).toBe(true);
      expect(fit.summary.coefficients.length).toBe(ref.coefficients.length);
      for (const rc of ref.coefficients) {
        const row = fit.summary.coefficients.find((r) => r.term === rc.term)!;
        expect(row, rc.term).toBeDefined();
        expect(close(row.estimate, rc.estimate, tol.estimate), `${rc.term} ${row.estimate} vs ${rc.estimate}`).toBe(true);
        expect(Math.abs(row.se / rc.se - 1), `${rc.term} se ${row.se} vs ${rc.se}`).toBeLessThan(tol.se);
      }
      expect(Math.abs(fit.summary.logLikelihood! - ref.logLikelihood), `logLik ${fit.summary.logLikelihood} vs ${ref.logLikelihood}`).toBeLessThan(tol.logLikelihood);
      expect(Math.abs(fit.summary.random!.sd / ref.sd! - 1)).toBeLessThan(tol.sd);
      const th = refTheta(ref);
      if (th !== null) expect(Math.abs(fit.theta! / th - 1)).toBeLessThan(tol.theta);
      else expect(fit.theta).toBeNull();
      // Conditional modes of the site effects (R's ranef), matched by site name.
      const se = fit.siteEffects!;
      ref.modeLevels!.forEach((lev, k) => {
        const m = se.effect[se.levels.indexOf(lev)];
        expect(Math.abs(m - ref.modes![k]), `mode of ${lev}`).toBeLessThan(tol.modes);
      });
      // df counts the fixed effects, the SD and theta (shared/cli-contract.md).
      expect(fit.summary.df).toBe(ref.coefficients.length + 1 + (th !== null ? 1 : 0));
      expect(fit.summary.random!.column).toBe(parseModelSpec(ref.spec).site!.column);
    });
  }

  for (const ref of randomCases.cases.filter((c) => c.name.endsWith('glmer.nb'))) {
    it(`${ref.name}: close to lme4::glmer.nb within its looser tolerances`, () => {
      const fit = fitOf(ref);
      const tol = ref.tolerance;
      for (const rc of ref.coefficients) {
        const row = fit.summary.coefficients.find((r) => r.term === rc.term)!;
        expect(Math.abs(row.estimate - rc.estimate)).toBeLessThan(tol.estimate * Math.max(1, Math.abs(rc.estimate)) * 3);
      }
      expect(Math.abs(fit.theta! / refTheta(ref)! - 1)).toBeLessThan(tol.theta);
      expect(Math.abs(fit.summary.logLikelihood! - ref.logLikelihood)).toBeLessThan(tol.logLikelihood);
    });
  }
});

describe('adaptive quadrature of the marginal likelihood', () => {
  it('with many nodes equals the per-site integrals from stats::integrate at the R estimates', () => {
    for (const ref of exactCases) {
      const { ev, par } = atReference(ref, 25);
      expect(Math.abs(ev.evaluate(par, false).logLik - ref.logLikIntegrate!), ref.name).toBeLessThan(1e-4);
    }
  });

  it('gives an exact gradient (central differences agree), for 1, 3 and 9 nodes', () => {
    const refs = exactCases.filter((c) => c.name === 'epil-negbin-laplace-tmb' || c.name === 'grouseticks-poisson-agq9');
    expect(refs.length).toBe(2);
    for (const ref of refs) {
      for (const q of [1, 3, 9]) {
        const { ev, par, g } = atReference(ref, q);
        par[0] += 0.05; // away from the optimum, where the gradient is not ~0
        const grad = ev.evaluate(par, true).gradient!;
        for (let j = 0; j < par.length; j++) {
          const h = 1e-5;
          const a = Float64Array.from(par);
          const b = Float64Array.from(par);
          a[j] += h;
          b[j] -= h;
          const fd = (marginalEvaluator(g, q).evaluate(a, false).logLik - marginalEvaluator(g, q).evaluate(b, false).logLik) / (2 * h);
          expect(Math.abs(grad[j] - fd), `${ref.name} q=${q} par ${j}`).toBeLessThan(1e-4 * Math.max(1, Math.abs(fd)));
        }
      }
    }
  });
});

describe('random site fit: control and input', () => {
  const ref = exactCases.find((c) => c.name === 'epil-poisson-agq9')!;
  it('reports progress and can be cancelled', () => {
    const seen: string[] = [];
    fitRandomSite(dataset(ref.dataset), parseModelSpec(ref.spec), { onProgress: (_f, s) => seen.push(s) });
    expect(seen).toContain('marginal likelihood');
    expect(seen[seen.length - 1]).toBe('done');
    expect(() => fitRandomSite(dataset(ref.dataset), parseModelSpec(ref.spec), { signal: { aborted: true } })).toThrow(FitCancelled);
  });

  it('refuses zero-inflated distributions with a message naming the fix', () => {
    const spec = parseModelSpec({ ...(ref.spec as object), distribution: 'zinb' });
    expect(() => fitRandomSite(dataset(ref.dataset), spec)).toThrow(/Random site effects are available for the poisson and negbin/);
  });

  it('has no NaN in the published summary', () => {
    const fit = fitOf(ref);
    const text = JSON.stringify(fit.summary, (_k, v) => (typeof v === 'number' && Number.isNaN(v) ? 'NaN!' : v));
    expect(text).not.toContain('NaN!');
  });
});
