import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { afterAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeBrowser, openApp } from './harness';
import { loadProject } from '../../src-main/project/project-store';

// Covariates recorded on each visit (the water temperature, a number, and
// the wind, a text) on the counts sheet of a workbook of our own making
// (invented counts): the import finds them, the Records grid shows a column
// for each and takes a correction into the change log (for every record of
// the visit's row), the project keeps them, the Models stage offers them as
// predictors with the rule for combining visits and the rows a blank
// temperature leaves out, and the fit lists the temperature's coefficient.

afterAll(closeBrowser);
const dir = mkdtempSync(join(tmpdir(), 'tw-e2e-visit-cov-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const ponds = ['Ash Pond', 'Beck Pool', 'Carr Dyke', 'Dell Mere', 'Elm Scrape', 'Fen Hollow'];
const TEMP = 'Water temp (°C)';
const TEMP_FIELD = `cov:${TEMP}`;

/** A small seeded generator (Park-Miller), so the counts are the same every run. */
function seeded(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

async function makeWorkbook(file: string): Promise<void> {
  const wb = new ExcelJS.Workbook();
  const counts = wb.addWorksheet('Counts');
  counts.addRow(['Pond', 'Date', 'Minutes', TEMP, 'Wind', 'Smooth newt', 'Common frog']);
  const rnd = seeded(20250317);
  for (const year of [2021, 2022, 2023, 2024]) {
    for (const [k, pond] of ponds.entries()) {
      for (const month of [4, 6]) {
        const temp = Math.round((8 + month + rnd() * 6) * 10) / 10;
        // Blank temperatures: the very first visit (corrected below), and both Elm Scrape visits of 2022 (left blank).
        const blank = (year === 2021 && k === 0 && month === 4) || (pond === 'Elm Scrape' && year === 2022);
        const newt = Math.floor(rnd() * 4 + (temp - 8) * 0.6);
        const frog = Math.floor(rnd() * 5);
        // Wind: calm, except a breezy June visit at Carr Dyke in 2023 (that season's two visits then disagree).
        const wind = pond === 'Carr Dyke' && year === 2023 && month === 6 ? 'breezy' : 'calm';
        counts.addRow([pond, `${year}-${String(month).padStart(2, '0')}-${String(10 + k).padStart(2, '0')}`, 30 + Math.floor(rnd() * 30), blank ? null : temp, wind, newt, frog]);
      }
    }
  }
  await wb.xlsx.writeFile(file);
}

function tempCell(page: Page, rowIndex: number) {
  return page.getByTestId('records-grid').locator(`.ag-row[row-index="${rowIndex}"] .ag-cell[col-id="${TEMP_FIELD}"]`);
}

describe('a covariate recorded per visit', () => {
  it('is shown and corrected in Records, kept in the project, offered in the builder and fitted', async () => {
    const file = join(dir, 'pond-temps.xlsx');
    const saved = join(dir, 'pond-temps.tallywise');
    await makeWorkbook(file);
    const app = await openApp({ width: 1366, height: 768 });
    const { page } = app;
    try {
      app.dialogs.opens.push(file);
      await app.command('import-workbook');
      await page.getByTestId('records-summary').filter({ hasText: '96 records from 1 workbook' }).waitFor({ timeout: 60_000 });

      // The grid has a column for the temperature, with the cells' numbers.
      const header = page.getByTestId('records-grid').locator(`.ag-header-cell[col-id="${TEMP_FIELD}"]`);
      await expect.poll(() => header.textContent()).toContain(TEMP);
      await expect.poll(() => page.getByTestId('records-grid').locator('.ag-header-cell[col-id="cov:Wind"]').textContent()).toContain('Wind');
      // The first record (Ash Pond's first visit, smooth newt) has no temperature; the third (its second visit) has one.
      const first = tempCell(page, 0);
      await expect.poll(async () => (await first.textContent())?.trim()).toBe('');
      await expect.poll(async () => Number((await tempCell(page, 2).textContent())?.trim())).toBeGreaterThan(8);

      // A correction with a decimal comma: read as 11.5, set on both records of the visit's row (newt and frog).
      await first.dblclick();
      await page.keyboard.press('ControlOrMeta+a');
      await page.keyboard.type('11,5');
      await page.keyboard.press('Enter');
      await expect.poll(async () => (await first.textContent())?.trim()).toBe('11.5');
      await expect.poll(() => first.getAttribute('class')).toContain('is-edited');
      await expect.poll(async () => (await tempCell(page, 1).textContent())?.trim()).toBe('11.5');
      await expect.poll(() => page.getByTestId('records-summary').textContent()).toContain('2 changes in effect');
      // Text in a number column is refused in words.
      await tempCell(page, 2).dblclick();
      await page.keyboard.press('ControlOrMeta+a');
      await page.keyboard.type('warm');
      await page.keyboard.press('Enter');
      await expect.poll(() => page.locator('body').textContent()).toContain(`"warm" is not a number, and "${TEMP}" holds numbers.`);
      await app.screenshot('records-visit-covariate');

      // The Models stage: the temperature is offered as a number, with the rule for a row of several visits.
      await page.getByRole('button', { name: 'Models' }).click();
      await page.getByTestId('models-summary').waitFor({ timeout: 60_000 });
      await page.getByRole('checkbox', { name: 'Smooth newt', exact: true }).check();
      const hint = page.getByTestId('visit-covariates-hint');
      await expect.poll(() => hint.textContent()).toContain(`water_temp_c (from “${TEMP}”, a number)`);
      await expect.poll(() => hint.textContent()).toContain('a number is the mean over the row’s visits that have a value');
      // The wind is text: Carr Dyke 2023 (a row per species) has a calm and a breezy visit, so those 2 rows are left blank.
      await expect.poll(() => hint.textContent()).toContain('wind (from “Wind”, text)');
      await expect.poll(() => hint.textContent()).toContain('where they differ the cell is left blank (wind: 2 rows)');
      const picker = page.getByLabel('Count part: water_temp_c');
      await picker.selectOption('numeric');
      // Elm Scrape 2022 has no temperature on either visit: the builder says the fit leaves that row out (24 rows: 6 ponds x 4 seasons).
      await expect.poll(() => page.getByTestId('predictor-notes').textContent()).toContain('"water_temp_c" is blank in 1 of the 24 Smooth newt rows (Elm Scrape, 2022), so the fit leaves that row out.');
      await expect.poll(() => page.getByTestId('spec-problems').count()).toBe(0);
      await page.getByLabel('Distribution').selectOption('poisson');
      await page.getByTestId('predictor-notes').scrollIntoViewIfNeeded();
      await app.screenshot('models-visit-covariate-builder');
      await page.getByTestId('fit-button').click();
      await page.getByTestId('comparison').locator('tbody tr').first().waitFor({ timeout: 120_000 });
      const coefs = page.getByTestId('coefficients');
      await expect.poll(() => coefs.locator('tbody th', { hasText: 'water_temp_c' }).count()).toBe(1);
      await expect.poll(() => page.getByTestId('fit-warnings').textContent()).toContain('1 row was left out because a used column is blank');
      await coefs.scrollIntoViewIfNeeded();
      await app.screenshot('models-visit-covariate-fit');

      app.dialogs.saves.push(saved);
      await app.command('save-project');
      await expect.poll(() => page.getByTestId('unsaved-mark').count()).toBe(0);
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }

    // The file keeps the column's role and the correction as log entries.
    const { document } = await loadProject(saved);
    const mapping = document.mapping as { sources: { roles: { covariates?: string[] } }[] };
    expect(mapping.sources[0].roles.covariates).toEqual([TEMP, 'Wind']);
    expect(document.cleaning.entries.map((e) => (e.kind === 'set-value' ? [e.field, e.old, e.new] : e.kind))).toEqual([
      [TEMP_FIELD, null, 11.5],
      [TEMP_FIELD, null, 11.5],
    ]);

    // Opened again, the grid shows the column with the corrected value.
    const again = await openApp({ width: 1366, height: 768 });
    try {
      again.dialogs.opens.push(saved);
      await again.command('open-project');
      await again.page.getByTestId('records-summary').filter({ hasText: '96 records from 1 workbook' }).waitFor({ timeout: 60_000 });
      await expect.poll(async () => (await tempCell(again.page, 0).textContent())?.trim()).toBe('11.5');
      expect(again.consoleErrors).toEqual([]);
    } finally {
      await again.close();
    }
  });
});
