import { describe, expect, it } from 'vitest';
import type { DataTable } from '@shared/data/table';
import { tableFromTexts } from '@shared/data/table';
import { fitCountGlm } from '@shared/engine/count-fit';
import { FitCancelled, FitInputError } from '@shared/engine/types';
import { parseModelSpec } from '@shared/model/spec';
import type { FitSummary } from '@shared/model/fit-result';
import { fixture, fixtureSpec, fixtureTable, relErr } from './helpers/glm-fixtures';
import { negbin, rng } from './helpers/simulate';

/** Invented survey: sites x years with habitat and effort (seeded). */
function survey(seed: number, opts: { zeroHabitat?: string } = {}): DataTable {
  const u = rng(seed);
  const habitats = ['open', 'reed', 'sedge'];
  const rows: string[][] = [];
  for (let s = 0; s < 24; s++) {
    const habitat = habitats[s % 3];
    const siteEffect = (u() - 0.5) * 0.8;
    for (let year = 2015; year <= 2020; year++) {
      const effort = 1 + Math.floor(u() * 4);
      const mu = effort * Math.exp(0.8 + (habitat === 'reed' ? 0.5 : habitat === 'sedge' ? -0.3 : 0) - 0.06 * (year - 2015) + siteEffect);
      const y = habitat === opts.zeroHabitat ? 0 : negbin(u, mu, 3);
      rows.push([`S${String(s + 1).padStart(2, '0')}`, String(year), habitat, String(effort), String(y)]);
    }
  }
  return tableFromTexts(['site', 'year', 'habitat', 'effort', 'count'], rows);
}

const base = {
  response: 'count',
  predictors: [{ column: 'habitat', type: 'factor' }],
  offsets: [{ column: 'effort', log: true }],
};

function noNonFinite(s: FitSummary) {
  const json = JSON.stringify(s);
  expect(json).not.toMatch(/NaN|Infinity/);
  // JSON.stringify turns NaN into null: check the numbers themselves too.
  const walk = (v: unknown): void => {
    if (typeof v === 'number') expect(Number.isFinite(v)).toBe(true);
    else if (Array.isArray(v)) v.forEach(walk);
    else if (v && typeof v === 'object') Object.values(v).forEach(walk);
  };
  walk(s);
}

