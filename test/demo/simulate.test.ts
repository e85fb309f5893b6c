import { describe, expect, it } from 'vitest';
import { simulateDemo, visitRecords } from '@shared/demo/simulate';
import { ANALYSIS_COLUMNS, analysisDataTable, analysisRows } from '@shared/demo/analysis-table';
import { findColumn } from '@shared/data/table';
import { OBSERVERS, PONDS } from '@shared/demo/programme';
import { DEFAULT_DEMO_SEED, DEMO_TRUTH, expectedCount, logSlope, seasonsOf } from '@shared/demo/truth';

const sim = simulateDemo(DEFAULT_DEMO_SEED);

/**
 * Log-likelihood of counts y under a negative binomial with known means mu and
 * size theta, mixed with extra zeros of probability pi (common practice:
 * log Gamma(y+theta) - log Gamma(theta) = sum of log(theta + k), k < y).
 */
function zinbLogLik(y: readonly number[], mu: readonly number[], pi: number, theta: number): number {
  let ll = 0;
  y.forEach((k, i) => {
    const logP0 = theta * Math.log(theta / (theta + mu[i]));
    if (k === 0) {
      ll += Math.log(pi + (1 - pi) * Math.exp(logP0));
      return;
    }
    let lg = 0;
    for (let j = 0; j < k; j++) lg += Math.log(theta + j);
    let logFact = 0;
    for (let j = 2; j <= k; j++) logFact += Math.log(j);
    ll += Math.log(1 - pi) + lg - logFact + logP0 + k * Math.log(mu[i] / (theta + mu[i]));
  });
  return ll;
}

