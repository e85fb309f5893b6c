/**
 * fitModel with site effects: fixed sites go to the absorbed fitter, which
 * must agree with the dense dummy-column fit of count-fit.ts; both fixed and
 * random site fits carry the spec's time term. Seeded simulated data.
 */
import { describe, expect, it } from 'vitest';
import { tableFromTexts } from '@shared/data/table';
import { parseModelSpec } from '@shared/model/spec';
import { fitModel } from '@shared/engine/fit';
import { fitCountGlm } from '@shared/engine/count-fit';
import { negbin, normal, rng } from './helpers/simulate';

function siteSeasonTable(seed: number) {
  const u = rng(seed);
  const rows: string[][] = [];
  for (let s = 0; s < 25; s++) {
    const effect = 0.6 * normal(u);
    for (let t = 0; t < 8; t++) {
      const minutes = 5 + Math.floor(u() * 10);
      const mu = Math.exp(1 + effect - 0.05 * t) * (minutes / 10);
      rows.push([`site${s}`, String(2010 + t), String(minutes), String(negbin(u, mu, 3))]);
    }
  }
  return tableFromTexts(['site', 'season', 'minutes', 'count'], rows);
}

const table = siteSeasonTable(424242);

describe('site effects through fitModel', () => {
  it('fixed sites are absorbed and agree with the dense dummy-column fit', () => {
    const spec = parseModelSpec({
      response: 'count',
      distribution: 'negbin',
      offsets: [{ column: 'minutes', log: true }],
      site: { column: 'site', effect: 'fixed' },
      time: { column: 'season', trend: 'linear' },
    });
    const absorbed = fitModel(table, spec);
    const dense = fitCountGlm(table, spec);
    expect(absorbed.summary.coefficients.map((c) => c.term)).toEqual(['season']);
    expect(dense.summary.coefficients.map((c) => c.term)).toEqual(['season']);
    const a = absorbed.summary.coefficients[0];
    const d = dense.summary.coefficients[0];
    expect(Math.abs(a.estimate - d.estimate)).toBeLessThan(1e-5);
    expect(Math.abs(a.se - d.se) / d.se).toBeLessThan(1e-4);
    expect(Math.abs(absorbed.summary.logLikelihood! - dense.summary.logLikelihood!)).toBeLessThan(1e-5);
    expect(absorbed.siteEffects?.levels.length).toBe(25);
  });

  it('a random site fit includes the time term of the spec', () => {
    const spec = parseModelSpec({
      response: 'count',
      distribution: 'negbin',
      offsets: [{ column: 'minutes', log: true }],
      site: { column: 'site', effect: 'random', quadraturePoints: 5 },
      time: { column: 'season', trend: 'annual', base: 2010 },
    });
    const fit = fitModel(table, spec);
    const terms = fit.summary.coefficients.map((c) => c.term);
    expect(terms[0]).toBe('intercept');
    expect(terms).toContain('season=2017');
    expect(terms).not.toContain('season=2010');
    expect(fit.summary.random?.column).toBe('site');
  });
});

describe('random site fits with an uncentred time column', () => {
  // Seasons 2010-2017 beside an intercept: the optimiser works on centred
  // columns, so the fit converges and equals the fit on a centred season.
  it('converges and gives the same slope and likelihood as a centred season', () => {
    const centred = {
      nrows: table.nrows,
      columns: table.columns.map((c) =>
        c.name !== 'season' ? c : { ...c, values: c.values.map((v) => v - 2013.5), texts: c.texts.map((t) => String(Number(t) - 2013.5)) },
      ),
    };
    const spec = parseModelSpec({
      response: 'count',
      distribution: 'poisson',
      offsets: [{ column: 'minutes', log: true }],
      site: { column: 'site', effect: 'random', quadraturePoints: 9 },
      time: { column: 'season', trend: 'linear' },
    });
    const raw = fitModel(table, spec);
    const ref = fitModel(centred, spec);
    expect(raw.summary.converged).toBe(true);
    expect(raw.summary.warnings.filter((w) => /converge/.test(w))).toEqual([]);
    const slope = (f: typeof raw) => f.summary.coefficients.find((c) => c.term === 'season')!;
    expect(Math.abs(slope(raw).estimate - slope(ref).estimate)).toBeLessThan(1e-5);
    expect(Math.abs(slope(raw).se - slope(ref).se) / slope(ref).se).toBeLessThan(1e-3);
    expect(Math.abs(raw.summary.logLikelihood! - ref.summary.logLikelihood!)).toBeLessThan(1e-5);
    // intercepts differ by exactly slope * 2013.5
    const i0 = (f: typeof raw) => f.summary.coefficients.find((c) => c.term === 'intercept')!.estimate;
    expect(Math.abs(i0(raw) - (i0(ref) - slope(ref).estimate * 2013.5))).toBeLessThan(1e-3);
  });
});
