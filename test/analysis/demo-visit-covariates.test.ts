import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { demoProjectWithImports } from '../../src-main/demo/demo-project';
import { writeDemoCsv } from '../../src-main/demo/write-workbooks';
import { projectAnalysis } from '../../src-main/project/project-analysis';
import { DEMO_TRUTH } from '@shared/demo/truth';
import { findColumn } from '@shared/data/table';

// The demo's season sheets record the water temperature on each visit
// (invented, simulated data). The app maps it as a visit covariate, so the
// analysis table's water_temp_c must be the mean over each row's visits:
// the demo's own clean table (src-shared/demo/analysis-table.ts, written by
// a separate path straight from the simulation) gives that mean to 2
// decimals as temp_c. Rows where a planted code ("NS", "x") took a visit out
// use fewer visits than the clean table and are not compared.

describe('the demo water temperature as a visit covariate', () => {
  it('is in the analysis table as the mean over each row\'s visits', async () => {
    const { document: doc } = await demoProjectWithImports();
    const a = await projectAnalysis(doc);
    expect(a.analysis.visitCovariates).toEqual([{ name: 'Water temp (°C)', column: 'water_temp_c', kind: 'number', disagreeing: 0 }]);
    const label = new Map(DEMO_TRUTH.species.map((s) => [s.key, s.label]));
    const parsed = Papa.parse<Record<string, string>>(writeDemoCsv().trim(), { header: true });
    const clean = new Map(parsed.data.map((r) => [`${r.pond}|${r.season}|${label.get(r.species)}`, { temp: Number(r.temp_c), visits: Number(r.visits) }]));
    const t = a.table;
    const col = (name: string) => findColumn(t, name)!;
    let compared = 0;
    for (let k = 0; k < t.nrows; k++) {
      const key = `${col('site').texts[k]}|${col('season').texts[k]}|${col('species').texts[k]}`;
      const c = clean.get(key)!;
      if (col('visits').values[k] !== c.visits) continue;
      compared++;
      expect(Math.abs(col('water_temp_c').values[k] - c.temp), key).toBeLessThanOrEqual(0.005 + 1e-9);
    }
    // All but the few rows a planted code shortened.
    expect(compared).toBeGreaterThan(t.nrows - 10);
  });
});