/** theta maximising zinbLogLik, by golden-section search on log(theta) in [log 0.05, log 100]. */
function thetaGivenMeans(y: readonly number[], mu: readonly number[], pi: number): number {
  const f = (t: number) => -zinbLogLik(y, mu, pi, Math.exp(t));
  const g = (Math.sqrt(5) - 1) / 2;
  let a = Math.log(0.05);
  let b = Math.log(100);
  let c = b - g * (b - a);
  let d = a + g * (b - a);
  let fc = f(c);
  let fd = f(d);
  while (b - a > 1e-4) {
    if (fc < fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - g * (b - a);
      fc = f(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + g * (b - a);
      fd = f(d);
    }
  }
  return Math.exp((a + b) / 2);
}

describe('demo simulation: reproducible from its seed', () => {
  it('gives identical visits for the same seed and different counts for another seed', () => {
    const again = simulateDemo(DEFAULT_DEMO_SEED);
    expect(again.visits).toEqual(sim.visits);
    expect(again.siteEffects).toEqual(sim.siteEffects);
    const other = simulateDemo(DEFAULT_DEMO_SEED + 1);
    expect(other.visits.map((v) => v.counts)).not.toEqual(sim.visits.map((v) => v.counts));
  });
});

describe('demo simulation: survey design as stated in truth.ts', () => {
  const seasons = seasonsOf(DEMO_TRUTH);
  const d = DEMO_TRUTH.design;
  const byPondSeason = new Map<string, typeof sim.visits>();
  for (const v of sim.visits) {
    const k = `${v.pond}|${v.season}`;
    byPondSeason.set(k, [...(byPondSeason.get(k) ?? []), v]);
  }

  it('covers 40 ponds and 15 seasons, 2-4 visits per visited pond, a few ponds missed some seasons', () => {
    expect(PONDS).toHaveLength(40);
    expect(new Set(PONDS.map((p) => p.name)).size).toBe(40);
    expect(seasons).toEqual(Array.from({ length: 15 }, (_, i) => 2012 + i));
    expect(new Set(sim.visits.map((v) => v.season))).toEqual(new Set(seasons));
    for (const group of byPondSeason.values()) {
      expect(group.length).toBeGreaterThanOrEqual(2);
      expect(group.length).toBeLessThanOrEqual(4);
      expect(group.map((v) => v.visit)).toEqual(group.map((_, i) => i + 1));
      const dates = group.map((v) => v.date);
      expect([...dates].sort()).toEqual(dates);
      expect(new Set(dates).size).toBe(dates.length);
    }
    const missed = PONDS.length * seasons.length - byPondSeason.size;
    expect(missed).toBeGreaterThan(0);
    expect(missed).toBeLessThan(0.15 * PONDS.length * seasons.length);
  });

  it('keeps dates in the spring window, minutes mostly 5-15, known observers, temperatures above the floor', () => {
    for (const v of sim.visits) {
      const day = (Date.parse(v.date) - Date.UTC(v.season, 0, 0)) / 86400000;
      expect(day).toBeGreaterThanOrEqual(d.firstDay);
      expect(day).toBeLessThanOrEqual(d.lastDay);
      expect(v.date.startsWith(String(v.season))).toBe(true);
      expect(OBSERVERS).toContain(v.observer);
      expect(v.waterTempC).toBeGreaterThanOrEqual(d.tempFloorC);
      expect(v.waterTempC).toBeLessThan(30);
    }
    const inRange = sim.visits.filter((v) => v.minutes >= 5 && v.minutes <= 15).length / sim.visits.length;
    expect(inRange).toBeGreaterThan(0.85);
    expect(inRange).toBeLessThan(1);
  });

  it('flattens to one long record per visit and species', () => {
    const recs = visitRecords(sim);
    expect(recs).toHaveLength(sim.visits.length * DEMO_TRUTH.species.length);
    expect(recs[1]).toMatchObject({ pond: sim.visits[0].pond, species: DEMO_TRUTH.species[1].key, count: sim.visits[0].counts[1] });
  });

  it('uses the stated mean for every visit', () => {
    const pondIndex = new Map(PONDS.map((p, i) => [p.name, i]));
    for (const v of sim.visits.slice(0, 200)) {
      DEMO_TRUTH.species.forEach((s, j) => {
        expect(v.means[j]).toBeCloseTo(expectedCount(DEMO_TRUTH, s, v, sim.siteEffects[s.key][pondIndex.get(v.pond)!]), 10);
      });
    }
  });

  it('draws pond effects with the stated SD per species (loose: 40 draws, within 35 %)', () => {
    for (const s of DEMO_TRUTH.species) {
      const u = sim.siteEffects[s.key];
      const sd = Math.sqrt(u.reduce((a, x) => a + x * x, 0) / u.length);
      expect(sd / s.siteSd).toBeGreaterThan(0.65);
      expect(sd / s.siteSd).toBeLessThan(1.35);
    }
  });
});

describe('demo simulation: counts have the overdispersion and zeros the truth implies (seeded, loose)', () => {
  DEMO_TRUTH.species.forEach((s, j) => {
    const y = sim.visits.map((v) => v.counts[j]);
    const mu = sim.visits.map((v) => v.means[j]);
    const pi = s.zeroInflation;

    it(`${s.label}: total count is (1 - extra zeros) * sum(mu) within 4 SE, variance (1-pi)mu(1 + mu(pi + 1/theta)) (common practice)`, () => {
      const observed = y.reduce((a, b) => a + b, 0);
      const expected = (1 - pi) * mu.reduce((a, b) => a + b, 0);
      const se = Math.sqrt(mu.reduce((a, m) => a + (1 - pi) * m * (1 + m * (pi + 1 / s.theta)), 0));
      expect(Math.abs(observed - expected)).toBeLessThan(4 * se);
    });

    it(`${s.label}: share of zeros matches extra zeros + NB zeros (theta/(theta+mu))^theta within 4 SE (common practice)`, () => {
      const p0 = mu.map((m) => pi + (1 - pi) * (s.theta / (s.theta + m)) ** s.theta);
      const expected = p0.reduce((a, b) => a + b, 0);
      const se = Math.sqrt(p0.reduce((a, p) => a + p * (1 - p), 0));
      const observed = y.filter((k) => k === 0).length;
      expect(Math.abs(observed - expected)).toBeLessThan(4 * se);
    });

    it(`${s.label}: counts are overdispersed (Pearson dispersion well above 1)`, () => {
      const pearson = y.reduce((a, k, i) => a + (k - mu[i]) ** 2 / mu[i], 0) / y.length;
      expect(pearson).toBeGreaterThan(1.5);
    });

    it(`${s.label}: maximum-likelihood theta given the true means and extra-zero share is within 25 % of ${s.theta}`, () => {
      const thetaHat = thetaGivenMeans(y, mu, pi);
      expect(thetaHat / s.theta).toBeGreaterThan(0.75);
      expect(thetaHat / s.theta).toBeLessThan(1.25);
    });
  });

  it('only the species stated to have extra zeros has them', () => {
    expect(DEMO_TRUTH.species.filter((s) => s.zeroInflation > 0).map((s) => s.key)).toEqual(['natterjack']);
  });
});

describe('clean analysis table: per-species trend has the sign of the true trend (weak sanity check)', () => {
  const rows = analysisRows(sim);
  const seasons = seasonsOf(DEMO_TRUTH);

  it('has one row per visited pond x season x species, with season sums', () => {
    const pondSeasons = new Set(sim.visits.map((v) => `${v.pond}|${v.season}`));
    expect(rows).toHaveLength(pondSeasons.size * DEMO_TRUTH.species.length);
    const total = (key: string) => rows.filter((r) => r.species === key).reduce((a, r) => a + r.count, 0);
    DEMO_TRUTH.species.forEach((s, j) => expect(total(s.key)).toBe(sim.visits.reduce((a, v) => a + v.counts[j], 0)));
    const minutes = rows.filter((r) => r.species === DEMO_TRUTH.species[0].key).reduce((a, r) => a + r.minutes, 0);
    expect(minutes).toBe(sim.visits.reduce((a, v) => a + v.minutes, 0));
  });

  it('carries pond area, habitat, visit count and the mean water temperature of the season', () => {
    for (const r of rows.filter((_, i) => i % 37 === 0)) {
      const vs = sim.visits.filter((v) => v.pond === r.pond && v.season === r.season);
      expect(r.visits).toBe(vs.length);
      // Rounded to 2 decimals: within half a hundredth.
      expect(Math.abs(r.meanTempC - vs.reduce((a, v) => a + v.waterTempC, 0) / vs.length)).toBeLessThanOrEqual(0.005 + 1e-9);
      const pond = PONDS.find((p) => p.name === r.pond)!;
      expect([r.areaM2, r.habitat]).toEqual([pond.areaM2, pond.habitat]);
    }
  });

  it('as a DataTable: the documented columns, numeric where they should be, no missing values', () => {
    const table = analysisDataTable(rows);
    expect(table.nrows).toBe(rows.length);
    expect(table.columns.map((c) => c.name)).toEqual([...ANALYSIS_COLUMNS]);
    for (const name of ['season', 'count', 'minutes', 'area_m2', 'temp_c', 'visits']) {
      const col = findColumn(table, name)!;
      expect(col.numeric).toBe(true);
      expect(col.values.every((v) => Number.isFinite(v))).toBe(true);
    }
    expect(findColumn(table, 'habitat')!.numeric).toBe(false);
  });

  for (const s of DEMO_TRUTH.species) {
    it(`${s.label}: least-squares slope of log(sum count / sum minutes + 0.5) by season vs true ${(s.annualChange * 100).toFixed(0)} %/yr`, () => {
      const mine = rows.filter((r) => r.species === s.key);
      const y = seasons.map((t) => {
        const rs = mine.filter((r) => r.season === t);
        return Math.log(rs.reduce((a, r) => a + r.count, 0) / rs.reduce((a, r) => a + r.minutes, 0) + 0.5);
      });
      const tm = seasons.reduce((a, b) => a + b, 0) / seasons.length;
      const ym = y.reduce((a, b) => a + b, 0) / y.length;
      const slope = seasons.reduce((a, t, i) => a + (t - tm) * (y[i] - ym), 0) / seasons.reduce((a, t) => a + (t - tm) ** 2, 0);
      const b = logSlope(s);
      if (b === 0) expect(Math.abs(slope)).toBeLessThan(0.05);
      else expect(Math.sign(slope)).toBe(Math.sign(b));
    });
  }
});
