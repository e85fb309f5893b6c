import { describe, expect, it } from 'vitest';
import { checkSiteList, guessSiteList, headerRowProblem, headersAt, looksLikeSiteList } from '@shared/analysis/site-list';
import { gridFromRows, type GridCell } from '@shared/project/sheet-grid';
import type { SiteSheetLink } from '@shared/project/site-sheet-link';

// Hand-written site lists (invented names and areas).
const t = (text: string): GridCell => ({ text, type: text === '' ? 'blank' : /^-?[\d.]+$/.test(text) ? 'number' : 'text' });
const sheet = (name: string, rows: string[][]) => gridFromRows(name, rows.map((r) => r.map(t)));

const ponds = sheet('Ponds', [
  ['Pond survey sites', '', ''],
  ['Pond', 'Surface (ha)', 'Shade'],
  ['Alder Pool', '0.4', 'open'],
  ['Brook Hollow', '1.25', 'shaded'],
  ['Cress Bed', '0.8', 'open'],
  ['Dyke End', '2', 'open'],
]);
const link: SiteSheetLink = { sourceId: 's1', sheet: 'Ponds', headerRow: 2, siteColumn: 'Pond', area: { column: 'Surface (ha)', unit: 'ha' }, covariates: ['Shade'] };

describe('site list headers', () => {
  it('reads a row of headers and refuses a blank row, a row of numbers and a repeated header, naming the row', () => {
    expect(headersAt(ponds, 2)).toEqual(['Pond', 'Surface (ha)', 'Shade']);
    expect(headerRowProblem(ponds, 2)).toBeNull();
    const blank = sheet('S', [['', ''], ['A', '1']]);
    expect(headerRowProblem(blank, 1)).toMatch(/Row 1 of sheet "S" is blank/);
    const numbers = sheet('Areas', [['1', '2.5'], ['2', '3']]);
    expect(headerRowProblem(numbers, 1)).toMatch(/Row 1 of sheet "Areas" holds only numbers .*no header row/);
    const twice = sheet('T', [['Site', 'Site'], ['A', 'B']]);
    expect(headerRowProblem(twice, 1)).toMatch(/names the column "Site" twice/);
    expect(headerRowProblem(ponds, 9)).toMatch(/past the end of the sheet \(it has 6 rows\)/);
  });

  it('guesses the header row, the site column and the area column with its unit from the header', () => {
    expect(guessSiteList(ponds)).toEqual({ headerRow: 2, siteColumn: 'Pond', area: { column: 'Surface (ha)', unit: 'ha' } });
    const m2 = sheet('Plots', [['Plot', 'Area m²', 'Habitat'], ['P1', '2500', 'heath']]);
    expect(guessSiteList(m2)).toEqual({ headerRow: 1, siteColumn: 'Plot', area: { column: 'Area m²', unit: 'm2' } });
    // An area header over texts is not an area column.
    const texts = sheet('Plots', [['Site', 'Area'], ['P1', 'north'], ['P2', 'south']]);
    expect(guessSiteList(texts)).toEqual({ headerRow: 1, siteColumn: 'Site', area: null });
    expect(looksLikeSiteList(texts)).toBeNull();
    // A counts sheet has no site list's shape when it has no site header.
    expect(guessSiteList(sheet('Counts', [['Date', 'Species', 'Count'], ['2025-04-01', 'Toad', '3']]))).toBeNull();
  });
});

describe('checking a site list against the records', () => {
  const records = new Map([
    ['Alder Pool', 12],
    ['Brook Hollow', 8],
    ['Cress  bed', 5],
    ['Mill Race', 3],
    [' Dyke End ', 4],
  ]);

  it('counts the matching sites and names those the list lacks, most records first, with a close list name to merge into', () => {
    const c = checkSiteList(ponds, link, 'season.xlsx', records);
    expect(c.unusable).toBe(false);
    expect(c.listed).toBe(4);
    expect(c.matched).toEqual(['Alder Pool', 'Brook Hollow', 'Dyke End']);
    expect(c.unmatched).toEqual([
      { name: 'Cress  bed', records: 5, like: 'Cress Bed' },
      { name: 'Mill Race', records: 3, like: null },
    ]);
    expect(c.unused).toEqual(['Cress Bed']);
    expect(c.problems).toEqual([]);
  });

  it('passes on the list problems: duplicate names and areas that are not positive numbers, with their rows', () => {
    const bad = sheet('Ponds', [
      ['Pond', 'Surface (ha)'],
      ['Alder Pool', '0.4'],
      ['Brook Hollow', 'n/a'],
      ['Alder Pool', '0.5'],
      ['Cress Bed', '-1'],
      ['Dyke End', '0'],
    ]);
    const c = checkSiteList(bad, { ...link, headerRow: 1, covariates: [] }, 'season.xlsx', records);
    expect(c.unusable).toBe(false);
    expect(c.problems).toEqual([
      expect.stringMatching(/row 3\) gives "Brook Hollow" the area "n\/a", which is not a positive number/),
      expect.stringMatching(/names "Alder Pool" twice \(row 4 is the second\)/),
      expect.stringMatching(/row 5\) gives "Cress Bed" the area "-1"/),
      expect.stringMatching(/row 6\) gives "Dyke End" the area "0"/),
    ]);
  });

  it('is unusable with a wrong header row or a column the row does not have', () => {
    const wrongRow = checkSiteList(ponds, { ...link, headerRow: 1 }, 'season.xlsx', records);
    expect(wrongRow.unusable).toBe(true);
    expect(wrongRow.problems[0]).toMatch(/has no column "Pond" in row 1/);
    const noArea = checkSiteList(sheet('Ponds', [['', ''], ['Pond', 'ha']]), link, 'season.xlsx', records);
    expect(noArea.unusable).toBe(true);
    expect(noArea.problems[0]).toMatch(/has no column "Surface \(ha\)" in row 2/);
    const blankRow = checkSiteList(sheet('Ponds', [['', ''], ['Pond', 'ha']]), { ...link, headerRow: 1 }, 'season.xlsx', records);
    expect(blankRow).toMatchObject({ unusable: true, problems: [expect.stringMatching(/Row 1 of sheet "Ponds" is blank/)] });
  });
});
