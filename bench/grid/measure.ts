/**
 * The cleaning grid at 200,000 records in Chromium: time from the import
 * command to the first grid rows on screen, split into the import service
 * (measured alone in Node on the same file) and the page's share (bridge
 * transfer, building the records, the grid's first render); then the time
 * of a site filter, a flag filter and clearing them. Prints the numbers and
 * ratios; asserts nothing. Run through `node bench/grid/run.mjs`.
 */
import { existsSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { closeBrowser, openApp } from '../../test/e2e/harness';
import { makeBenchWorkbook } from '../import/make-workbook';
import { readWorkbook } from '../../src-main/services/record-import';

const SPECIES_COLUMNS = 3; // the bench workbook has three species columns per visit row
const records = Number(process.argv[2] ?? 200_000);
const out = process.argv[3] ?? join(process.cwd(), 'bench/output/grid');

async function main(): Promise<void> {
  mkdirSync(out, { recursive: true });
  const rows = Math.ceil(records / SPECIES_COLUMNS);
  const file = join(out, `grid-${rows}.xlsx`);
  if (!existsSync(file)) await makeBenchWorkbook(file, rows);

  let t = performance.now();
  const alone = await readWorkbook(file);
  const importMs = performance.now() - t;
  const n = alone.data?.loaded.records.n ?? 0;

  const app = await openApp({ width: 1600, height: 1000 });
  const { page } = app;
  try {
    // The same call from the page, without rendering: import plus transfer over the test bridge.
    t = performance.now();
    await page.evaluate(async (path) => {
      const bridge = (window as unknown as Record<string, Record<string, (i: unknown) => Promise<unknown>>>)['tallywiseHost'];
      await bridge['import:read-workbook']({ path });
    }, file);
    const bridgeMs = performance.now() - t;
    app.dialogs.opens.push(file);
    t = performance.now();
    await app.command('import-workbook');
    await page.getByTestId('records-grid').locator('.ag-row').first().waitFor({ timeout: 600_000 });
    const firstRenderMs = performance.now() - t;

    const shown = page.getByTestId('records-shown');
    const timeFilter = async (label: string, choose: () => Promise<void>): Promise<number> => {
      const before = await shown.textContent();
      const t0 = performance.now();
      await choose();
      await page.waitForFunction((b) => document.querySelector('[data-testid="records-shown"]')?.textContent !== b, before, { timeout: 600_000 });
      const ms = performance.now() - t0;
      console.log(`  ${label}: ${ms.toFixed(0)} ms (${(await shown.textContent())?.replace(/\..*$/, '')})`);
      return ms;
    };
    console.log(`grid bench: ${n} records (${rows} visit rows x ${SPECIES_COLUMNS} species)`);
    console.log(`  import service alone (Node): ${importMs.toFixed(0)} ms`);
    console.log(`  import called from the page, no rendering (service + bridge): ${bridgeMs.toFixed(0)} ms`);
    console.log(`  import command to first grid rows: ${firstRenderMs.toFixed(0)} ms (page work after the reply about ${Math.max(0, firstRenderMs - bridgeMs).toFixed(0)} ms; the two runs differ by machine load)`);
    const site = (await page.getByLabel('Filter by site').locator('option').nth(1).getAttribute('value')) ?? '';
    const siteMs = await timeFilter('filter by one site', async () => void (await page.getByLabel('Filter by site').selectOption(site)));
    const clearMs = await timeFilter('clear the filter', () => page.getByRole('button', { name: 'Clear filters' }).click());
    const flagMs = await timeFilter('filter to records with a finding', async () => void (await page.getByLabel('Filter by flag').selectOption('flagged')));
    console.log(`  ratios to the first render: site filter ${(siteMs / firstRenderMs).toFixed(3)}, clear ${(clearMs / firstRenderMs).toFixed(3)}, flag filter ${(flagMs / firstRenderMs).toFixed(3)}`);
    if (app.consoleErrors.length) console.log(`  page errors: ${app.consoleErrors.join(' | ')}`);
  } finally {
    await app.close();
    await closeBrowser();
  }
}

main().catch((err) => {
  console.error(err);
  process.exitCode = 1;
});
