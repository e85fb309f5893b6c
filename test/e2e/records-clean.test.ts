import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeBrowser, openApp, type AppSession } from './harness';
import { writeDemoWorkbooks, type DemoWorkbooksResult } from '../../src-main/demo/write-workbooks';
import type { PlantedProblem } from '@shared/demo/mess';

// The Records stage end to end in Chromium, against the real services. What
// must be flagged comes from the demo generator's list of planted problems
// (place and clean value), not from our own output.

afterAll(closeBrowser);

const dir = mkdtempSync(join(tmpdir(), 'tallywise-e2e-records-'));
let demo: DemoWorkbooksResult;
beforeAll(async () => {
  demo = await writeDemoWorkbooks(join(dir, 'books'));
});

const codeOf: Record<string, string> = {
  'duplicated-row': 'repeated-visit',
  'date-as-text': 'date-as-text',
  'at-least-code': 'count-lower-bound',
  'pond-name-variant': 'name-variant',
};

function fileOf(season: number): string {
  return demo.files.find((f) => f.endsWith(`-${season}.xlsx`))!;
}
function planted(season: number, kind: string): PlantedProblem {
  return demo.planted.find((p) => p.season === season && p.kind === kind)!;
}

async function importThroughMenu(app: AppSession, path: string, workbooks: number): Promise<void> {
  app.dialogs.opens.push(path);
  await app.command('import-workbook');
  await app.page.getByTestId('records-summary').filter({ hasText: `from ${workbooks} workbook` }).waitFor();
}

/** The finding card for a planted problem, found through the panel's search (the list is virtualised). */
async function findingFor(page: Page, p: PlantedProblem) {
  await page.getByRole('tab', { name: /Findings/ }).click();
  await page.getByLabel('Which findings').selectOption('all');
  await page.getByLabel('Search the findings').fill(`${p.file}, ${p.sheet}, row ${p.row}, col. ${p.column}`);
  return page.locator(`article[data-finding="${codeOf[p.kind]}"][data-place="${p.sheet}!${p.column}${p.row}"]`);
}

async function siteOptions(page: Page): Promise<string[]> {
  return page.getByLabel('Filter by site').locator('option').allTextContents();
}

async function logState(page: Page) {
  await page.getByRole('tab', { name: /Changes/ }).click();
  const entries = page.getByTestId('audit-list').locator('article');
  const n = await entries.count();
  const out: { id: string | null; kind: string | null; status: string | null; text: string }[] = [];
  for (let i = 0; i < n; i++) {
    const e = entries.nth(i);
    // the time is shown in the page's time zone and is the same in both sessions
    out.push({ id: await e.getAttribute('data-entry'), kind: await e.getAttribute('data-kind'), status: await e.getAttribute('data-status'), text: (await e.textContent()) ?? '' });
  }
  return out;
}

async function countCellOf(page: Page, p: PlantedProblem) {
  const card = await findingFor(page, p);
  await card.getByRole('button', { name: /Show the record/ }).click();
  await page.getByTestId('records-shown').filter({ hasText: 'Showing 1 of' }).waitFor();
  return page.getByTestId('records-grid').locator('.ag-row .ag-cell[col-id="count"]').first();
}

