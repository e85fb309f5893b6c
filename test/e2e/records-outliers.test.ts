import { afterAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeBrowser, openApp } from './harness';
import { openDemoModels } from './demo-models';
import { fitDistribution as fit, leaveOutRowsWithoutOffset } from './models-steps';
import { DEMO_TRUTH } from '@shared/demo/truth';

// Model-based outlier flags end to end in Chromium on the demo project. The
// demo's counts are drawn from a negative binomial (src-shared/demo/truth.ts),
// so under a Poisson fit far more season totals are improbable than under the
// negative binomial; the flags go to the cleaning grid on the visit records
// behind each total, with the probability, and nothing is left out.

afterAll(closeBrowser);

const toad = DEMO_TRUTH.species.find((s) => s.key === 'common_toad')!;

/** Flagged totals, totals checked and the count a fitting model would give by chance, read from the summary. */
async function summary(page: Page, model: RegExp): Promise<{ flagged: number; checked: number; chance: number }> {
  const el = page.getByTestId('outlier-summary').filter({ hasText: model });
  await el.waitFor({ timeout: 120_000 });
  const text = (await el.textContent()) ?? '';
  const m = /(\d+) of (\d+) season totals .* about ([\d.e-]+) by chance/.exec(text);
  if (!m) return { flagged: 0, checked: 0, chance: 0 };
  return { flagged: Number(m[1]), checked: Number(m[2]), chance: Number(m[3]) };
}

describe('model outlier flags', () => {
  it('flag improbable season totals for review and show them on their visit records', async () => {
    const app = await openApp({ width: 1366, height: 768 });
    const { page } = app;
    try {
      await openDemoModels(app, toad.label);
      await leaveOutRowsWithoutOffset(page);

      await fit(page, 'negbin', 1);
      const nb = await summary(page, /Negative binomial/);
      await fit(page, 'poisson', 2);
      const poisson = await summary(page, /under “Poisson/);
      // Overdispersed counts: the Poisson finds many totals improbable, well above chance and above the NB's.
      expect(poisson.flagged).toBeGreaterThan(nb.flagged);
      expect(poisson.flagged).toBeGreaterThan(5 * Math.max(1, poisson.chance));

      // A threshold that is not a probability is refused, with the fix said; the flags stay as they were.
      const input = page.getByLabel('Outlier tail probability');
      await input.fill('0.7');
      await expect.poll(() => page.getByTestId('outlier-controls').getByRole('alert').textContent()).toMatch(/between 0 and 0\.5/);
      await expect.poll(() => page.getByTestId('outlier-controls').getByRole('button', { name: 'Apply' }).isDisabled()).toBe(true);
      // A stricter threshold flags no more totals.
      await input.fill('0.0001');
      await page.getByTestId('outlier-controls').getByRole('button', { name: 'Apply' }).click();
      const strict = await summary(page, /below 0\.0001 under “Poisson/);
      expect(strict.flagged).toBeGreaterThan(0);
      expect(strict.flagged).toBeLessThanOrEqual(poisson.flagged);
      await page.getByTestId('outlier-controls').scrollIntoViewIfNeeded();
      await app.screenshot('models-outliers');

      // To the grid: the "model outliers" filter, every shown record carrying the flag with its probability.
      await page.getByTestId('outlier-controls').getByRole('button', { name: /^Show the \d+ flagged totals? in Records/ }).click();
      await expect.poll(() => page.getByLabel('Filter by flag').inputValue()).toBe('model-outliers');
      await expect.poll(() => page.getByTestId('linked-note').textContent()).toMatch(new RegExp(`behind the ${strict.flagged} season totals of ${toad.label}`));
      const chips = page.getByTestId('records-grid').locator('.ag-row .chip-model');
      await chips.first().waitFor({ timeout: 30_000 });
      const seen = await chips.evaluateAll((els) => els.map((e) => ({ p: Number(e.getAttribute('data-probability')), text: e.textContent ?? '', title: e.getAttribute('title') ?? '' })));
      for (const c of seen) {
        expect(c.p).toBeLessThan(0.0001);
        expect(c.text).toMatch(/^model p [=<] /);
        expect(c.title).toMatch(/Improbable under "Poisson[^"]*": the season total at .+ is \d+ \(expected [\d.e+-]+\), P\(total ≥ \d+\) [=<] /);
        expect(c.title).toMatch(/visits? summed\); this record is one of its visits\. For review only; nothing is left out\./);
      }
      const shown = Number(/^Showing ([\d,]+) of/.exec((await page.getByTestId('records-shown').textContent()) ?? '')![1].replace(/,/g, ''));
      expect(shown).toBeGreaterThanOrEqual(strict.flagged);
      await app.screenshot('records-outliers');
      // The flags listed beside the grid, most extreme first, each leading to its visits (by keyboard too).
      const list = page.getByTestId('model-flags');
      await list.locator('summary').click();
      const items = list.locator('li');
      await expect.poll(() => items.count()).toBe(strict.flagged);
      const first = (await items.first().textContent()) ?? '';
      const m = /^(.+), (\d{4}): total (\d+), expected [\d.e+-]+, p [=<] /.exec(first);
      expect(m, first).not.toBeNull();
      await items.first().getByRole('button', { name: 'Show visits' }).focus();
      await page.keyboard.press('Enter');
      await expect.poll(() => page.getByTestId('linked-note').textContent()).toContain(`${toad.label} at ${m![1]}, season ${m![2]} (a model flag)`);
      // The note can change a frame before the grid's rows do: wait for the rows.
      const siteCells = page.getByTestId('records-grid').locator('.ag-row .ag-cell[col-id="site"]');
      await expect.poll(async () => new Set((await siteCells.allTextContents()).map((t) => t.trim()))).toEqual(new Set([m![1]]));
      await app.screenshot('records-model-flags');
      // Flags never leave anything out: every record is still in, none marked left out.
      const total = /^([\d,]+) records/.exec((await page.getByTestId('records-summary').textContent()) ?? '')![1];
      await page.getByTestId('linked-note').getByRole('button', { name: 'Show all records' }).click();
      await expect.poll(() => page.getByTestId('records-shown').textContent()).toMatch(new RegExp(`^Showing ${total} of ${total} records`));
      await expect.poll(() => page.getByTestId('records-summary').textContent()).toContain('0 left out');
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
  });
});
