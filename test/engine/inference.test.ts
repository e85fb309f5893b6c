import { describe, expect, it } from 'vitest';
import { buildDesign } from '@shared/engine/design/build';
import { fitCountGlm } from '@shared/engine/count-fit';
import { poissonFamily } from '@shared/engine/families/poisson';
import { negbinFamily } from '@shared/engine/families/negbin';
import { frameOptions, modelFrame } from '@shared/engine/frame';
import { lrTest, negbinVsPoissonTest } from '@shared/engine/inference/lrtest';
import { clusterIndex, clusterSandwich } from '@shared/engine/inference/sandwich';
import { rateRatios, waldRows } from '@shared/engine/inference/wald';
import { informationCriteria } from '@shared/engine/inference/likelihood';
import { irls } from '@shared/engine/irls';
import { fitNegbin } from '@shared/engine/negbin/fit';
import { fixture, fixtureSpec, fixtureTable, glmFixtures, relErr } from './helpers/glm-fixtures';

function prepared(name: string) {
  const f = fixture(name);
  const table = fixtureTable(f);
  const spec = fixtureSpec(f);
  const frame = modelFrame(table, frameOptions(spec));
  const { design } = buildDesign(table, spec.predictors, { intercept: true, rows: frame.rows });
  const cl = clusterIndex(frame.rows.map((r) => table.columns.find((c) => c.name === 'subject')!.texts[r]));
  return { f, frame, design, cl };
}

describe('site-clustered sandwich against sandwich::vcovCL (type HC1, cadjust)', () => {
  it('Poisson with spline and interaction on MASS::epil, clustered by subject', () => {
    const { f, frame, design, cl } = prepared('epil-poisson-spline');
    const fit = irls({ x: design.data, n: design.n, p: design.p, y: frame.y, offset: null, family: poissonFamily });
    const score = Float64Array.from(frame.y, (y, i) => y - fit.mu[i]);
    const v = clusterSandwich({ x: design.data, n: design.n, p: design.p, score, bread: fit.xtwxInverse, cluster: cl.index, clusters: cl.levels.length });
    f.expected.robust!.se.forEach((c, j) => {
      expect(design.names[j]).toBe(c.term);
      expect(relErr(Math.sqrt(v[j * design.p + j]), c.se), c.term).toBeLessThan(1e-6);
    });
  });

  it('negative binomial with offset on MASS::epil (theta held at its estimate)', () => {
    const { f, frame, design, cl } = prepared('epil-negbin-offset');
    const nb = fitNegbin({ x: design.data, n: design.n, p: design.p, y: frame.y, offset: frame.offset });
    const fam = negbinFamily(nb.theta!);
    const mu = nb.irls.mu;
    const score = Float64Array.from(frame.y, (y, i) => ((y - mu[i]) * mu[i]) / fam.variance(mu[i]));
    const v = clusterSandwich({ x: design.data, n: design.n, p: design.p, score, bread: nb.irls.xtwxInverse, cluster: cl.index, clusters: cl.levels.length });
    f.expected.robust!.se.forEach((c, j) => expect(relErr(Math.sqrt(v[j * design.p + j]), c.se), c.term).toBeLessThan(1e-4));
  });
});

describe('likelihood-ratio tests', () => {
  const big = fitCountGlm(fixtureTable(fixture('quine-negbin')), fixtureSpec(fixture('quine-negbin')));
  const small = fitCountGlm(fixtureTable(fixture('quine-negbin-small')), fixtureSpec(fixture('quine-negbin-small')));
  const pois = fitCountGlm(fixtureTable(fixture('quine-poisson')), fixtureSpec(fixture('quine-poisson')));

  it('nested negative binomial fits match MASS anova.negbin (theta re-estimated in each)', () => {
    const ref = glmFixtures.lrNested;
    const t = lrTest(small.summary, big.summary);
    expect(t.df).toBe(ref.df);
    expect(relErr(t.statistic, ref.statistic)).toBeLessThan(1e-4);
    expect(relErr(t.p, ref.p)).toBeLessThan(1e-4);
  });

  it('negative binomial against Poisson uses half the chi-square(1) tail (Self & Liang 1987)', () => {
    const ref = glmFixtures.lrNegbinPoisson;
    const t = negbinVsPoissonTest(pois.summary, big.summary);
    expect(relErr(t.statistic, ref.statistic)).toBeLessThan(1e-6);
    // p is about 1.6e-261: one-df chi-square tails are computed as 2 Q(sqrt(x)), accurate this far out.
    expect(relErr(t.p, ref.p, 0)).toBeLessThan(1e-5);
  });

  it('the boundary p is half the ordinary chi-square p for a moderate statistic', () => {
    const a = { ...pois.summary, logLikelihood: -100, df: 6 };
    const b = { ...pois.summary, logLikelihood: -98.5, df: 7 };
    // 2 * 1.5 = 3; P(chi2_1 > 3) = 0.0832645 (common practice: pchisq(3, 1, lower = FALSE)).
    expect(lrTest(a, b).p).toBeCloseTo(0.0832645, 6);
    expect(negbinVsPoissonTest(a, b).p).toBeCloseTo(0.0832645 / 2, 6);
  });

  it('refuses quasi-Poisson and fits of different rows', () => {
    const q = { ...pois.summary, logLikelihood: null };
    expect(() => lrTest(q, big.summary)).toThrow(/quasi-Poisson has none/);
    expect(() => lrTest({ ...small.summary, nobs: 10 }, big.summary)).toThrow(/different rows/);
  });
});

