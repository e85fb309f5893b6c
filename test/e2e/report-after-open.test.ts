import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { closeBrowser, openApp } from './harness';
import { loadProject } from '../../src-main/project/project-store';

// Saved models are fitted again when a project opens, whatever stage is
// shown: the demo with its recorded cleaning and chosen models is saved,
// opened in a fresh page, and the analyst goes straight to the Report stage
// without visiting the Models stage; the chosen models arrive there.

afterAll(closeBrowser);
const dir = mkdtempSync(join(tmpdir(), 'tw-e2e-report-open-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('the Report stage right after opening a project', () => {
  it('lists the chosen models, fitted again in the background with progress and cancel', async () => {
    const file = join(dir, 'ponds.tallywise');
    const first = await openApp({ width: 1366, height: 768 });
    try {
      const { page } = first;
      await page.getByRole('navigation', { name: 'Work stages' }).getByRole('button', { name: /Records/ }).click();
      await page.getByRole('button', { name: 'Demo, already cleaned' }).click();
      await page.getByTestId('records-summary').filter({ hasText: 'from 15 workbooks' }).waitFor({ timeout: 60_000 });
      first.dialogs.saves.push(file);
      await first.command('save-project');
      await page.getByTestId('programme-title').filter({ hasText: 'ponds' }).waitFor({ timeout: 60_000 });
    } finally {
      await first.close();
    }
    // The choices the file holds, read by the project loader.
    const { document } = await loadProject(file);
    const chosen = document.models.filter((m) => m.chosen);
    expect(chosen.length).toBeGreaterThan(0);

    const app = await openApp({ width: 1366, height: 768 });
    const { page } = app;
    try {
      // A watch, set before the project opens, notes the background-fit banner the moment it first appears
      // (on whatever stage shows it): on a quick machine the refit can end before a later look would find it.
      await page.getByRole('navigation', { name: 'Work stages' }).getByRole('button', { name: /Report/ }).click();
      await page.getByRole('heading', { name: 'Report', level: 1 }).waitFor();
      await page.evaluate(() => {
        const w = window as unknown as { seenBackgroundFit?: { cancel: boolean } };
        const look = () => {
          const el = window.document.querySelector('[data-testid="background-fit"]');
          if (el && !w.seenBackgroundFit) w.seenBackgroundFit = { cancel: [...el.querySelectorAll('button')].some((b) => b.textContent?.trim() === 'Cancel') };
        };
        new MutationObserver(look).observe(window.document.body, { childList: true, subtree: true, characterData: true });
      });
      app.dialogs.opens.push(file);
      await app.command('open-project');
      const seen = await page.waitForFunction(() => (window as unknown as { seenBackgroundFit?: { cancel: boolean } }).seenBackgroundFit ?? null, undefined, { timeout: 60_000 });
      // Opening shows the Records stage; the chosen models are then listed on the Report stage.
      await page.getByRole('navigation', { name: 'Work stages' }).getByRole('button', { name: /Report/ }).click();
      await page.getByRole('heading', { name: 'Report', level: 1 }).waitFor();
      expect(await seen.jsonValue()).toEqual({ cancel: true });
      for (const m of chosen) {
        const box = page.getByTestId(`report-species-${m.species}`);
        await expect.poll(() => box.isDisabled(), { timeout: 240_000 }).toBe(false);
        await expect.poll(() => box.locator('xpath=../..').textContent()).toContain(m.name);
      }
      await expect.poll(() => page.getByTestId('background-fit').count(), { timeout: 240_000 }).toBe(0);
      // Fitting the unchanged models again is not a change to save.
      await expect.poll(() => page.getByTestId('unsaved-mark').count()).toBe(0);
      await app.screenshot('report-after-open');
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
  });
});
