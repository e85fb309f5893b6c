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
      app.dialogs.opens.push(file);
      await app.command('open-project');
      await page.getByTestId('records-summary').filter({ hasText: 'from 15 workbooks' }).waitFor({ timeout: 60_000 });
      await page.getByRole('navigation', { name: 'Work stages' }).getByRole('button', { name: /Report/ }).click();
      await page.getByRole('heading', { name: 'Report', level: 1 }).waitFor();
      // While the models are fitted again the stage says so, with a Cancel (on a quiet machine the fit can
      // end before the check, so the button is looked for in the same moment the banner is first seen).
      const seen = await page.waitForFunction(
        () => {
          const el = window.document.querySelector('[data-testid="background-fit"]');
          return el ? { cancel: [...el.querySelectorAll('button')].some((b) => b.textContent?.trim() === 'Cancel') } : null;
        },
        undefined,
        { timeout: 60_000, polling: 'raf' },
      );
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
