import { describe, expect, it } from 'vitest';
import { analysisTableOf } from '@shared/analysis/analysis-table';
import { siteAttributesFromSheet } from '@shared/analysis/site-attributes';
import { gridFromRows, type GridCell } from '@shared/project/sheet-grid';
import type { CleaningRecord } from '@shared/cleaning/record';
import { tableRoles } from '@shared/model/table-roles';
import { bookkeepingColumns, predictorColumns } from '../../src-renderer/src/views/models/spec-draft';

// The builder's predictor choices once a site list is linked: the site
// attributes are offered, the analysis table's bookkeeping columns (visits
// at-least / approximate / present-uncounted records) and the
// offset columns are not. Invented records and sites.

const t = (text: string): GridCell => ({ text, type: text === '' ? 'blank' : /^[\d.]+$/.test(text) ? 'number' : 'text' });
const grid = gridFromRows('Sites', [['Site', 'Area (ha)', 'Habitat', 'Depth (cm)'], ['Ash Pond', '0.6', 'open', '40'], ['Beck Pool', '1.4', 'reed', '90']].map((r) => r.map(t)));
const link = { sourceId: 's', sheet: 'Sites', headerRow: 1, siteColumn: 'Site', area: { column: 'Area (ha)', unit: 'ha' as const }, covariates: ['Habitat', 'Depth (cm)'] };

const records: CleaningRecord[] = ['Ash Pond', 'Beck Pool'].flatMap((site, i) =>
  ['2023', '2024'].map((season, j) => ({ id: `r${i}${j}`, fields: { site, date: `${season}-05-01`, season, species: 'Smooth newt', count: i + j + 1, effort: 60, status: j === 1 ? 'at-least' : 'counted' } })),
);

describe('predictor choices with a site list', () => {
  it('offer the site attributes and keep the bookkeeping and offset columns out', () => {
    const sites = siteAttributesFromSheet(grid, link, 'sites.xlsx');
    const analysis = analysisTableOf(records, 'minutes', sites.sites, sites.covariates);
    const names = analysis.table.columns.map((c) => c.name);
    // The table does have the bookkeeping columns (for notes and checks) ...
    for (const b of bookkeepingColumns) expect(names).toContain(b);
    const offered = predictorColumns(analysis.table, tableRoles(analysis.table, analysis.effortColumn));
    // ... but only the site attributes and the number of visits summed are offered as predictors.
    expect(offered.map((c) => c.name).sort()).toEqual(['depth_cm', 'habitat', 'visits']);
    expect(offered.find((c) => c.name === 'depth_cm')!.numeric).toBe(true);
    expect(offered.find((c) => c.name === 'habitat')!.levels).toEqual(['open', 'reed']);
  });
});
