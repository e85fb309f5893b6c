import { afterAll, describe, expect, it } from 'vitest';
import { existsSync } from 'node:fs';
import { closeBrowser, openApp } from './harness';
import { demoOverview } from '../../src-main/services/demo-overview';

afterAll(closeBrowser);

describe('the app opens on the demo programme', () => {
  it('shows its sites, seasons and species, with the counts the main process computed', async () => {
    const expected = await demoOverview();
    const app = await openApp();
    try {
      const { page } = app;
      await page.getByRole('heading', { level: 1, name: expected.programme }).waitFor();
      await expect.poll(() => page.getByTestId('count-sites').textContent()).toBe(String(expected.sites.length));
      await expect.poll(() => page.getByTestId('count-seasons').textContent()).toBe(String(expected.seasons.length));
      await expect.poll(() => page.getByTestId('count-species').textContent()).toBe(String(expected.species.length));
      for (const s of expected.species) await expect.poll(() => page.getByRole('table', { name: 'Species' }).getByText(s.name, { exact: true }).count()).toBe(1);
      const siteRows = await page.getByRole('table', { name: 'Sites' }).locator('tbody tr').count();
      expect(siteRows).toBe(expected.sites.length);
      const seasonRows = await page.getByRole('table', { name: 'Seasons' }).locator('tbody tr').count();
      expect(seasonRows).toBe(expected.seasons.length);
      await expect.poll(() => page.getByRole('complementary', { name: 'Cautions' }).textContent()).toMatch(/statistician/);
      const shot = await app.screenshot('app-opens-demo');
      expect(existsSync(shot)).toBe(true);
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
  });

  it('refuses a call that is not in the contract, and reports a bad argument by name', async () => {
    const app = await openApp();
    try {
      const result = await app.page.evaluate(async () => {
        const w = window as unknown as Record<string, any>;
        const bridge = w['tallywiseHost'];
        const unknown = typeof bridge['fs:delete-everything'];
        const bad = await bridge['file:reveal']({ path: 42 });
        return { unknown, bad };
      });
      expect(result.unknown).toBe('undefined');
      expect(result.bad.ok).toBe(false);
      expect(result.bad.error.name).toBe('InvalidArgument');
      expect(result.bad.error.message).toMatch(/file:reveal/);
    } finally {
      await app.close();
    }
  });
});
