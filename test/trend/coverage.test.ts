import { describe, expect, it } from 'vitest';
import { slopeCoverage } from '@shared/trend/coverage-study';

// Seeded coverage study (common practice: a 95% interval should cover the
// truth in 95% of repeated samples). Negative-binomial counts (theta 2) with
// normal site effects (SD 0.5), 25 sites x 8 seasons x 2 visits, 4% a year
// decline; refitted with MASS-style NB and fixed (absorbed) site effects.
// 200 replicates: the binomial 99% band around 0.95 is
// 0.95 ± 2.576 sqrt(0.95 * 0.05 / 200) = [0.910, 0.990].
// The full 2,000-replicate version is bench/trend/coverage.ts.
describe('coverage of the 95% slope limits', () => {
  it('covers the true slope at a rate inside the 99% binomial band around 0.95', async () => {
    const design = { sites: 25, seasons: 8, visits: 2, meanCount: 4, theta: 2, siteSd: 0.5, annualChange: -0.04, alpha: 0.05 };
    const r = await slopeCoverage(design, 200, 2026);
    expect(r.failed).toBeLessThanOrEqual(2);
    const band = 2.576 * Math.sqrt((0.95 * 0.05) / r.replicates);
    expect(Math.abs(r.coverage - 0.95), `coverage ${r.coverage}`).toBeLessThanOrEqual(band);
  });
});
