import { describe, expect, it } from 'vitest';
import { covariateName, siteAttributesFromSheet, SiteSheetError } from '@shared/analysis/site-attributes';
import { gridFromRows, type GridCell } from '@shared/project/sheet-grid';
import type { SiteSheetLink } from '@shared/project/site-sheet-link';

// A hand-written site list (invented). Areas converted with 1 ha = 10 000 m²
// and 1 km² = 100 ha (SI definitions).
const t = (text: string): GridCell => ({ text, type: text === '' ? 'blank' : /^[\d.]+$/.test(text) ? 'number' : 'text' });
const grid = gridFromRows(
  'Sites',
  [
    ['Site list 2025', '', '', ''],
    ['Site', 'Area (m²)', 'Habitat', 'Water depth (cm)'],
    ['North Pool', '2500', 'reed', '40'],
    ['South Pool ', '', 'open', '25'],
    ['', '', '', ''],
    ['Mill Pond', '12000', 'wooded', '90'],
    ['North Pool', '300', 'sedge', '10'],
  ].map((r) => r.map(t)),
);
const link: SiteSheetLink = { sourceId: 's1', sheet: 'Sites', headerRow: 2, siteColumn: 'Site', area: { column: 'Area (m²)', unit: 'm2' }, covariates: ['Habitat', 'Water depth (cm)'] };

describe('site list from a linked sheet', () => {
  it('reads areas in hectares and covariates by plain names, keyed by the trimmed site name', () => {
    const r = siteAttributesFromSheet(grid, link, 'sites.xlsx');
    expect(r.covariates).toEqual(['habitat', 'water_depth_cm']);
    expect([...r.sites.keys()]).toEqual(['North Pool', 'South Pool', 'Mill Pond']);
    expect(r.sites.get('North Pool')).toEqual({ areaHa: 0.25, covariates: { habitat: 'reed', water_depth_cm: '40' } });
    expect(r.sites.get('Mill Pond')!.areaHa).toBeCloseTo(1.2, 12);
    expect(siteAttributesFromSheet(grid, { ...link, area: { column: 'Area (m²)', unit: 'km2' } }, 'sites.xlsx').sites.get('North Pool')!.areaHa).toBe(250000);
  });

  it('lists a blank area and a repeated site as problems naming the row, and keeps the rest', () => {
    const r = siteAttributesFromSheet(grid, link, 'sites.xlsx');
    expect(r.problems).toEqual([
      expect.stringMatching(/sheet "Sites" of sites\.xlsx, row 4\) gives "South Pool" the area "", which is not a positive number/),
      expect.stringMatching(/names "North Pool" twice \(row 7 is the second\); the first row is used/),
    ]);
    expect(r.sites.get('South Pool')).toEqual({ areaHa: null, covariates: { habitat: 'open', water_depth_cm: '25' } });
  });

  it('refuses a link to a column the sheet does not have, listing the headers', () => {
    expect(() => siteAttributesFromSheet(grid, { ...link, siteColumn: 'Pond' }, 'sites.xlsx')).toThrow(SiteSheetError);
    expect(() => siteAttributesFromSheet(grid, { ...link, siteColumn: 'Pond' }, 'sites.xlsx')).toThrow(/no column "Pond" in row 2; its headers are "Site", "Area \(m²\)", "Habitat", "Water depth \(cm\)"/);
    expect(covariateName('  %% ')).toBe('site_covariate');
  });
});
