import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeBrowser, openApp } from './harness';
import { writeVisitWorkbook } from '../import/visit-workbook';

// A big workbook's import shows its progress and can be cancelled: the
// project it was going into stays exactly as it was, with a note saying so;
// imported again, it runs to the end. Invented data (visit-workbook.ts).

const ROWS = 150_000;
const dir = mkdtempSync(join(tmpdir(), 'tw-import-progress-e2e-'));
const small = join(dir, 'pilot-visits.csv');
const big = join(dir, 'season-visits.xlsx');

beforeAll(async () => {
  // Invented rows: two ponds, three visits, two species columns.
  writeFileSync(small, 'Site,Date,Newt,Toad\nPond A,2021-04-02,3,0\nPond B,2021-04-02,1,2\nPond A,2021-05-03,4,1\n');
  await writeVisitWorkbook(big, ROWS, 400);
}, 120_000);
afterAll(closeBrowser);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('importing a big workbook', () => {
  // The cancel races the import: the services run in this same Node process, so on a quiet machine the
  // import can end before the click gets through. A new app per attempt; every assertion stays as it is.
  it('shows the stage and a bar, cancels leaving the project as it was, and imports to the end the second time', { retry: 2, timeout: 400_000 }, async () => {
    const app = await openApp({ width: 1366, height: 768 });
    const { page } = app;
    try {
      app.dialogs.opens.push(small);
      await app.command('import-workbook');
      const summary = page.getByTestId('records-summary');
      await summary.filter({ hasText: '6 records from 1 workbook' }).waitFor({ timeout: 30_000 });
      const before = await summary.textContent();
      const gridRowsBefore = await page.getByRole('row').count();

      // Cancel as soon as the bar shows (the whole import takes a few seconds).
      app.dialogs.opens.push(big);
      await app.command('import-workbook');
      const progress = page.getByTestId('import-progress');
      await progress.waitFor({ timeout: 30_000 });
      await expect.poll(() => progress.textContent()).toContain('Importing season-visits.xlsx');
      await page.getByTestId('cancel-import').click({ timeout: 60_000, noWaitAfter: true });
      const note = page.getByTestId('import-note');
      await note.waitFor({ timeout: 60_000 });
      await expect.poll(() => note.textContent()).toContain('The import of season-visits.xlsx was cancelled. Nothing of it was added');
      await expect.poll(() => progress.count()).toBe(0);
      await expect.poll(() => page.getByTestId('problem').count()).toBe(0);
      // The project is as it was: the same summary, the same grid, still one workbook.
      await expect.poll(() => summary.textContent()).toBe(before);
      await expect.poll(() => page.getByRole('row').count()).toBe(gridRowsBefore);
      await app.screenshot('records-import-cancelled');

      app.dialogs.opens.push(big);
      await app.command('import-workbook');
      await progress.waitFor({ timeout: 30_000 });
      await expect.poll(() => note.count()).toBe(0);
      // The stage in words and the bar, as the host reports them.
      const text = page.getByTestId('import-progress-text');
      await text.filter({ hasText: /reading sheet 1 of 2 \("Visits"\), [\d,]+ rows so far/ }).waitFor({ timeout: 60_000 });
      const bar = await page.getByRole('progressbar', { name: 'Import progress' }).evaluate((el) => (el as HTMLProgressElement).value);
      expect(bar).toBeGreaterThan(0);
      expect(bar).toBeLessThan(1);
      await app.screenshot('records-import-progress');
      // Every visit row gives one record per species column: 2 × ROWS, plus the 6 already there.
      await summary.filter({ hasText: `${(2 * ROWS + 6).toLocaleString('en-US')} records from 2 workbooks` }).waitFor({ timeout: 180_000 });
      await expect.poll(() => progress.count()).toBe(0);
      await app.screenshot('records-import-done');
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
  });
});
