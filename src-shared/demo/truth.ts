import type { Habitat } from './programme';

/**
 * The true parameters the demo counts are simulated from. Per visit v at
 * pond i in season t, species s (habitat h(i), water temperature T_v):
 *
 *   log mu = intercept_s + log(1 + annualChange_s) * (t - baseSeason)
 *          + tempPerDegC_s * (T_v - tempCentreC) + habitat_s[h(i)] + u_si
 *          + 1 * log(minutes_v) + 1 * log(area_i)
 *   u_si ~ Normal(0, siteSd_s)                     (one per pond and species)
 *   count ~ NegBinomial(mean mu, size theta_s)     (variance mu + mu^2/theta_s)
 *   with probability zeroInflation_s the count is an extra zero instead.
 *
 * So exp(intercept) is calling adults heard per listening minute per m² of pond in the base
 * season at tempCentreC in reed habitat. Habitat effects are against "reed".
 */
export interface SpeciesTruth {
  /** Short key used in the clean long table's `species` column. */
  readonly key: string;
  /** Column header on the tally sheets. */
  readonly label: string;
  readonly intercept: number;
  /** Annual change on the count scale: exp(slope) - 1 (e.g. -0.04 = -4 % a year). */
  readonly annualChange: number;
  readonly tempPerDegC: number;
  readonly habitat: Readonly<Record<Habitat, number>>;
  /** SD of the normal pond (site) random intercept on the log scale. */
  readonly siteSd: number;
  /** Negative-binomial size; alpha = 1/theta. */
  readonly theta: number;
  /** Probability that a visit's count is an extra (structural) zero. */
  readonly zeroInflation: number;
}

export interface SurveyDesign {
  /** Chance that a pond is not visited at all in a season. */
  readonly skipSeasonProb: number;
  /** Weights of 2, 3 and 4 visits per pond and season. */
  readonly visitsWeights: Readonly<Record<'2' | '3' | '4', number>>;
  /** Listening minutes and their weights (mostly 5-15). */
  readonly minutesWeights: readonly { minutes: number; weight: number }[];
  /** Chance that a visit is made by the pond's usual observer. */
  readonly usualObserverProb: number;
  /** First and last day of the survey window (day of the year). */
  readonly firstDay: number;
  readonly lastDay: number;
  /** Water temperature (°C) = tempAtFirstDay + tempRisePerDay * (day - firstDay) + season shift + visit noise. */
  readonly tempAtFirstDay: number;
  readonly tempRisePerDay: number;
  readonly tempSeasonSd: number;
  readonly tempVisitSd: number;
  /** Lowest water temperature recorded (colder readings are set to this). */
  readonly tempFloorC: number;
}

export interface DemoTruth {
  readonly firstSeason: number;
  readonly lastSeason: number;
  /** The season the trend is measured from (t - baseSeason = 0). */
  readonly baseSeason: number;
  readonly tempCentreC: number;
  /** Coefficients of the two offsets: both enter with coefficient 1. */
  readonly offsetCoefficients: { readonly logMinutes: number; readonly logArea: number };
  readonly species: readonly SpeciesTruth[];
  readonly design: SurveyDesign;
}

export const DEFAULT_DEMO_SEED = 20120415;

export const DEMO_TRUTH: DemoTruth = {
  firstSeason: 2012,
  lastSeason: 2026,
  baseSeason: 2012,
  tempCentreC: 10,
  offsetCoefficients: { logMinutes: 1, logArea: 1 },
  species: [
    {
      key: 'common_toad',
      label: 'Common toad',
      intercept: -6.6,
      annualChange: -0.04,
      tempPerDegC: 0.06,
      habitat: { reed: 0, sedge: -0.2, open: -0.6, wooded: 0.3 },
      siteSd: 0.5,
      theta: 2.5,
      zeroInflation: 0,
    },
    {
      key: 'common_frog',
      label: 'Common frog',
      intercept: -7.2,
      annualChange: 0.02,
      tempPerDegC: 0.04,
      habitat: { reed: 0, sedge: 0.2, open: -0.3, wooded: 0.1 },
      siteSd: 0.4,
      theta: 1.5,
      zeroInflation: 0,
    },
    {
      key: 'natterjack',
      label: 'Natterjack toad',
      intercept: -7.5,
      annualChange: 0,
      tempPerDegC: 0.08,
      habitat: { reed: 0, sedge: -0.3, open: 0.6, wooded: -1.0 },
      siteSd: 0.5,
      theta: 1.2,
      zeroInflation: 0.35,
    },
    {
      key: 'pool_frog',
      label: 'Pool frog',
      intercept: -7.9,
      annualChange: -0.07,
      tempPerDegC: 0.06,
      habitat: { reed: 0, sedge: 0.1, open: -0.4, wooded: -0.5 },
      siteSd: 0.6,
      theta: 3.0,
      zeroInflation: 0,
    },
  ],
  design: {
    skipSeasonProb: 0.06,
    visitsWeights: { '2': 0.25, '3': 0.5, '4': 0.25 },
    minutesWeights: [
      { minutes: 5, weight: 0.2 },
      { minutes: 8, weight: 0.05 },
      { minutes: 10, weight: 0.4 },
      { minutes: 12, weight: 0.05 },
      { minutes: 15, weight: 0.25 },
      { minutes: 20, weight: 0.05 },
    ],
    usualObserverProb: 0.8,
    firstDay: 74,
    lastDay: 151,
    tempAtFirstDay: 5.5,
    tempRisePerDay: 0.1,
    tempSeasonSd: 0.8,
    tempVisitSd: 1.6,
    tempFloorC: 2,
  },
};

/** The slope b of the log-linear trend: log(1 + annualChange). */
export function logSlope(s: SpeciesTruth): number {
  return Math.log1p(s.annualChange);
}

/** The seasons of the programme, first to last. */
export function seasonsOf(truth: DemoTruth): number[] {
  const out: number[] = [];
  for (let y = truth.firstSeason; y <= truth.lastSeason; y++) out.push(y);
  return out;
}

/** What one visit's counts depend on, apart from the species. */
export interface VisitConditions {
  readonly season: number;
  readonly minutes: number;
  readonly areaM2: number;
  readonly waterTempC: number;
  readonly habitat: Habitat;
}

/** The negative-binomial mean mu of one visit's count (before extra zeros), given the pond's random effect u. */
export function expectedCount(truth: DemoTruth, s: SpeciesTruth, v: VisitConditions, u: number): number {
  const eta =
    s.intercept +
    logSlope(s) * (v.season - truth.baseSeason) +
    s.tempPerDegC * (v.waterTempC - truth.tempCentreC) +
    s.habitat[v.habitat] +
    u +
    truth.offsetCoefficients.logMinutes * Math.log(v.minutes) +
    truth.offsetCoefficients.logArea * Math.log(v.areaM2);
  return Math.exp(eta);
}
