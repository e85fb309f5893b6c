/**
 * From the diagnostics back to the cleaning records: model-based outlier
 * flags on analysis rows (site x season x species, visits summed) carry the
 * names that find their visit records again; chart points lead to the
 * records behind them. Seeded invented data (8 sites x 6 seasons, Poisson)
 * with one planted season total far above its site's level.
 */
import { describe, expect, it } from 'vitest';
import { columnFromNumbers, columnFromTexts, findColumn, type DataTable } from '@shared/data/table';
import type { CleaningRecord } from '@shared/cleaning/record';
import { fitModel } from '@shared/engine';
import { parseModelSpec } from '@shared/model/spec';
import { modelOutliers } from '../../src-renderer/src/views/models/diagnostics-outliers';
import { keyOfRow, recordMatches } from '../../src-renderer/src/views/models/diagnostics/record-key';
import { modelOutliersOf, outlierOf, outlierText } from '../../src-renderer/src/views/models/diagnostics/model-outliers';
import { pointLink } from '../../src-renderer/src/views/models/diagnostics/point-records';
import { simulateSites } from './simulated-sites';

const base = simulateSites(21, { sites: 8, seasons: 6, slope: 0, siteSd: 0.3, baseMean: 3 });
const planted = { site: 'S03', season: '2017' };

function analysisTable(): DataTable {
  const site = findColumn(base, 'site')!;
  const season = findColumn(base, 'season')!;
  const count = Float64Array.from(findColumn(base, 'count')!.values);
  const at = site.texts.findIndex((s, i) => s === planted.site && season.texts[i] === planted.season);
  count[at] = 150; // about 30 times its expected total (effort 1-4 h at 3 per hour, site level near 1)
  return {
    nrows: base.nrows,
    columns: [
      ...base.columns.filter((c) => c.name !== 'count'),
      columnFromNumbers('count', count),
      columnFromTexts('species', Array.from({ length: base.nrows }, () => 'Toad')),
      columnFromNumbers('visits', Array.from({ length: base.nrows }, () => 3)),
    ],
  };
}

const table = analysisTable();
const spec = parseModelSpec({ response: 'count', distribution: 'poisson', offsets: [{ column: 'effort_h', log: true }], site: { column: 'site', effect: 'fixed' }, time: { column: 'season', trend: 'annual' } });
const fit = fitModel(table, spec);
const columns = { site: 'site', season: 'season' };

function record(id: string, site: string, season: string, excluded?: string): CleaningRecord {
  return { id, fields: { site: ` ${site}`, season, species: 'Toad', count: 1 }, ...(excluded ? { excluded } : {}) };
}

describe('model outlier flags on analysis rows', () => {
  const result = modelOutliers({ outcome: fit, table, threshold: 1e-6, siteColumn: 'site', seasonColumn: 'season' });

  it('flag the planted total by its site, season and species, with its visits', () => {
    expect(result.flags.length).toBeGreaterThanOrEqual(1);
    const top = result.flags[0];
    expect(top.key).toEqual({ site: 'S03', season: '2017', species: 'Toad' });
    expect(top.count).toBe(150);
    expect(top.visits).toBe(3);
    expect(top.tail).toBe('upper');
    expect(top.probability).toBeLessThan(1e-6);
    expect(result.rowsChecked).toBe(table.nrows);
  });

  it('mark every visit record behind the flagged row, not left-out ones or other seasons', () => {
    const store = modelOutliersOf('Toad', 'Poisson', result, 'k1');
    const visits = [record('a', 'S03', '2017'), record('b', 'S03', '2017')];
    for (const r of visits) expect(outlierOf(store, r)?.count).toBe(150);
    expect(outlierOf(store, record('c', 'S03', '2017', 'copy of row 4'))).toBeUndefined();
    expect(outlierOf(store, record('d', 'S03', '2018'))).toBeUndefined();
    const text = outlierText(store, result.flags[0]);
    expect(text).toMatch(/S03, season 2017 is 150 \(expected [\d.]+\), P\(total ≥ 150\) [=<] /);
    expect(text).toMatch(/3 visits summed\); this record is one of its visits/);
    expect(text).toMatch(/nothing is left out/);
  });
});

describe('chart points lead to their records', () => {
  const row = 10;
  const key = keyOfRow(table, row, columns);

  it('a residual or QQ point ([x, y, row]) names its site, season and species', () => {
    const link = pointLink('residuals-site', [1.2, 2.5, row], table, columns, 'Toad');
    expect(link?.keys).toEqual([key]);
    expect(link?.label).toBe(`Toad at ${key.site}, season ${key.season} (from residuals by site)`);
    expect(pointLink('qq', [0.1, 0.2, row], table, columns, 'Toad')?.keys).toEqual([key]);
    expect(recordMatches(link!.keys[0], record('x', key.site!, key.season!))).toBe(true);
    expect(recordMatches(link!.keys[0], record('y', key.site!, key.season!, 'left out'))).toBe(false);
  });

  it('a site point or bar (rows of the site) names each of its seasons', () => {
    const rows = Array.from(findColumn(table, 'site')!.texts.entries()).filter(([, s]) => s === 'S05').map(([i]) => i);
    const link = pointLink('influence', { value: 0.01, site: 'S05', rows }, table, columns, 'Toad');
    expect(link?.keys).toHaveLength(6);
    expect(new Set(link?.keys.map((k) => k.site))).toEqual(new Set(['S05']));
  });

  it('count-frequency charts and points without rows lead nowhere', () => {
    expect(pointLink('frequencies', [0, 12, row], table, columns, 'Toad')).toBeNull();
    expect(pointLink('residuals-season', [3, 0.4], table, columns, 'Toad')).toBeNull();
  });
});
