import { describe, expect, it } from 'vitest';
import { buildDesign } from '@shared/engine/design/build';
import { fitCountGlm } from '@shared/engine/count-fit';
import { frameOptions, modelFrame } from '@shared/engine/frame';
import { fitNegbin } from '@shared/engine/negbin/fit';
import { thetaInfo, thetaML, thetaScore } from '@shared/engine/negbin/theta';
import { parseModelSpec } from '@shared/model/spec';
import { fixture, fixtureSpec, fixtureTable, glmFixtures, relErr } from './helpers/glm-fixtures';

function rawFit(name: string) {
  const f = fixture(name);
  const table = fixtureTable(f);
  const spec = fixtureSpec(f);
  const frame = modelFrame(table, frameOptions(spec));
  const { design } = buildDesign(table, spec.predictors, { intercept: true, rows: frame.rows });
  return { f, fit: fitNegbin({ x: design.data, n: design.n, p: design.p, y: frame.y, offset: frame.hasOffset ? frame.offset : null }) };
}

describe('negative binomial theta (MASS::glm.nb)', () => {
  it.each(['quine-negbin', 'epil-negbin-offset'])('%s: theta and SE(theta) as MASS reports them', (name) => {
    const { f, fit } = rawFit(name);
    expect(relErr(fit.theta!, f.expected.theta!)).toBeLessThan(1e-4);
    // MASS: SE(theta) = 1 / sqrt(observed information of theta at the final means), beta held fixed.
    expect(relErr(fit.thetaSe!, f.expected.thetaSe!)).toBeLessThan(1e-4);
    expect(fit.boundary).toBe(false);
  });

  it('the theta score is zero at the estimate and the information is its negative derivative', () => {
    const { fit } = rawFit('quine-negbin');
    const y = Float64Array.from(fixture('quine-negbin').data.Days.map(Number));
    const mu = fit.irls.mu;
    const t = thetaML(y, mu).theta;
    expect(Math.abs(thetaScore(t, y, mu))).toBeLessThan(1e-8);
    const h = 1e-4;
    const fd = -(thetaScore(t + h, y, mu) - thetaScore(t - h, y, mu)) / (2 * h);
    expect(relErr(thetaInfo(t, y, mu), fd)).toBeLessThan(1e-6);
  });
});

describe('boundary theta: no overdispersion (MASS::Insurance)', () => {
  const b = glmFixtures.boundary;
  const pois = fixture('insurance-poisson');
  const out = fitCountGlm(fixtureTable(pois), parseModelSpec(b.spec));
  it('warns with the boundary sentence and reports theta null, alpha 0', () => {
    // glm.nb lets theta run off here (R's estimate in the fixture is huge).
    expect(b.rTheta === null || b.rTheta > 1e4).toBe(true);
    const w = out.warnings.find((x) => x.code === 'boundary-theta');
    expect(w?.message).toContain('no overdispersion: the negative binomial reduces to Poisson');
    expect(out.summary.theta).toBeNull();
    expect(out.summary.alpha).toBe(0);
    expect(out.theta).toBeNull();
  });
  it('returns the Poisson fit (R glm poisson coefficients) with finite numbers only', () => {
    for (const c of pois.expected.coefficients) {
      const ours = out.summary.coefficients.find((r) => r.term === c.term)!;
      expect(relErr(ours.estimate, c.estimate, 1e-3)).toBeLessThan(1e-6);
      expect(relErr(ours.se, c.se)).toBeLessThan(1e-6);
    }
    expect(relErr(out.summary.logLikelihood!, pois.expected.logLik!)).toBeLessThan(1e-9);
    // theta counts as a parameter (contract): one more than the Poisson fit.
    expect(out.summary.df).toBe(pois.expected.df! + 1);
    const json = JSON.stringify(out.summary);
    expect(json).not.toMatch(/NaN|Infinity/);
  });
});

describe('boundary theta where the reference iteration stops short (MASS::ships with offset)', () => {
  const ref = glmFixtures.boundary.ships;
  const pois = fixture('ships-poisson');
  const out = fitCountGlm(fixtureTable(pois), fixtureSpec(pois, { distribution: 'negbin' }));
  it('finds the boundary, whose likelihood is above that at the large theta glm.nb stopped at', () => {
    // glm.nb stops at theta = 5e4 with "iteration limit reached"; the likelihood still rises towards theta = infinity.
    expect(ref.rTheta).toBeGreaterThan(1e4);
    expect(out.summary.theta).toBeNull();
    expect(out.summary.alpha).toBe(0);
    expect(out.summary.logLikelihood!).toBeGreaterThan(ref.rLogLik);
    expect(relErr(out.summary.logLikelihood!, pois.expected.logLik!)).toBeLessThan(1e-9);
  });
});
