import { afterAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { closeBrowser, openApp } from './harness';
import { DEMO_TRUTH } from '@shared/demo/truth';

// A large fit runs in the worker while the page stays usable, and Cancel
// leaves the screen as it was. The fit: every demo species, negative
// binomial with a random site effect integrated with 50 quadrature points
// and one effect per season (a few seconds of work in the worker). "Responds"
// means a click on a stage shows that stage within 500 ms, and typing in a
// field shows the typed text within 500 ms, while the fit is still running.

afterAll(closeBrowser);

const RESPONSE_MS = 500;

/** Clicks a stage in the rail and resolves with the milliseconds until a frame shows `selector`. */
function clickStage(page: Page, stage: string, selector: string): Promise<number> {
  return page.evaluate(
    async ({ stage, selector, limit }) => {
      const t0 = performance.now();
      const button = [...document.querySelectorAll<HTMLButtonElement>('.rail-step')].find((b) => b.textContent?.includes(stage));
      if (!button) throw new Error(`No stage button "${stage}".`);
      button.click();
      while (!document.querySelector(selector)) {
        if (performance.now() - t0 > limit) break;
        await new Promise((r) => requestAnimationFrame(r));
      }
      return performance.now() - t0;
    },
    { stage, selector, limit: 5_000 },
  );
}

/** Types into a labelled input as a keyboard would (React sees an input event) and resolves with the ms until the equation shows `expected`. */
function typeAndSee(page: Page, label: string, text: string, expected: string): Promise<number> {
  return page.evaluate(
    async ({ label, text, expected, limit }) => {
      const input = document.querySelector<HTMLInputElement>(`input[aria-label="${label}"]`);
      const equation = document.querySelector('[data-testid="model-equation"]');
      if (!input || !equation) throw new Error(`No field "${label}" or no equation.`);
      const t0 = performance.now();
      input.focus();
      Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')!.set!.call(input, text);
      input.dispatchEvent(new Event('input', { bubbles: true }));
      while (!equation.textContent?.includes(expected)) {
        if (performance.now() - t0 > limit) break;
        await new Promise((r) => requestAnimationFrame(r));
      }
      return performance.now() - t0;
    },
    { label, text, expected, limit: 5_000 },
  );
}

describe('a large fit on the Models stage', () => {
  it('keeps the page responsive while it runs and can be cancelled without changing the results', async () => {
    const app = await openApp({ width: 1366, height: 768 });
    const { page } = app;
    const first = DEMO_TRUTH.species[0].label;
    try {
      await app.command('open-demo');
      await page.getByTestId('records-summary').filter({ hasText: 'from 15 workbooks' }).waitFor({ timeout: 60_000 });
      await page.getByRole('button', { name: 'Models' }).click();
      await page.getByRole('checkbox', { name: first, exact: true }).check();
      await page.getByRole('checkbox', { name: /leave out rows where an offset is missing/ }).check();
      // One small fit first, so that there is a result the cancelled fit must leave alone.
      await page.getByTestId('fit-button').click();
      const rows = page.getByTestId('comparison').locator('tbody tr');
      await rows.first().waitFor({ timeout: 60_000 });
      await page.getByTestId('chart-zeros').waitFor({ timeout: 60_000 });
      const resultsBefore = await page.getByTestId('models-results').innerText();

      await page.getByRole('checkbox', { name: /^All species/ }).check();
      await page.getByLabel('Distribution').selectOption('negbin');
      await page.getByLabel('Site effect').selectOption('random');
      await page.getByLabel('Quadrature points').fill('50');
      await page.getByTestId('fit-button').click();
      const progress = page.getByTestId('fit-progress');
      await progress.waitFor();

      // Another stage, at once: the time from the click to the first frame that shows it, measured in the page
      // (Playwright's own waiting polls at intervals of up to 500 ms, which would hide what is measured).
      const toProgramme = await clickStage(page, 'Programme', '[data-testid="count-sites"]');
      const backToModels = await clickStage(page, 'Models', '[data-testid="fit-progress"]');
      // Typing in a field of the builder: the model written out follows within a frame or two.
      const typing = await typeAndSee(page, 'Quadrature points', '12', '12-point adaptive');
      await expect.poll(() => page.getByLabel('Quadrature points').inputValue()).toBe('12');
      console.log(`responses while fitting: to Programme ${Math.round(toProgramme)} ms, back to Models ${Math.round(backToModels)} ms, typing ${Math.round(typing)} ms`);
      expect(toProgramme).toBeLessThan(RESPONSE_MS);
      expect(backToModels).toBeLessThan(RESPONSE_MS);
      expect(typing).toBeLessThan(RESPONSE_MS);
      // Still running after all that: the fit was not finished before we looked.
      await expect(progress.isVisible()).resolves.toBe(true);
      await app.screenshot('models-fit-running');

      await page.getByTestId('cancel-fit').click();
      await progress.waitFor({ state: 'detached', timeout: 5_000 });
      await expect.poll(() => page.getByTestId('models-note').textContent()).toContain('cancelled');
      await expect.poll(() => rows.count()).toBe(1);
      await expect.poll(() => page.getByRole('tab').count()).toBe(1);
      expect(await page.getByTestId('models-results').innerText()).toBe(resultsBefore);
      await app.screenshot('models-fit-cancelled');

      // The worker was replaced: the next fit runs and finishes.
      await page.getByRole('checkbox', { name: /^All species/ }).uncheck();
      await page.getByRole('checkbox', { name: first, exact: true }).check();
      await page.getByLabel('Site effect').selectOption('fixed');
      await page.getByTestId('fit-button').click();
      await rows.nth(1).waitFor({ timeout: 60_000 });
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
  });
});
