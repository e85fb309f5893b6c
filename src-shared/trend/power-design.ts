/**
 * A monitoring design to judge: how many sites, seasons and visits, and the
 * counts expected under it. Counts are simulated as
 *   y_itv ~ NegBinomial(mean m exp(u_i) (1 + r)^t, size theta)   (Poisson when theta is null)
 *   u_i ~ Normal(0, siteSd),  t = 0 .. seasons-1,  v = 1 .. visits
 * so m is the mean count of one visit at a typical site (u = 0) in the first season.
 */
export interface PowerDesign {
  sites: number;
  seasons: number;
  visits: number;
  meanCount: number;
  /** Negative-binomial size; null simulates Poisson counts. */
  theta: number | null;
  siteSd: number;
  /** Annual change on the count scale (-0.05 = 5% a year fewer). */
  annualChange: number;
  /** Two-sided test level. */
  alpha: number;
}

export const DEFAULT_DESIGN: PowerDesign = { sites: 20, seasons: 10, visits: 2, meanCount: 5, theta: 2, siteSd: 0.5, annualChange: -0.05, alpha: 0.05 };

/** A sentence naming the first value out of range, or null when the design is usable. */
export function designProblem(d: PowerDesign): string | null {
  const whole = (v: number, lo: number) => Number.isInteger(v) && v >= lo;
  if (!whole(d.sites, 2)) return `The number of sites must be a whole number of at least 2, not ${d.sites}.`;
  if (!whole(d.seasons, 3)) return `The number of seasons must be a whole number of at least 3, not ${d.seasons}.`;
  if (!whole(d.visits, 1)) return `The number of visits per season must be a whole number of at least 1, not ${d.visits}.`;
  if (!(d.meanCount > 0 && Number.isFinite(d.meanCount))) return `The mean count must be above 0, not ${d.meanCount}.`;
  if (d.theta !== null && !(d.theta > 0 && Number.isFinite(d.theta))) return `Theta (the negative-binomial size) must be above 0, not ${d.theta}.`;
  if (!(d.siteSd >= 0 && Number.isFinite(d.siteSd))) return `The site SD must be 0 or more, not ${d.siteSd}.`;
  if (!(d.annualChange > -1 && Number.isFinite(d.annualChange))) return `The annual change is a fraction above -1 (-0.05 for 5% a year fewer), not ${d.annualChange}.`;
  if (!(d.alpha > 0 && d.alpha < 1)) return `The test level alpha lies between 0 and 1 (e.g. 0.05), not ${d.alpha}.`;
  return null;
}