describe('cleaning imported season workbooks', () => {
  it('flags the planted problems, fixes two, undoes one, and saves a project that reopens the same', async () => {
    const variant = planted(2021, 'pond-name-variant');
    const repeat = planted(2019, 'duplicated-row');
    const bound = planted(2021, 'at-least-code');
    const textDate = planted(2019, 'date-as-text');
    const app = await openApp({ height: 860 });
    const { page } = app;
    let savedPath = '';
    let before: Awaited<ReturnType<typeof logState>> = [];
    let beforeSummary = '';
    let beforeSites: string[] = [];
    try {
      await importThroughMenu(app, fileOf(2019), 1);
      await importThroughMenu(app, fileOf(2021), 2);
      await page.getByRole('heading', { level: 1, name: 'Records' }).waitFor();
      await app.screenshot('records-imported');

      // Every planted problem of the two seasons is listed with its sheet and row.
      for (const p of [variant, repeat, bound, textDate]) {
        const card = await findingFor(page, p);
        await expect(card.count(), `${p.kind} at ${p.sheet} row ${p.row}`).resolves.toBe(1);
        await expect.poll(() => card.locator('.finding-place').textContent()).toContain(`${p.sheet}, row ${p.row}`);
        await expect.poll(() => card.locator('.finding-file').textContent()).toBe(p.file);
      }
      expect(await siteOptions(page)).toContain(variant.found);

      // Fix 1: merge the misspelt pond name into the right one, in one click.
      const variantCard = await findingFor(page, variant);
      await variantCard.getByRole('button', { name: `Merge into "${variant.cleanValue}"` }).click();
      await expect.poll(() => siteOptions(page)).not.toContain(variant.found);
      expect(await siteOptions(page)).toContain(String(variant.cleanValue));

      // Fix 2: leave out the repeated visit row, with the suggested reason.
      const repeatCard = await findingFor(page, repeat);
      await repeatCard.getByRole('button', { name: 'Leave this copy out' }).click();
      const dialog = page.getByRole('dialog');
      await expect.poll(() => dialog.getByLabel('Reason').inputValue()).toContain(`Repeats row ${repeat.row - 1}`);
      await app.screenshot('records-leave-out-dialog');
      await dialog.getByRole('button', { name: 'Leave out' }).click();
      await page.getByTestId('records-summary').filter({ hasText: /· [1-9]\d* left out/ }).waitFor();

      // A third change, then undone with Ctrl+Z: the ">N" count set to the true count.
      const cell = await countCellOf(page, bound);
      const lowerBound = (await cell.textContent())?.trim();
      expect(Number(lowerBound)).toBeLessThan(Number(bound.cleanValue));
      await cell.dblclick();
      await page.keyboard.press('ControlOrMeta+a');
      await page.keyboard.type(String(bound.cleanValue));
      await page.keyboard.press('Enter');
      await expect.poll(async () => (await cell.textContent())?.trim()).toBe(String(bound.cleanValue));
      await expect.poll(() => cell.getAttribute('class')).toContain('is-edited');
      await app.screenshot('records-edited');
      await page.keyboard.press('Control+z');
      await expect.poll(async () => (await cell.textContent())?.trim()).toBe(lowerBound);
      await expect.poll(() => cell.getAttribute('class')).not.toContain('is-edited');

      before = await logState(page);
      expect(before.map((e) => [e.id, e.kind, e.status])).toEqual([
        ['e3', 'set-value', 'undone'],
        ['e2', 'exclude', 'in-effect'],
        ['e1', 'merge-name', 'in-effect'],
      ]);
      await app.screenshot('records-change-log');

      // Save through the menu; the save dialog is answered with a path.
      await expect.poll(() => page.getByTestId('unsaved-mark').count()).toBe(1);
      savedPath = join(dir, 'cleaned-seasons.tallywise');
      app.dialogs.saves.push(savedPath);
      await app.command('save-project');
      await page.getByTestId('programme-title').filter({ hasText: 'cleaned-seasons' }).waitFor();
      await expect.poll(() => page.getByTestId('unsaved-mark').count()).toBe(0);
      beforeSummary = (await page.getByTestId('records-summary').textContent()) ?? '';
      beforeSites = await siteOptions(page);
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }

    // A fresh page opens the saved project and finds the same state.
    const again = await openApp({ height: 860 });
    try {
      const p2 = again.page;
      again.dialogs.opens.push(savedPath);
      await again.command('open-project');
      await p2.getByTestId('records-summary').filter({ hasText: 'from 2 workbooks' }).waitFor();
      await expect.poll(() => p2.getByTestId('programme-title').textContent()).toBe('cleaned-seasons');
      expect(await p2.getByTestId('records-summary').textContent()).toBe(beforeSummary);
      expect(await siteOptions(p2)).toEqual(beforeSites);
      expect(await logState(p2)).toEqual(before);
      const cell = await countCellOf(p2, bound);
      expect(Number((await cell.textContent())?.trim())).toBeLessThan(Number(bound.cleanValue));
      // Redo still works after reopening: the undone edit is kept in the file.
      await p2.getByRole('button', { name: 'Redo' }).click();
      await expect.poll(async () => (await cell.textContent())?.trim()).toBe(String(bound.cleanValue));
      await again.screenshot('records-reopened');
      // The Edit menu's undo arrives as a host command.
      await again.command('undo-change');
      await expect.poll(async () => Number((await cell.textContent())?.trim())).toBeLessThan(Number(bound.cleanValue));
      expect(again.consoleErrors).toEqual([]);
    } finally {
      await again.close();
    }
  });
});
