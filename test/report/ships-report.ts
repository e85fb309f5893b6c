/**
 * The report of one published dataset, shared by the renderer tests.
 * Reference: MASS::ships (open dataset, service > 0), stats::glm poisson
 * with type + year of construction + offset(log(service)), R 4.2.2 and MASS
 * 7.3.58.2, values from test/reference/trend/make-trend.R (fixture
 * test/reference/trend/trend-fixtures.json). Ship type "A" is renamed to
 * markup, so every renderer can be checked for escaping.
 */
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { tableFromTexts, type DataTable } from '@shared/data/table';
import { parseModelSpec, type ModelSpec } from '@shared/model/spec';
import { buildTrendReport } from '@shared/report/build';
import type { ReportDocument } from '@shared/report/model';
import { decisionFlags } from '@shared/trend/flags';
import { analyseTrend, type TrendResult } from '@shared/trend/trend-analysis';

export const MARKUP = '<img src=x onerror=alert(1)>';

export const fixture = JSON.parse(readFileSync(join(resolve(__dirname, '../..'), 'test/reference/trend/trend-fixtures.json'), 'utf8'));
export const reference = fixture.ships.poisson as {
  indices: { time: number; index: number; lower: number; upper: number }[];
  slope: { perYear: number; lower: number; upper: number };
};
export const tolerance = fixture.tolerance as { index: number; limit: number; slope: number };

export function shipsTable(): DataTable {
  const d = fixture.ships.data as Record<string, (string | number)[]>;
  const header = Object.keys(d);
  const rows = d.incidents.map((_v, i) => header.map((h) => (h === 'type' && d[h][i] === 'A' ? MARKUP : String(d[h][i]))));
  return tableFromTexts(header, rows);
}

/** Type as a factor is the same model as type as fixed site effects; here its levels show up as coefficient terms. */
export const shipsSpec: ModelSpec = parseModelSpec({
  response: 'incidents',
  distribution: 'poisson',
  predictors: [{ column: 'type', type: 'factor', reference: 'B' }],
  offsets: [{ column: 'service', log: true }],
  time: { column: 'year', trend: 'annual' },
});

export interface ShipsReport {
  doc: ReportDocument;
  result: TrendResult;
}

let cached: Promise<ShipsReport> | undefined;

export function shipsReport(): Promise<ShipsReport> {
  cached ??= (async () => {
    const result = await analyseTrend(shipsTable(), shipsSpec);
    const doc = buildTrendReport({
      title: `Incidents of ${MARKUP}`,
      spec: shipsSpec,
      groupColumn: 'species',
      groups: [{ group: MARKUP, result, flags: decisionFlags(result.slope) }],
      provenance: {
        software: { name: 'Tallywise', version: '0.0.0-test' },
        inputs: [{ name: `${MARKUP}.csv`, sha256: 'ab'.repeat(32), rows: 34 }],
        seeds: [],
        createdAt: '2026-01-02T03:04:05.000Z',
      },
    });
    return { doc, result };
  })();
  return cached;
}
