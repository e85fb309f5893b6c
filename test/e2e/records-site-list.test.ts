import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { afterAll, describe, expect, it } from 'vitest';
import { closeBrowser, openApp } from './harness';
import { loadProject } from '../../src-main/project/project-store';

// A programme other than the demo: a workbook of our own making (invented
// counts) with a counts sheet, a site-list sheet under a title row and a
// notes sheet. The import keeps the other sheets, the Records stage
// suggests the site list, the dialog finds the one site whose name the
// records spell differently, the merge fixes it, and a model with the area
// offset and the habitat attribute is fitted and saved.

afterAll(closeBrowser);
const dir = mkdtempSync(join(tmpdir(), 'tw-e2e-site-list-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const sites = [
  { name: 'Ash Pond', ha: 0.6, habitat: 'open' },
  { name: 'Beck Pool', ha: 1.4, habitat: 'reed' },
  { name: 'Carr Dyke', ha: 0.9, habitat: 'reed' },
  { name: 'Dell Mere', ha: 2.2, habitat: 'open' },
  { name: 'Elm Scrape', ha: 0.3, habitat: 'wooded' },
  { name: 'Fen Hollow', ha: 1.1, habitat: 'wooded' },
];

/** A small seeded generator (Park-Miller), so the counts are the same every run. */
function seeded(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

async function makeWorkbook(file: string): Promise<void> {
  const wb = new ExcelJS.Workbook();
  const counts = wb.addWorksheet('Counts');
  counts.addRow(['Site', 'Date', 'Minutes', 'Species', 'Count']);
  const rnd = seeded(20240611);
  for (const year of [2021, 2022, 2023, 2024]) {
    for (const [k, s] of sites.entries()) {
      for (const month of [4, 6]) {
        // The counts sheet spells one pond's name in lower case in the last season.
        const name = s.name === 'Beck Pool' && year === 2024 ? 'Beck pool' : s.name;
        const date = `${year}-${String(month).padStart(2, '0')}-${String(10 + k).padStart(2, '0')}`;
        for (const species of ['Smooth newt', 'Common frog']) counts.addRow([name, date, 30 + Math.floor(rnd() * 30), species, Math.floor(rnd() * 6 * s.ha + rnd() * 3)]);
      }
    }
  }
  const list = wb.addWorksheet('Sites');
  list.addRow(['Site list of the pond survey']);
  list.addRow(['Site', 'Area (ha)', 'Habitat']);
  for (const s of sites) list.addRow([s.name, s.ha, s.habitat]);
  list.addRow(['Gorse Pit', 0.5, 'open']);
  wb.addWorksheet('Notes').addRow(['Counts by volunteers; see the protocol.']);
  await wb.xlsx.writeFile(file);
}

describe('the site list of a programme', () => {
  it('is kept on import, suggested, checked against the records, fixed by a merge, and gives the area offset', async () => {
    const file = join(dir, 'pond-survey.xlsx');
    const saved = join(dir, 'pond-survey.tallywise');
    await makeWorkbook(file);
    const app = await openApp({ width: 1366, height: 768 });
    const { page } = app;
    try {
      app.dialogs.opens.push(file);
      await app.command('import-workbook');
      await page.getByTestId('records-summary').filter({ hasText: '96 records from 1 workbook' }).waitFor({ timeout: 60_000 });

      // The import kept the Sites sheet, which reads as a site list.
      const suggestion = page.getByTestId('site-list-suggestion');
      await suggestion.waitFor({ timeout: 30_000 });
      await expect.poll(() => suggestion.textContent()).toContain('Sheet “Sites” of pond-survey.xlsx looks like a site list');
      await suggestion.getByRole('button', { name: 'Link it…' }).click();
      const dialog = page.getByRole('dialog', { name: /Site list/ });
      await dialog.waitFor();
      // The guess: headers in row 2 under the title, sites from "Site", area from "Area (ha)" in hectares.
      await expect.poll(() => dialog.getByLabel('Header row').inputValue()).toBe('2');
      await expect.poll(() => dialog.getByLabel('Site name column').inputValue()).toBe('Site');
      await expect.poll(() => dialog.getByLabel('Area column').inputValue()).toBe('Area (ha)');
      await expect.poll(() => dialog.getByLabel('Area unit').inputValue()).toBe('ha');
      await dialog.getByRole('checkbox', { name: 'Habitat' }).check();

      // The mismatch: "Beck pool" (the 2024 records) is not in the list; "Gorse Pit" has no records.
      await expect.poll(() => dialog.getByTestId('site-list-match').textContent()).toContain("6 of the records' 7 sites are in the list (7 sites listed)");
      const unmatched = dialog.getByTestId('site-list-unmatched');
      await expect.poll(() => unmatched.textContent()).toMatch(/“Beck pool” \(4 records\)/);
      await expect.poll(() => dialog.textContent()).toContain('no record names: “Gorse Pit”');
      await app.screenshot('records-site-list-mismatch');

      // A wrong header row is refused in words, naming the row; back to row 2.
      await dialog.getByLabel('Header row').fill('1');
      await expect.poll(() => dialog.getByTestId('site-list-problem').textContent()).toMatch(/has no column "Site" in row 1/);
      await expect.poll(() => dialog.getByRole('button', { name: 'Use this site list' }).isDisabled()).toBe(true);
      await dialog.getByLabel('Header row').fill('2');

      await unmatched.getByRole('button', { name: 'Merge into “Beck Pool”' }).click();
      await expect.poll(() => dialog.getByTestId('site-list-match').textContent()).toContain("6 of the records' 6 sites are in the list");
      await expect.poll(() => dialog.getByTestId('site-list-unmatched').count()).toBe(0);
      await app.screenshot('records-site-list-fixed');
      await dialog.getByRole('button', { name: 'Use this site list' }).click();
      await expect.poll(() => page.getByTestId('site-list-linked').textContent()).toContain('Site list linked: sheet “Sites”');
      await expect.poll(() => page.getByTestId('unsaved-mark').count()).toBe(1);
      // The merge is in the change log, like any other cleaning edit.
      await expect.poll(() => page.getByTestId('records-summary').textContent()).toContain('1 change in effect');
      await app.screenshot('records-site-list-linked');

      // The Models stage offers the area offset and the habitat, not the bookkeeping columns.
      await page.getByRole('button', { name: 'Models' }).click();
      await page.getByTestId('models-summary').waitFor({ timeout: 60_000 });
      await page.getByRole('checkbox', { name: 'Smooth newt', exact: true }).check();
      const area = page.getByRole('checkbox', { name: /^area \(.*area_ha\)/ });
      await expect.poll(() => area.isDisabled()).toBe(false);
      await area.check();
      await expect.poll(() => page.getByLabel('Count part: habitat').count()).toBe(1);
      for (const bookkeeping of ['at_least_records', 'approximate_records', 'present_uncounted']) await expect.poll(() => page.getByLabel(`Count part: ${bookkeeping}`).count()).toBe(0);
      await page.getByLabel('Distribution').selectOption('poisson');
      await page.getByTestId('fit-button').click();
      await page.getByTestId('comparison').locator('tbody tr').first().waitFor({ timeout: 120_000 });
      await app.screenshot('models-area-offset');

      app.dialogs.saves.push(saved);
      await app.command('save-project');
      await expect.poll(() => page.getByTestId('unsaved-mark').count()).toBe(0);
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }

    // What the file holds, read back by the project loader.
    const { document } = await loadProject(saved);
    expect(document.sources[0].sheets.map((g) => g.name)).toEqual(['Counts', 'Sites', 'Notes']);
    expect(document.sites).toEqual({ sourceId: document.sources[0].id, sheet: 'Sites', headerRow: 2, siteColumn: 'Site', area: { column: 'Area (ha)', unit: 'ha' }, covariates: ['Habitat'] });
    expect(document.cleaning.entries.map((e) => (e.kind === 'merge-name' ? [e.field, e.from, e.into] : e.kind))).toEqual([['site', 'Beck pool', 'Beck Pool']]);
    expect(document.models.map((m) => [m.species, m.spec.offsets.map((o) => `${o.log ? 'log ' : ''}${o.column}`)])).toEqual([['Smooth newt', ['log effort_h', 'log area_ha']]]);
  });
});
