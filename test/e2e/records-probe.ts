/** What the Records stage shows, read from its grid and filters (for tests that follow a chart point to its records). */
import { expect } from 'vitest';
import type { Page } from 'playwright-core';

/** Site and season of every record row the grid shows (the linked records are few, so all are drawn). */
export async function gridRows(page: Page): Promise<{ site: string; season: string; species: string }[]> {
  const grid = page.getByTestId('records-grid');
  await grid.locator('.ag-row .ag-cell[col-id="site"]').first().waitFor({ timeout: 30_000 });
  return grid.locator('.ag-row:has(.ag-cell[col-id="site"])').evaluateAll((rows) =>
    rows.map((r) => ({
      site: (r.querySelector('[col-id="site"]')?.textContent ?? '').trim(),
      season: (r.querySelector('[col-id="season"]')?.textContent ?? '').trim(),
      species: (r.querySelector('[col-id="species"]')?.textContent ?? '').trim(),
    })),
  );
}

/** The label of the "linked records" choice of the flag filter, once it is the one chosen. */
export async function linkedLabel(page: Page): Promise<string> {
  const select = page.getByLabel('Filter by flag');
  await expect.poll(() => select.inputValue()).toBe('linked');
  return (await select.locator('option[value="linked"]').textContent()) ?? '';
}
