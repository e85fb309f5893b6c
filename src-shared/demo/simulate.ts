import { createRng, deriveSeed, pick, pickWeighted, type Rng } from './prng';
import { sampleNegBinomial, sampleNormal } from './samplers';
import { OBSERVERS, PONDS, type DemoPond, type Habitat } from './programme';
import { DEFAULT_DEMO_SEED, DEMO_TRUTH, expectedCount, seasonsOf, type DemoTruth } from './truth';
import { isoDateFromDayOfYear } from './dates';

/** One pond visit of one season, with a count for every species (the clean truth). */
export interface SimulatedVisit {
  readonly pond: string;
  readonly season: number;
  /** ISO date 'YYYY-MM-DD'. */
  readonly date: string;
  /** 1 for the first visit of the season to this pond, and so on. */
  readonly visit: number;
  readonly observer: string;
  readonly minutes: number;
  readonly areaM2: number;
  readonly waterTempC: number;
  readonly habitat: Habitat;
  /** Counts in the order of truth.species. */
  readonly counts: readonly number[];
  /** The negative-binomial means the counts were drawn from (before extra zeros), same order. */
  readonly means: readonly number[];
  /** Free-text remark the observer wrote ('' mostly). */
  readonly remark: string;
}

/** One visit and one species: the clean long record. */
export interface VisitRecord {
  readonly pond: string;
  readonly season: number;
  readonly date: string;
  readonly visit: number;
  readonly species: string;
  readonly count: number;
  readonly minutes: number;
  readonly areaM2: number;
  readonly observer: string;
  readonly waterTempC: number;
  readonly habitat: Habitat;
}

export interface DemoSimulation {
  readonly seed: number;
  readonly truth: DemoTruth;
  readonly ponds: readonly DemoPond[];
  /** Pond random effects u per species key, in pond order. */
  readonly siteEffects: Readonly<Record<string, readonly number[]>>;
  /** Visits in sheet order: season, then pond, then visit number. */
  readonly visits: readonly SimulatedVisit[];
}

const REMARKS = ['windy', 'road noise', 'light rain', 'heard from north bank only', 'water level low', 'frost on margins'];

/** Simulates every season of the demo programme from a seed (same seed, same data). */
export function simulateDemo(seed: number = DEFAULT_DEMO_SEED, truth: DemoTruth = DEMO_TRUTH): DemoSimulation {
  const effectsRng = createRng(deriveSeed(seed, 'pond-effects'));
  const siteEffects: Record<string, number[]> = {};
  for (const s of truth.species) siteEffects[s.key] = PONDS.map(() => sampleNormal(effectsRng, 0, s.siteSd));

  const visits: SimulatedVisit[] = [];
  for (const season of seasonsOf(truth)) {
    const rng = createRng(deriveSeed(seed, `season-${season}`));
    const seasonShift = sampleNormal(rng, 0, truth.design.tempSeasonSd);
    PONDS.forEach((p, pondIndex) => {
      if (rng.uniform() < truth.design.skipSeasonProb) return;
      const n = Number(pickWeighted(rng, Object.entries(truth.design.visitsWeights).map(([value, weight]) => ({ value, weight }))));
      const days = visitDays(rng, truth, n);
      days.forEach((day, k) => {
        const waterTempC = visitTemperature(rng, truth, day, seasonShift);
        const minutes = pickWeighted(rng, truth.design.minutesWeights.map((m) => ({ value: m.minutes, weight: m.weight })));
        const observer = rng.uniform() < truth.design.usualObserverProb ? p.usualObserver : pick(rng, OBSERVERS);
        const conditions = { season, minutes, areaM2: p.areaM2, waterTempC, habitat: p.habitat };
        const means = truth.species.map((s) => expectedCount(truth, s, conditions, siteEffects[s.key][pondIndex]));
        const counts = truth.species.map((s, j) => {
          const extraZero = rng.uniform() < s.zeroInflation;
          const y = sampleNegBinomial(rng, means[j], s.theta);
          return extraZero ? 0 : y;
        });
        const remark = rng.uniform() < 0.06 ? pick(rng, REMARKS) : '';
        visits.push({ pond: p.name, season, date: isoDateFromDayOfYear(season, day), visit: k + 1, observer, minutes, areaM2: p.areaM2, waterTempC, habitat: p.habitat, counts, means, remark });
      });
    });
  }
  return { seed, truth, ponds: PONDS, siteEffects, visits };
}

/** Days of the year of n visits: one in each of n equal parts of the survey window, so they come in order. */
function visitDays(rng: Rng, truth: DemoTruth, n: number): number[] {
  const { firstDay, lastDay } = truth.design;
  const width = (lastDay - firstDay + 1) / n;
  return Array.from({ length: n }, (_, k) => firstDay + Math.floor(k * width + rng.uniform() * (width - 2)));
}

function visitTemperature(rng: Rng, truth: DemoTruth, day: number, seasonShift: number): number {
  const d = truth.design;
  const t = d.tempAtFirstDay + d.tempRisePerDay * (day - d.firstDay) + seasonShift + sampleNormal(rng, 0, d.tempVisitSd);
  return Math.round(Math.max(d.tempFloorC, t) * 10) / 10;
}

/** The clean long records: one per visit and species, species in truth order. */
export function visitRecords(sim: DemoSimulation): VisitRecord[] {
  const out: VisitRecord[] = [];
  for (const v of sim.visits) {
    sim.truth.species.forEach((s, j) => {
      out.push({ pond: v.pond, season: v.season, date: v.date, visit: v.visit, species: s.key, count: v.counts[j], minutes: v.minutes, areaM2: v.areaM2, observer: v.observer, waterTempC: v.waterTempC, habitat: v.habitat });
    });
  }
  return out;
}