describe('fitCountGlm: the summary object (shared/cli-contract.md)', () => {
  const t = survey(1);
  it('Poisson: theta and alpha null, random null, model SEs', () => {
    const out = fitCountGlm(t, parseModelSpec({ ...base, distribution: 'poisson' }));
    const s = out.summary;
    expect(s.distribution).toBe('poisson');
    expect(s.theta).toBeNull();
    expect(s.alpha).toBeNull();
    expect(s.random).toBeNull();
    expect(s.zeroCoefficients).toEqual([]);
    expect(s.seType).toBe('model');
    expect(s.df).toBe(3);
    expect(s.nobs).toBe(144);
    expect(s.dfResidual).toBe(141);
    expect(s.coefficients.map((c) => c.term)).toEqual(['intercept', 'habitat=reed', 'habitat=sedge']);
    expect(out.betaNames).toEqual(s.coefficients.map((c) => c.term));
    expect(out.covariance.length).toBe(9);
    noNonFinite(s);
  });

  it('quasi-Poisson: no likelihood, dispersion given, SEs scaled by its square root', () => {
    const p = fitCountGlm(t, parseModelSpec({ ...base, distribution: 'poisson' })).summary;
    const q = fitCountGlm(t, parseModelSpec({ ...base, distribution: 'quasipoisson' })).summary;
    expect(q.logLikelihood).toBeNull();
    expect(q.aic).toBeNull();
    expect(q.bic).toBeNull();
    expect(q.dispersion).toBeCloseTo(q.pearsonChi2 / q.dfResidual, 12);
    q.coefficients.forEach((c, j) => {
      expect(c.estimate).toBeCloseTo(p.coefficients[j].estimate, 12);
      expect(relErr(c.se, p.coefficients[j].se * Math.sqrt(q.dispersion!))).toBeLessThan(1e-12);
    });
  });

  it('negative binomial: theta, alpha = 1/theta, theta counted in df', () => {
    const s = fitCountGlm(t, parseModelSpec({ ...base, distribution: 'negbin' })).summary;
    expect(s.theta).toBeGreaterThan(0);
    expect(s.alpha).toBeCloseTo(1 / s.theta!, 14);
    expect(s.df).toBe(4);
    expect(s.aic).toBeCloseTo(-2 * s.logLikelihood! + 8, 9);
    noNonFinite(s);
  });

  it('time trend "annual" adds the year as a factor against base; "linear" as a slope', () => {
    const annual = fitCountGlm(t, parseModelSpec({ ...base, distribution: 'poisson', time: { column: 'year', trend: 'annual', base: 2017 } })).summary;
    expect(annual.coefficients.map((c) => c.term)).toEqual(['intercept', 'habitat=reed', 'habitat=sedge', 'year=2015', 'year=2016', 'year=2018', 'year=2019', 'year=2020']);
    const first = fitCountGlm(t, parseModelSpec({ ...base, distribution: 'poisson', time: { column: 'year', trend: 'annual' } })).summary;
    expect(first.coefficients.some((c) => c.term === 'year=2015')).toBe(false);
    const linear = fitCountGlm(t, parseModelSpec({ ...base, distribution: 'poisson', time: { column: 'year', trend: 'linear' } })).summary;
    expect(linear.coefficients.map((c) => c.term)).toEqual(['intercept', 'habitat=reed', 'habitat=sedge', 'year']);
    const already = fitCountGlm(t, parseModelSpec({ ...base, predictors: [...base.predictors, { column: 'year', type: 'numeric' }], distribution: 'poisson', time: { column: 'year', trend: 'annual' } })).summary;
    expect(already.coefficients.map((c) => c.term)).toEqual(['intercept', 'habitat=reed', 'habitat=sedge', 'year']);
    expect(() => fitCountGlm(t, parseModelSpec({ ...base, distribution: 'poisson', time: { column: 'year', trend: 'annual', base: 1999 } }))).toThrow(/base time 1999/);
  });

  it('fixed sites: site effects returned, not listed; a site-level predictor is absorbed with a warning', () => {
    const out = fitCountGlm(t, parseModelSpec({ ...base, distribution: 'poisson', site: { column: 'site', effect: 'fixed' }, time: { column: 'year', trend: 'linear' } }));
    expect(out.summary.coefficients.map((c) => c.term)).toEqual(['year']);
    expect(out.siteEffects!.levels).toHaveLength(24);
    expect(out.siteEffects!.siteOfRow).toHaveLength(144);
    expect(out.summary.df).toBe(25);
    expect(out.warnings.filter((w) => w.code === 'aliased-column').map((w) => w.message.match(/"([^"]+)"/)![1])).toEqual(['habitat=reed', 'habitat=sedge']);
  });

  it('site-robust SEs replace the model ones and say so; they need a site column', () => {
    const spec = parseModelSpec({ ...base, distribution: 'poisson', site: { column: 'site', effect: 'fixed' }, time: { column: 'year', trend: 'linear' }, robust: 'site' });
    const out = fitCountGlm(t, spec);
    expect(out.summary.seType).toBe('site-robust');
    expect(out.summary.warnings.some((w) => /site-clustered sandwich estimates \(clustered by "site", 24 sites/.test(w))).toBe(true);
    const model = fitCountGlm(t, { ...spec, robust: 'none' }).summary;
    expect(out.summary.coefficients[0].estimate).toBe(model.coefficients[0].estimate);
    expect(out.summary.coefficients[0].se).not.toBe(model.coefficients[0].se);
    expect(() => fitCountGlm(t, parseModelSpec({ ...base, distribution: 'poisson', robust: 'site' }))).toThrow(/need a site column/);
  });
});

describe('all-zero levels', () => {
  it('a level with only zeros: warning naming it, its rows and coefficient left out, the rest as without those rows', () => {
    const t = survey(2, { zeroHabitat: 'sedge' });
    const out = fitCountGlm(t, parseModelSpec({ ...base, distribution: 'negbin' }));
    const w = out.warnings.find((x) => x.code === 'all-zero-level');
    expect(w?.message).toMatch(/habitat=sedge \(48 rows\)/);
    expect(out.summary.coefficients.map((c) => c.term)).toEqual(['intercept', 'habitat=reed']);
    expect(out.summary.nobs).toBe(96);
    noNonFinite(out.summary);
    const keep = Array.from({ length: t.nrows }, (_, i) => i).filter((i) => t.columns[2].texts[i] !== 'sedge');
    const sub = tableFromTexts(
      t.columns.map((c) => c.name),
      keep.map((i) => t.columns.map((c) => c.texts[i])),
    );
    const ref = fitCountGlm(sub, parseModelSpec({ ...base, distribution: 'negbin' })).summary;
    expect(out.summary.coefficients[1].estimate).toBeCloseTo(ref.coefficients[1].estimate, 8);
    expect(out.summary.logLikelihood).toBeCloseTo(ref.logLikelihood!, 8);
  });

  it('a reference level with only zeros: the reference moves to the next level, with a warning', () => {
    const t = survey(3, { zeroHabitat: 'open' });
    const out = fitCountGlm(t, parseModelSpec({ ...base, distribution: 'poisson' }));
    expect(out.warnings.some((w) => w.code === 'all-zero-level' && /reference level habitat=open .* changed to habitat=reed/.test(w.message))).toBe(true);
    expect(out.summary.coefficients.map((c) => c.term)).toEqual(['intercept', 'habitat=sedge']);
    noNonFinite(out.summary);
  });
});

describe('control and failures', () => {
  const t = survey(4);
  it('reports non-convergence in the summary without NaN', () => {
    const out = fitCountGlm(t, parseModelSpec({ ...base, distribution: 'negbin' }), { maxIterations: 1 });
    expect(out.summary.converged).toBe(false);
    expect(out.summary.warnings.some((w) => /did not converge/.test(w))).toBe(true);
    noNonFinite(out.summary);
  });
  it('is cancelled by the signal', () => {
    expect(() => fitCountGlm(t, parseModelSpec({ ...base, distribution: 'poisson' }), { signal: { aborted: true } })).toThrow(FitCancelled);
  });
  it('reports progress ending at 1', () => {
    const seen: number[] = [];
    fitCountGlm(t, parseModelSpec({ ...base, distribution: 'negbin' }), { onProgress: (f) => seen.push(f) });
    expect(seen[seen.length - 1]).toBe(1);
  });
  it('a non-positive effort is a FitInputError naming the row', () => {
    const bad = tableFromTexts(['count', 'effort', 'habitat'], [['1', '1', 'a'], ['2', '0', 'b'], ['0', '2', 'a'], ['3', '1', 'b']]);
    expect(() => fitCountGlm(bad, parseModelSpec({ ...base, distribution: 'poisson' }))).toThrow(FitInputError);
    expect(() => fitCountGlm(bad, parseModelSpec({ ...base, distribution: 'poisson' }))).toThrow(/data row 2/);
  });
  it('an all-zero response is refused with a plain message', () => {
    const zeros = tableFromTexts(['count', 'effort', 'habitat'], [['0', '1', 'a'], ['0', '1', 'b'], ['0', '2', 'a']]);
    expect(() => fitCountGlm(zeros, parseModelSpec({ ...base, distribution: 'poisson' }))).toThrow(/Every count in the rows used is zero/);
  });
  it('more coefficients than rows is refused', () => {
    const tiny = tableFromTexts(['count', 'effort', 'habitat'], [['1', '1', 'a'], ['2', '1', 'b']]);
    expect(() => fitCountGlm(tiny, parseModelSpec({ ...base, distribution: 'poisson' }))).toThrow(/only 2 usable rows/);
  });
});

describe('summary on a reference dataset has only finite numbers', () => {
  it.each(['ships-poisson', 'quine-negbin', 'epil-poisson-site-fixed'])('%s', (name) => {
    const f = fixture(name);
    noNonFinite(fitCountGlm(fixtureTable(f), fixtureSpec(f)).summary);
  });
});
