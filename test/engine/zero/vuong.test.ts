/**
 * The Vuong test against pscl::vuong on bioChemists (Poisson GLM vs ZIP,
 * NB GLM vs ZINB), fixture `vuong` in zero-fits.json: the statistics pscl
 * prints (7 significant digits) and the same formula recomputed in R at
 * full precision from pscl::predprob. pscl's parameter counts are the
 * regression coefficients only (theta not counted), so the same k are used.
 */
import { describe, expect, it } from 'vitest';
import { fitModel } from '@shared/engine/fit';
import { VUONG_ZERO_INFLATION_CAUTION, vuongForFits, vuongTest } from '@shared/engine/zero/vuong';
import type { Distribution } from '@shared/model/spec';
import { parseModelSpec } from '@shared/model/spec';
import { poissonFamily } from '@shared/engine/families/poisson';
import { irls } from '@shared/engine/irls';
import { fitZeroCore } from '@shared/engine/zero/fit-core';
import { bioChemists, reference, referenceFit, referenceModelData } from './reference-data';

const table = bioChemists();

describe.each(reference.vuong.map((v) => [v.id, v] as const))('%s (pscl::vuong)', (_id, v) => {
  const r = vuongTest(v.logLik1, v.logLik2, v.k1, v.k2);
  const ours = [r.raw, r.aicCorrected, r.bicCorrected];

  it('raw, AIC- and BIC-corrected statistics match the full-precision recomputation (1e-9) and the printout (5e-7)', () => {
    ours.forEach((s, j) => {
      expect(Math.abs(s.statistic - v.stat[j])).toBeLessThan(1e-9);
      expect(Math.abs(s.statistic - v.printedZ[j])).toBeLessThan(5e-7 * Math.max(1, Math.abs(v.printedZ[j])));
    });
  });

  it('one-sided p-values and the favoured model follow the sign as pscl prints them', () => {
    ours.forEach((s, j) => {
      expect(Math.abs(s.p - v.p[j]) / v.p[j]).toBeLessThan(1e-7);
      expect(s.favours).toBe(v.stat[j] > 0 ? 'first' : 'second');
    });
    expect(r.n).toBe(v.n);
    expect(r.caution).toBe(VUONG_ZERO_INFLATION_CAUTION);
  });
});

describe('Vuong test on our own fits', () => {
  it("our Poisson GLM and ZIP per-observation log-likelihoods give pscl's Poisson-vs-ZIP statistics", () => {
    const ref = reference.vuong.find((x) => x.id === 'poisson-vs-zip')!;
    const m = referenceModelData(referenceFit('zip'));
    const zip = fitZeroCore(m);
    const pois = irls({ x: m.X.data, n: m.X.n, p: m.X.p, y: m.y, offset: null, family: poissonFamily });
    const ll1 = Float64Array.from(m.y, (y, i) => poissonFamily.logLik!(y, pois.mu[i]));
    const r = vuongTest(ll1, zip.perObservation, m.X.p, m.X.p + m.Z.p);
    [r.raw, r.aicCorrected, r.bicCorrected].forEach((s, j) => expect(Math.abs(s.statistic - ref.stat[j])).toBeLessThan(1e-5));
  });

  it.each([
    ['zip-vs-hurdle-poisson', 'zip', 'hurdle-poisson'],
    ['zinb-vs-hurdle-negbin', 'zinb', 'hurdle-negbin'],
    ['negbin-vs-zinb', 'negbin', 'zinb'],
    ['poisson-vs-zip', 'poisson', 'zip'],
  ] as const)('vuongForFits on our %s fits matches pscl::vuong (1e-5)', (id, a, b) => {
    const ref = reference.vuong.find((x) => x.id === id)!;
    const fit = (d: Distribution) => fitModel(table, parseModelSpec({ ...referenceFit('zip').spec, distribution: d }));
    const r = vuongForFits(fit(a), fit(b));
    [r.raw, r.aicCorrected, r.bicCorrected].forEach((s, j) => {
      expect(Math.abs(s.statistic - ref.stat[j])).toBeLessThan(1e-5);
      expect(s.favours).toBe(ref.stat[j] > 0 ? 'first' : 'second');
    });
  });

  it('vuongForFits refuses fits of different rows', () => {
    const spec = parseModelSpec(referenceFit('zip').spec);
    const a = fitModel(table, spec);
    const b = { ...a, rows: a.rows.slice(1) };
    expect(() => vuongForFits(a, b)).toThrow(/different rows/);
  });

  it('refuses unequal lengths and identical fits with a plain message', () => {
    expect(() => vuongTest([1, 2, 3], [1, 2], 1, 1)).toThrow(/different numbers of observations/);
    expect(() => vuongTest([1, 2, 3], [1, 2, 3], 1, 1)).toThrow(/identical/);
  });

  it('the caution names the misuse for zero-inflation (Wilson 2015)', () => {
    expect(VUONG_ZERO_INFLATION_CAUTION).toMatch(/Wilson 2015/);
    expect(VUONG_ZERO_INFLATION_CAUTION).toMatch(/not a valid test for zero-inflation/);
  });
});
