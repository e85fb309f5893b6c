import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeBrowser, openApp } from './harness';
import { writeDemoWorkbooks, type DemoWorkbooksResult } from '../../src-main/demo/write-workbooks';
import { untitledRecoveryPath } from '../../src-main/project/project-paths';

// Visit-wide edits, refused input, unit conversion, reverting from the change
// log, and restoring autosaved work in a new session. The planted problem
// (a blank minutes cell and its true value) comes from the demo generator.

afterAll(closeBrowser);

const dir = mkdtempSync(join(tmpdir(), 'tallywise-e2e-actions-'));
let demo: DemoWorkbooksResult;
beforeAll(async () => {
  demo = await writeDemoWorkbooks(join(dir, 'books'));
});

const effortCells = (page: Page) => page.getByTestId('records-grid').locator('.ag-row .ag-cell[col-id="effort"]');
const texts = async (page: Page) => (await effortCells(page).allTextContents()).map((t) => t.trim());

async function logRows(page: Page) {
  await page.getByRole('tab', { name: /Changes/ }).click();
  const list = page.getByTestId('audit-list').locator('article');
  return list.evaluateAll((els) => els.map((e) => `${e.getAttribute('data-entry')} ${e.getAttribute('data-kind')} ${e.getAttribute('data-status')}`));
}

describe('correcting a visit, converting units, reverting and recovering', () => {
  it('applies a visit-wide effort edit as one undoable step, reverts a conversion, and restores unsaved work', async () => {
    const missing = demo.planted.find((p) => p.kind === 'missing-minutes')!;
    const file = demo.files.find((f) => f.endsWith(`-${missing.season}.xlsx`))!;
    const userDataDir = join(dir, 'user');
    const app = await openApp({ height: 860, env: { userDataDir } });
    const { page } = app;
    let summary = '';
    let entries: string[] = [];
    try {
      // A file that is not a workbook: a message naming it and what to give instead.
      const notes = join(dir, 'field-notes.pdf');
      writeFileSync(notes, 'not a workbook');
      app.dialogs.opens.push(notes);
      await app.command('import-workbook');
      const problem = page.getByTestId('problem');
      await problem.waitFor();
      await expect.poll(() => problem.textContent()).toMatch(/field-notes\.pdf[\s\S]*\.xlsx/);
      await app.screenshot('records-not-a-workbook');

      app.dialogs.opens.push(file);
      await app.command('import-workbook');
      await page.getByTestId('records-summary').waitFor();
      await expect.poll(() => problem.count()).toBe(0);
      const card = page.locator(`article[data-finding="effort-missing"][data-place="${missing.sheet}!${missing.column}${missing.row}"]`);
      await card.getByRole('button', { name: /Show \d+ records/ }).click();
      const perVisit = Number(/Showing (\d+) of/.exec((await page.getByTestId('records-shown').textContent()) ?? '')?.[1]);
      expect(perVisit).toBeGreaterThan(1);
      expect(await texts(page)).toEqual(new Array(perVisit).fill(''));

      // Refused: a negative effort, with a message saying what to type.
      await effortCells(page).first().dblclick();
      await page.keyboard.type('-5');
      await page.keyboard.press('Enter');
      await page.getByRole('alert').filter({ hasText: 'is not an effort' }).waitFor({ timeout: 15_000 });
      await expect.poll(() => page.getByRole('alert').filter({ hasText: 'is not an effort' }).count()).toBe(1);

      // The true minutes, typed once with a reason, go to every record of the visit.
      await page.getByLabel('Reason for the next changes').fill('read off the field card');
      await effortCells(page).first().dblclick();
      await page.keyboard.type(String(missing.cleanValue));
      await page.keyboard.press('Enter');
      await expect.poll(() => texts(page)).toEqual(new Array(perVisit).fill(String(missing.cleanValue)));
      await page.keyboard.press('Control+z');
      await expect.poll(() => texts(page)).toEqual(new Array(perVisit).fill(''));
      await page.keyboard.press('Control+y');
      await expect.poll(() => texts(page)).toEqual(new Array(perVisit).fill(String(missing.cleanValue)));

      // The visit's effort was written in hours: convert it (x 60; ticking one of its records is enough), then revert that from the log.
      await page.getByTestId('records-grid').locator('.ag-row .ag-selection-checkbox').first().click();
      await page.getByRole('button', { name: 'Effort unit…' }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByLabel('Written in').selectOption('hours');
      await dialog.getByLabel('Read as').selectOption('minutes');
      await app.screenshot('records-convert-dialog');
      await dialog.getByRole('button', { name: 'Convert' }).click();
      await expect.poll(async () => (await texts(page)).filter((t) => t === String(Number(missing.cleanValue) * 60)).length).toBe(perVisit);
      await page.getByRole('tab', { name: /Changes/ }).click();
      await page.locator('article[data-kind="convert-unit"]').getByRole('button', { name: 'Revert' }).click();
      await expect.poll(() => texts(page)).toEqual(new Array(perVisit).fill(String(missing.cleanValue)));
      entries = await logRows(page);
      const n = perVisit;
      expect(entries[0]).toBe(`e${n + 2} revert in-effect`);
      expect(entries[1]).toBe(`e${n + 1} convert-unit reverted`);
      expect(entries.slice(2).every((e) => / set-value in-effect$/.test(e))).toBe(true);
      const reasons = await page.locator('article[data-kind="set-value"] .entry-reason').allTextContents();
      expect(reasons).toEqual(new Array(n).fill('Reason: read off the field card'));
      expect(entries).toHaveLength(n + 2);
      await app.screenshot('records-reverted');

      summary = (await page.getByTestId('records-summary').textContent()) ?? '';
      // Autosave writes the untitled project's recovery file after a quiet moment.
      await expect.poll(() => existsSync(untitledRecoveryPath(userDataDir)), { timeout: 15_000 }).toBe(true);
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }

    const again = await openApp({ height: 860, env: { userDataDir } });
    try {
      const p2 = again.page;
      const offer = p2.getByTestId('recovery-offer');
      await offer.waitFor();
      await again.screenshot('records-recovery-offer');
      await offer.getByRole('button', { name: 'Restore that work' }).click();
      await p2.getByTestId('records-summary').waitFor();
      expect(await p2.getByTestId('records-summary').textContent()).toBe(summary);
      expect(await logRows(p2)).toEqual(entries);
      await expect.poll(() => p2.getByTestId('unsaved-mark').count()).toBe(1);
      expect(again.consoleErrors).toEqual([]);
    } finally {
      await again.close();
    }
  });
});
