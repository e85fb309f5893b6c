import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { closeBrowser, openApp } from './harness';
import { openDemoModels } from './demo-models';
import { fitDistribution, leaveOutRowsWithoutOffset } from './models-steps';
import { DEMO_TRUTH } from '@shared/demo/truth';
import { loadProject } from '../../src-main/project/project-store';

// Models are kept in the project file as specs and choices (results are
// fitted again): fit two models on the demo, choose one for the report (the
// project becomes unsaved), save, open the file in a fresh page, and find
// both models again, fitted again in the background, with the same choice.

afterAll(closeBrowser);
const dir = mkdtempSync(join(tmpdir(), 'tw-models-saved-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const toad = DEMO_TRUTH.species.find((s) => s.key === 'common_toad')!;

describe('models saved in the project', () => {
  it('come back after saving and reopening, with the model chosen for the report', async () => {
    const file = join(dir, 'toad-models.tallywise');
    const app = await openApp({ width: 1366, height: 768 });
    const { page } = app;
    try {
      await openDemoModels(app, toad.label);
      await leaveOutRowsWithoutOffset(page);
      await fitDistribution(page, 'poisson', 1);
      await fitDistribution(page, 'negbin', 2);
      // Save once, then choose: the choice alone must make the project unsaved again.
      app.dialogs.saves.push(file);
      await app.command('save-project');
      await expect.poll(() => page.getByTestId('unsaved-mark').count()).toBe(0);
      await page.getByRole('radio', { name: /Use "Negative binomial/ }).check();
      await expect.poll(() => page.getByTestId('unsaved-mark').count()).toBe(1);
      await app.command('save-project');
      await expect.poll(() => page.getByTestId('unsaved-mark').count()).toBe(0);
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }

    // What the file holds, read by the project loader.
    const { document } = await loadProject(file);
    expect(document.models.map((m) => [m.species, m.spec.distribution, m.chosen, m.dropBadOffsetRows])).toEqual([
      [toad.label, 'poisson', false, true],
      [toad.label, 'negbin', true, true],
    ]);
    expect(document.fitCache.map((c) => c.modelId)).toEqual(document.models.map((m) => m.id));

    const again = await openApp({ width: 1366, height: 768 });
    try {
      const p2 = again.page;
      again.dialogs.opens.push(file);
      await again.command('open-project');
      await p2.getByTestId('records-summary').filter({ hasText: 'from 15 workbooks' }).waitFor({ timeout: 60_000 });
      await p2.getByRole('button', { name: 'Models' }).click();
      const rows = p2.getByTestId('comparison').locator('tbody tr');
      await rows.nth(1).waitFor({ timeout: 90_000 });
      await p2.getByTestId('saved-models').waitFor({ state: 'detached', timeout: 90_000 });
      await expect.poll(() => rows.count()).toBe(2);
      await expect.poll(() => p2.getByTestId('report-choice').textContent()).toContain('Chosen for the report: Negative binomial');
      await expect.poll(() => p2.getByRole('radio', { name: /Use "Negative binomial/ }).isChecked()).toBe(true);
      await expect.poll(() => p2.getByTestId('stale-banner').count()).toBe(0);
      // Fitting again the same data changes nothing to save, and no autosave outlived the save.
      await expect.poll(() => p2.getByTestId('unsaved-mark').count()).toBe(0);
      await expect.poll(() => p2.getByText('Unsaved work was kept').count()).toBe(0);
      await again.screenshot('models-reopened');
      expect(again.consoleErrors).toEqual([]);
    } finally {
      await again.close();
    }
  });

  it('the demo, already cleaned: its recorded edits are in the log and its chosen models are fitted on arrival', async () => {
    const natter = DEMO_TRUTH.species.find((s) => s.zeroInflation > 0)!;
    const app = await openApp({ width: 1366, height: 768 });
    const { page } = app;
    try {
      await page.getByRole('navigation', { name: 'Work stages' }).getByRole('button', { name: 'Records' }).click();
      await page.getByRole('button', { name: 'Demo, already cleaned' }).click();
      await page.getByTestId('records-summary').filter({ hasText: 'from 15 workbooks' }).waitFor({ timeout: 60_000 });
      await page.getByRole('button', { name: 'Models' }).click();
      await app.screenshot('models-demo-recorded-arriving');
      const tabs = page.getByRole('tablist', { name: 'Species with fitted models' }).getByRole('tab');
      await expect.poll(() => tabs.count(), { timeout: 30_000 }).toBe(DEMO_TRUTH.species.length);
      await page.getByTestId('saved-models').waitFor({ state: 'detached', timeout: 120_000 });
      await tabs.filter({ hasText: natter.label }).click();
      const rows = page.getByTestId('comparison').locator('tbody tr');
      await expect.poll(() => rows.count()).toBe(2);
      await expect.poll(() => page.getByTestId('report-choice').textContent()).toContain('Chosen for the report: Zero-inflated negative binomial');
      // Opening the demo is not a change of the analyst's: nothing unsaved until they change something.
      await expect.poll(() => page.getByTestId('unsaved-mark').count()).toBe(0);
      await app.screenshot('models-demo-recorded');
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
  });
});
