import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { closeBrowser, openApp } from './harness';

// A sheet whose headers say nothing the import recognises: the analyst is
// asked which column is which, and the records follow that choice.

afterAll(closeBrowser);

describe('choosing column roles by hand', () => {
  it('asks which column is which, refuses an incomplete choice, then imports with it', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tallywise-e2e-roles-'));
    const file = join(dir, 'ridge-tallies.csv');
    // Invented rows: two places, three visits, two species columns.
    writeFileSync(file, 'Where,When,Tally A,Tally B\nNorth ridge,2020-05-01,3,0\nSouth ridge,2020-05-01,1,2\nNorth ridge,2020-06-01,4,1\n');
    const app = await openApp();
    const { page } = app;
    try {
      app.dialogs.opens.push(file);
      await app.command('import-workbook');
      const dialog = page.getByRole('dialog', { name: /Which column is which in ridge-tallies\.csv/ });
      await dialog.waitFor();
      await expect.poll(() => dialog.textContent()).toContain('"Where"');
      const submit = dialog.getByRole('button', { name: 'Import with these columns' });
      await expect.poll(() => submit.isDisabled()).toBe(true);
      await expect.poll(() => dialog.getByRole('status').textContent()).toMatch(/site/);
      await dialog.getByLabel('Part of column Where').selectOption('site');
      await dialog.getByLabel('Part of column When').selectOption('date');
      await expect.poll(() => dialog.getByRole('status').textContent()).toMatch(/count columns/);
      await dialog.getByLabel('Part of column Tally A').selectOption('speciesColumn');
      await dialog.getByLabel('Part of column Tally B').selectOption('speciesColumn');
      await app.screenshot('records-roles-dialog');
      await submit.click();
      await page.getByTestId('records-summary').filter({ hasText: '6 records from 1 workbook' }).waitFor();
      await expect.poll(() => page.getByLabel('Filter by site').locator('option').allTextContents()).toEqual(['All sites (2)', 'North ridge', 'South ridge']);
      await expect.poll(() => page.getByLabel('Filter by species').locator('option').allTextContents()).toEqual(['All species (2)', 'Tally A', 'Tally B']);
      // Dates typed as text are the rule in a CSV, so they are not flagged one by one.
      await expect.poll(() => page.getByTestId('records-summary').textContent()).toContain('0 findings still open');
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
  });
});
