import { afterAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeBrowser, openApp } from './harness';
import { buildDemo } from '@shared/demo/build';
import { DEFAULT_DEMO_SEED, DEMO_TRUTH } from '@shared/demo/truth';
import type { PlantedProblem } from '@shared/demo/mess';

// The Models stage reads the cleaned records: its checks name the slips the
// demo generator planted (src-shared/demo/mess.ts: a blank minutes cell, pond
// names misspelt so their area is unknown), a fix made on the Records stage
// reaches the models, and a model fitted before a change is marked out of date.

afterAll(closeBrowser);

const { planted } = buildDemo(DEFAULT_DEMO_SEED);
const toad = DEMO_TRUTH.species.find((s) => s.key === 'common_toad')!;

async function findingFor(page: Page, p: PlantedProblem) {
  await page.getByRole('tab', { name: /Findings/ }).click();
  await page.getByLabel('Which findings').selectOption('all');
  await page.getByLabel('Search the findings').fill(`${p.file}, ${p.sheet}, row ${p.row}, col. ${p.column}`);
  return page.locator(`article[data-finding="name-variant"][data-place="${p.sheet}!${p.column}${p.row}"]`);
}

describe('models and the cleaned records', () => {
  it('names the planted slips, follows a fix made in Records, and marks a model out of date after a change', async () => {
    const variants = planted.filter((p) => p.kind === 'pond-name-variant');
    const minutes = planted.find((p) => p.kind === 'missing-minutes')!;
    const app = await openApp({ width: 1366, height: 768 });
    const { page } = app;
    try {
      await app.command('open-demo');
      await page.getByTestId('records-summary').filter({ hasText: 'from 15 workbooks' }).waitFor({ timeout: 60_000 });
      const models = page.getByRole('button', { name: 'Models' });
      await models.click();
      await page.getByRole('checkbox', { name: toad.label, exact: true }).check();
      await page.getByRole('checkbox', { name: /^area/ }).check();
      const problems = page.getByTestId('spec-problems');
      let text = (await problems.textContent()) ?? '';
      expect(text).toMatch(new RegExp(`Effort \\(hours\\) is zero or missing in 1 ${toad.label} row \\([^)]*, ${minutes.season}\\)`));
      for (const v of variants) expect(text).toContain(`${v.found.trim()}, ${v.season}`);

      // Merge one misspelt pond name in Records: its site now has an area, so the models no longer name it.
      const fixed = variants[variants.length - 1];
      await page.getByRole('navigation', { name: 'Work stages' }).getByRole('button', { name: 'Records' }).click();
      await (await findingFor(page, fixed)).getByRole('button', { name: `Merge into "${fixed.cleanValue}"` }).click();
      await models.click();
      text = (await problems.textContent()) ?? '';
      expect(text).not.toContain(`${fixed.found.trim()}, ${fixed.season}`);
      expect(text).toContain(`${variants[0].found.trim()}, ${variants[0].season}`);

      await page.getByRole('checkbox', { name: /leave out rows where an offset is missing/ }).check();
      await page.getByTestId('fit-button').click();
      const row = page.getByTestId('comparison').locator('tbody tr');
      await row.first().waitFor({ timeout: 60_000 });
      await expect.poll(() => page.getByTestId('stale-banner').count()).toBe(0);

      // Undo the merge: the cleaned records change, the model is out of date until it is fitted again.
      await page.getByRole('navigation', { name: 'Work stages' }).getByRole('button', { name: 'Records' }).click();
      await page.getByRole('heading', { name: 'Records' }).click();
      await app.command('undo-change');
      await models.click();
      await page.getByTestId('stale-banner').waitFor();
      await expect.poll(() => row.first().textContent()).toContain('out of date');
      await app.screenshot('models-out-of-date');
      await page.getByTestId('stale-banner').getByRole('button', { name: 'Fit them again' }).click();
      await page.getByTestId('stale-banner').waitFor({ state: 'detached', timeout: 60_000 });
      await expect.poll(() => row.count()).toBe(1);
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
  });
});
