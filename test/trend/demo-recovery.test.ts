import { describe, expect, it } from 'vitest';
import { splitBy, tableFromTexts } from '@shared/data/table';
import { DEMO_TRUTH } from '@shared/demo/truth';
import { parseModelSpec } from '@shared/model/spec';
import { analyseTrend } from '@shared/trend/trend-analysis';
import { writeDemoCsv } from '../../src-main/demo/write-workbooks';

// The demo programme's analysis recovers each species' true annual change
// (src-shared/demo/truth.ts; invented scenario, seeded) within its 95% limits.
// Spec: negative binomial (zero-inflated NB for the species with planted
// extra zeros), offsets log(minutes) and log(area_m2), fixed pond effects
// (they absorb habitat), water temperature, a linear trend in season.
const text = writeDemoCsv({});
const lines = text.trim().split(/\r?\n/);
const table = tableFromTexts(lines[0].split(','), lines.slice(1).map((l) => l.split(',')));

describe('demo: true trends recovered', () => {
  for (const { key, table: t } of splitBy(table, 'species')) {
    const truth = DEMO_TRUTH.species.find((s) => s.key === key)!;
    it(`${key}: true change ${truth.annualChange} a season lies within the 95% slope limits`, async () => {
      const spec = parseModelSpec({
        response: 'count',
        distribution: truth.zeroInflation > 0 ? 'zinb' : 'negbin',
        predictors: [{ column: 'temp_c', type: 'numeric' }],
        offsets: [{ column: 'minutes', log: true }, { column: 'area_m2', log: true }],
        site: { column: 'pond', effect: 'fixed' },
        time: { column: 'season', trend: 'linear' },
      });
      const r = await analyseTrend(t, spec);
      const said = `${key}: truth ${truth.annualChange}, estimate ${r.slope.perYear.toFixed(4)} (${r.slope.lower.toFixed(4)} to ${r.slope.upper.toFixed(4)})`;
      expect(r.fit.converged, said).toBe(true);
      expect(r.slope.lower, said).toBeLessThanOrEqual(truth.annualChange);
      expect(r.slope.upper, said).toBeGreaterThanOrEqual(truth.annualChange);
      expect(r.slope.upper - r.slope.lower).toBeLessThan(0.08);
    });
  }
});