describe('Wald rows, rate ratios and information criteria', () => {
  it('computes z, two-sided p and 95% limits', () => {
    const rows = waldRows(['intercept', 'x'], [0.5, -1.2], Float64Array.from([0.01, 0, 0, 0.36]));
    expect(rows[1].se).toBeCloseTo(0.6, 14);
    expect(rows[1].z).toBeCloseTo(-2, 14);
    // 2 * pnorm(-2) = 0.04550026 (common practice)
    expect(rows[1].p).toBeCloseTo(0.0455002638, 8);
    expect(rows[1].lower).toBeCloseTo(-1.2 - 1.959963984540054 * 0.6, 12);
    const rr = rateRatios(rows);
    expect(rr).toHaveLength(1);
    expect(rr[0].ratio).toBeCloseTo(Math.exp(-1.2), 14);
    expect(rr[0].upper).toBeCloseTo(Math.exp(rows[1].upper), 14);
  });
  it('AIC and BIC count every parameter', () => {
    const ic = informationCriteria(-100, 5, 50);
    expect(ic.aic).toBe(210);
    expect(ic.bic).toBeCloseTo(200 + 5 * Math.log(50), 12);
  });
});

describe('normal tail probabilities', () => {
  it('keeps relative accuracy far into the tail', async () => {
    const { normalUpper, twoSidedNormalP } = await import('@shared/engine/math/distributions');
    // Reference values from R 4.2.2, pnorm(q, lower.tail = FALSE), printed to 16 digits:
    // Q(1.959964) = 0.025, Q(4) = 3.167124183e-05, Q(6) = 9.865876450e-10, Q(10) = 7.619853024e-24.
    expect(normalUpper(1.959963984540054)).toBeCloseTo(0.025, 14);
    expect(relErr(normalUpper(4), 3.167124183311992e-5)).toBeLessThan(1e-9);
    expect(relErr(normalUpper(6), 9.865876450376981e-10)).toBeLessThan(1e-9);
    expect(relErr(normalUpper(10), 7.619853024160527e-24)).toBeLessThan(1e-9);
    expect(relErr(normalUpper(5), 2.866515718791939e-7)).toBeLessThan(1e-9);
    expect(relErr(normalUpper(4.999999), 2.866516e-7)).toBeLessThan(1e-5);
    expect(twoSidedNormalP(-12.67)).toBeGreaterThan(0);
    expect(twoSidedNormalP(0)).toBe(1);
  });
});

describe('chi-square upper tail far out', () => {
  // Reference values from R 4.2.2, stats::pchisq(x, df = 5, lower.tail = FALSE):
  //   x = 200 -> 2.8406228986415315e-41, x = 4.2 -> 0.52099495343140501.
  // Also the closed form for odd df = 5 (common practice):
  //   Q = 2 Q_N(sqrt(x)) + sqrt(2x/pi) e^{-x/2} (1 + x/3).
  it('keeps relative accuracy where 1 - cdf would be 0', async () => {
    const { chiSquareUpper, normalUpper } = await import('@shared/engine/math/distributions');
    const closed = (x: number) => 2 * normalUpper(Math.sqrt(x)) + Math.sqrt((2 * x) / Math.PI) * Math.exp(-x / 2) * (1 + x / 3);
    const far = chiSquareUpper(200, 5);
    expect(Math.abs(far - 2.8406228986415315e-41) / 2.8406228986415315e-41).toBeLessThan(1e-9);
    expect(Math.abs(far - closed(200)) / far).toBeLessThan(1e-9);
    expect(Math.abs(chiSquareUpper(4.2, 5) - 0.52099495343140501)).toBeLessThan(1e-12);
  });
});
