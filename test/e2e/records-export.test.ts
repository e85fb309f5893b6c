import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { afterAll, describe, expect, it } from 'vitest';
import { closeBrowser, openApp, type AppSession } from './harness';

// Export of the cleaned data from the Records stage, end to end in Chromium
// against the real services: the demo (invented, simulated data) opened, one
// count edited and not saved, the export written to a workbook and read back
// with exceljs.

afterAll(closeBrowser);

const dir = mkdtempSync(join(tmpdir(), 'tallywise-e2e-export-'));

/** The demo opened in a new app session, its records shown. */
async function openDemo(): Promise<AppSession> {
  const app = await openApp({ height: 860 });
  await app.command('open-demo');
  await app.page.getByTestId('records-summary').filter({ hasText: /from \d+ workbooks/ }).waitFor();
  return app;
}

function header(ws: ExcelJS.Worksheet): string[] {
  return (ws.getRow(1).values as unknown[]).slice(1).map(String);
}

describe('exporting the cleaned data', () => {
  it('writes what the screen shows, the unsaved edit included, and says what it wrote', async () => {
    const app = await openDemo();
    const { page } = app;
    try {

      // Edit the first count the grid shows: ten more than it reads.
      const grid = page.getByTestId('records-grid');
      const firstRow = grid.locator('.ag-row:has(.ag-cell[col-id="count"])').first();
      await firstRow.waitFor();
      const cell = firstRow.locator('.ag-cell[col-id="count"]');
      const site = ((await firstRow.locator('.ag-cell[col-id="site"]').textContent()) ?? '').trim();
      const old = Number(((await cell.textContent()) ?? '').trim());
      expect(Number.isFinite(old)).toBe(true);
      await cell.dblclick();
      await page.keyboard.press('ControlOrMeta+a');
      await page.keyboard.type(String(old + 10));
      await page.keyboard.press('Enter');
      await expect.poll(() => cell.getAttribute('class')).toContain('is-edited');

      const out = join(dir, 'demo cleaned data.xlsx');
      app.dialogs.saves.push(out);
      await page.getByRole('button', { name: 'Export cleaned data…' }).click();
      const written = page.getByTestId('export-written');
      await written.waitFor();
      await expect.poll(() => written.textContent()).toMatch(/Exported 4 tables \(Records, Analysis table, Changes, About\): [\d,]+ records, [\d,]+ kept; [\d,]+ analysis rows\. The project has changes not yet saved/);
      expect(await written.textContent()).toContain(out);
      await expect.poll(() => written.getByRole('button', { name: 'Show in folder' }).isVisible()).toBe(true);
      await app.screenshot('records-export-written');

      const wb = new ExcelJS.Workbook();
      await wb.xlsx.readFile(out);
      expect(wb.worksheets.map((w) => w.name)).toEqual(['Records', 'Analysis table', 'Changes', 'About']);
      // Records: exactly one plain-number count cell now used as another number, the edited one.
      const rec = wb.getWorksheet('Records')!;
      const h = header(rec);
      const [read, used, siteCol] = ['Count as read (cell text)', 'Count used', 'Site'].map((n) => h.indexOf(n) + 1);
      const changed: { site: unknown; read: unknown; used: unknown }[] = [];
      rec.eachRow((row, i) => {
        if (i === 1) return;
        const text = row.getCell(read).value;
        if (typeof text === 'string' && /^\d+$/.test(text) && row.getCell(used).value !== Number(text)) changed.push({ site: row.getCell(siteCol).value, read: text, used: row.getCell(used).value });
      });
      expect(changed).toEqual([{ site, read: String(old), used: old + 10 }]);
      // Changes: the one edit, in the change log's words.
      const ch = wb.getWorksheet('Changes')!;
      expect(ch.rowCount).toBe(2);
      const ch2 = (ch.getRow(2).values as unknown[]).slice(1);
      expect(ch2[header(ch).indexOf('What')]).toBe('Set count');
      expect(ch2[header(ch).indexOf('To')]).toBe(String(old + 10));
      // About: unsaved, said so.
      const about = wb.getWorksheet('About')!;
      let project: unknown[] = [];
      about.eachRow((row) => {
        if (row.getCell(1).value === 'Project') project = (row.values as unknown[]).slice(1);
      });
      expect(String(project[2])).toMatch(/not yet saved/);
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
  });

  it('a saved project: the About sheet names the project file with its SHA-256, no unsaved note', async () => {
    const app = await openDemo();
    const { page } = app;
    try {
      const file = join(dir, 'ponds.tallywise');
      app.dialogs.saves.push(file);
      await app.command('save-project');
      await page.getByText('not saved').waitFor({ state: 'detached' });
      const out = join(dir, 'saved.xlsx');
      app.dialogs.saves.push(out);
      await page.getByRole('button', { name: 'Export cleaned data…' }).click();
      const written = page.getByTestId('export-written');
      await written.waitFor();
      expect(await written.textContent()).not.toMatch(/not yet saved/);
      const wb = new ExcelJS.Workbook();
      await wb.xlsx.readFile(out);
      const rows: unknown[][] = [];
      wb.getWorksheet('About')!.eachRow((row) => rows.push((row.values as unknown[]).slice(1)));
      // SHA-256 of the saved bytes, by Node's crypto (outside the project's own hashing).
      const sha = createHash('sha256').update(readFileSync(file)).digest('hex');
      expect(rows.find((r) => r[0] === 'Project file')).toEqual(['Project file', 'ponds.tallywise', `SHA-256 ${sha}`]);
      expect(rows.find((r) => r[0] === 'Project')?.[2]).toBe('as saved');
    } finally {
      await app.close();
    }
  });

  it('a file that cannot be written is named, with the fix', async () => {
    const app = await openDemo();
    const { page } = app;
    try {
      app.dialogs.saves.push(join(dir, 'no-such-folder', 'out.xlsx'));
      await page.getByRole('button', { name: 'Export cleaned data…' }).click();
      const problem = page.getByTestId('export-problem');
      await problem.waitFor();
      await expect.poll(() => problem.textContent()).toMatch(/no-such-folder[\\/]out\.xlsx.*Choose a folder you can write to/);
    } finally {
      await app.close();
    }
  });
});
