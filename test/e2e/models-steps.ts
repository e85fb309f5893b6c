import type { Page } from 'playwright-core';

/** Fits the distribution on the Models stage and waits until the comparison has `rowsAfter` rows. */
export async function fitDistribution(page: Page, distribution: string, rowsAfter: number): Promise<void> {
  await page.getByLabel('Distribution').selectOption(distribution);
  await page.getByTestId('fit-button').click();
  await page.getByTestId('comparison').locator('tbody tr').nth(rowsAfter - 1).waitFor({ timeout: 120_000 });
}

/** The demo's planted blank effort cell stops a fit with an effort offset until its row is left out. */
export async function leaveOutRowsWithoutOffset(page: Page): Promise<void> {
  await page.getByRole('checkbox', { name: /leave out rows where an offset is missing/ }).check();
}
