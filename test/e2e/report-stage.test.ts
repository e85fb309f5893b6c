import { createHash } from 'node:crypto';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_TRUTH } from '@shared/demo/truth';
import { hasPoppler, pdfText } from '../report/pdf-tools';
import { loadProject } from '../../src-main/project/project-store';
import { closeBrowser, openApp } from './harness';

// The Report stage end to end in Chromium with the real services, the real
// fit and report workers and the real report writer: models fitted and
// chosen for two demo species on the Models stage, the project saved, then
// the report made from them, cancelled once (nothing written, the screen as
// it was), made again, and its files opened. The PDF's text is read back
// with pdftotext. The report goes into the project's report history (the
// project then has unsaved changes); saved and made once more, the report
// says it reproduced the last one exactly.

afterAll(closeBrowser);

const reported = ['common_toad', 'pool_frog'].map((k) => DEMO_TRUTH.species.find((s) => s.key === k)!.label);
const folder = mkdtempSync(join(tmpdir(), 'tw-e2e-report-'));
const projectFile = join(folder, 'ponds.tallywise');
afterAll(() => rmSync(folder, { recursive: true, force: true }));

async function fitAndChoose(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Models' }).click();
  await page.getByTestId('models-summary').waitFor({ timeout: 60_000 });
  for (const s of reported) await page.getByRole('checkbox', { name: s, exact: true }).check();
  const leaveOut = page.getByRole('checkbox', { name: /leave out rows where an offset is missing/ });
  if (await leaveOut.count()) await leaveOut.check();
  await page.getByLabel('Distribution').selectOption('negbin');
  await page.getByTestId('fit-button').click();
  for (const s of reported) {
    const tab = page.getByRole('tab', { name: new RegExp(`^${s}`) });
    await tab.waitFor({ timeout: 180_000 });
    await tab.click();
    await page.getByRole('radio', { name: /Use "Negative binomial/ }).check();
  }
}

describe('the Report stage', () => {
  it('makes the report of the chosen models with progress and cancel, then opens it', async () => {
    let firstPdfSha = '';
    let written: string[] = [];
    const opened: string[] = [];
    const app = await openApp({ width: 1366, height: 768, env: { shell: { reveal: async (p) => (opened.push(`reveal ${p}`), true), open: async (p) => (opened.push(`open ${p}`), true) } } });
    const { page } = app;
    try {
      await app.command('open-demo');
      await page.getByTestId('records-summary').filter({ hasText: 'from 15 workbooks' }).waitFor({ timeout: 60_000 });
      await fitAndChoose(page);

      await page.getByRole('button', { name: 'Report' }).click();
      await page.getByRole('heading', { name: 'Report', level: 1 }).waitFor();
      // The two species with a chosen model can be reported; the others say why not and where to fix it.
      for (const s of reported) await expect.poll(() => page.getByRole('checkbox', { name: s, exact: true }).isChecked()).toBe(true);
      const others = DEMO_TRUTH.species.filter((s) => !reported.includes(s.label));
      for (const s of others) await expect.poll(() => page.getByRole('checkbox', { name: s.label, exact: true }).isDisabled()).toBe(true);
      await expect.poll(() => page.getByTestId('report-species-why').first().textContent()).toMatch(/no model is chosen for the report.*Models stage/);
      await expect.poll(() => page.getByTestId('make-report').isDisabled()).toBe(true);

      app.dialogs.folders.push(folder);
      await page.getByRole('button', { name: 'Choose folder…' }).click();
      await expect.poll(() => page.getByTestId('report-folder').textContent()).toBe(folder);
      // The folder is kept in the project: the project now has unsaved changes, and the stage says to save first.
      await page.getByTestId('unsaved-mark').waitFor();
      await page.getByTestId('report-unsaved').waitFor();
      await app.screenshot('report-stage');
      app.dialogs.saves.push(projectFile);
      await app.command('save-project');
      await expect.poll(() => page.getByTestId('unsaved-mark').count(), { timeout: 30_000 }).toBe(0);
      if (!(await page.getByTestId('make-report').count())) await page.getByRole('button', { name: 'Report' }).click();
      await expect.poll(() => page.getByTestId('report-unsaved').count()).toBe(0);

      // Make it, see the progress, cancel: nothing is written and the screen is as before.
      await page.getByTestId('make-report').click();
      await page.getByTestId('report-progress-text').filter({ hasText: /Step \d of 3; now/ }).waitFor({ timeout: 30_000 });
      await app.screenshot('report-progress');
      await page.getByTestId('cancel-report').click();
      await expect.poll(() => page.getByTestId('report-note').textContent()).toMatch(/cancelled before any file was written/);
      await page.getByTestId('make-report').waitFor();
      await expect.poll(() => page.getByTestId('report-written').count()).toBe(0);
      expect(readdirSync(folder).filter((f) => !f.startsWith('ponds.tallywise'))).toEqual([]);
      for (const s of reported) await expect.poll(() => page.getByRole('checkbox', { name: s, exact: true }).isChecked()).toBe(true);

      // Again, to the end: progress reaches the composite, then the three files are listed.
      await page.getByTestId('make-report').click();
      await page.getByTestId('report-progress-text').filter({ hasText: /composite/ }).waitFor({ timeout: 120_000 });
      await page.getByTestId('report-written').waitFor({ timeout: 240_000 });
      await app.screenshot('report-done');
      // The report is kept in the project's history: unsaved changes, and the stage shows the last report.
      await page.getByTestId('unsaved-mark').waitFor();
      await expect.poll(() => page.getByTestId('report-last').textContent()).toMatch(/^Report history: last made \d{4}-\d\d-\d\d \d\d:\d\d UTC with Tallywise \S+, files \S+-trend-report \.pdf, \.html and \.xlsx\./);
      await expect.poll(() => page.getByTestId('report-note').textContent()).toMatch(/added to the project's report history/);
      const files = readdirSync(folder).filter((f) => !f.startsWith('ponds.tallywise')).sort();
      expect(files.map((f) => f.slice(f.lastIndexOf('.')))).toEqual(['.html', '.pdf', '.xlsx']);
      const pdf = join(folder, files[1]);
      if (hasPoppler()) {
        const text = pdfText(pdf).replace(/\s+/g, ' ');
        for (const s of reported) expect(text).toContain(`Counts of ${s}`);
        expect(text).toContain('Composite of 2 species');
        // The appendix names the saved project file with the SHA-256 of its bytes (computed here with node:crypto).
        const sha = createHash('sha256').update(readFileSync(projectFile)).digest('hex');
        expect(text).toContain(`Project file: ponds.tallywise, SHA-256 ${sha}`);
      }

      await page.getByTestId('open-pdf').click();
      await page.getByTestId('open-folder').click();
      await expect.poll(() => opened).toEqual([`open ${pdf}`, `reveal ${pdf}`]);
      expect(existsSync(pdf)).toBe(true);
      written = files;
      firstPdfSha = createHash('sha256').update(readFileSync(pdf)).digest('hex');

      // Saved (the history goes into the file) and made again from the same project: reproduced exactly.
      await app.command('save-project');
      await expect.poll(() => page.getByTestId('unsaved-mark').count(), { timeout: 30_000 }).toBe(0);
      await page.getByTestId('make-report').click();
      await expect.poll(() => page.getByTestId('report-note').textContent(), { timeout: 240_000 }).toMatch(/Nothing changed since the last report, and it was reproduced exactly\./);
      await expect.poll(() => page.getByTestId('report-last').textContent()).toMatch(/\.xlsx \(1 earlier\)\./);
      await app.screenshot('report-reproduced');
      if (hasPoppler()) expect(pdfText(pdf).replace(/\s+/g, ' ')).toContain('Since the last report');
      expect(app.consoleErrors).toEqual([]);
    } finally {
      await app.close();
    }
    // The folder and the species are remembered in the project file, and the first report in its history.
    const { document } = await loadProject(projectFile);
    expect(document.report.outputFolder).toBe(folder);
    expect(document.reportHistory).toHaveLength(1);
    const [entry] = document.reportHistory;
    expect(entry.species.map((s) => s.species)).toEqual(reported);
    expect([...entry.files.map((f) => f.name)].sort()).toEqual(written);
    expect(entry.files[0].sha256).toBe(firstPdfSha);
  }, 600_000);
});
