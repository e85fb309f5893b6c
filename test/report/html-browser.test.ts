/**
 * The HTML report opened in Chromium (the system browser through
 * playwright-core, as the browser tests do): it loads with no console error
 * and no request, a site named as markup shows as text and no dialog opens.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { browserPath, chromiumForFile } from './chromium';
import { describe, expect, it } from 'vitest';
import { renderHtml } from '@shared/report/html';
import { renderDocumentCharts } from '../../src-main/report/svg';
import { demoReport } from './demo-report';
import { MARKUP } from './ships-report';

const outDir = resolve(__dirname, '../../test-output/report');
const browser = chromiumForFile();

describe.skipIf(!browserPath)('the HTML report in Chromium', () => {
  it('loads with no console error, no request and no dialog; the site named as markup is text', async () => {
    const { doc } = await demoReport();
    mkdirSync(outDir, { recursive: true });
    const file = join(outDir, 'demo-report-browser.html');
    writeFileSync(file, renderHtml(doc, renderDocumentCharts(doc)));
    const page = await browser().newPage({ viewport: { width: 1100, height: 900 } });
    const problems: string[] = [];
    const requests: string[] = [];
    let dialogs = 0;
    page.on('console', (m) => (m.type() === 'error' || m.type() === 'warning') && problems.push(m.text()));
    page.on('pageerror', (e) => problems.push(e.message));
    page.on('dialog', (d) => {
      dialogs++;
      void d.dismiss();
    });
    page.on('request', (r) => !r.url().startsWith('file:') && !r.url().startsWith('data:') && requests.push(r.url()));
    await page.goto(pathToFileURL(file).href, { waitUntil: 'load' });
    await page.waitForTimeout(300);
    expect(problems).toEqual([]);
    expect(requests).toEqual([]);
    expect(dialogs).toBe(0);
    expect(await page.locator('img').count()).toBe(0);
    const merged = page.locator('#cleaning li', { hasText: 'merged into' });
    expect(await merged.innerText()).toBe(`site: "${MARKUP} " merged into "${MARKUP}"`);
    expect(await page.locator('figure svg').count()).toBe(doc.sections.flatMap((s) => s.blocks).filter((b) => b.kind === 'chart').length);
    await page.screenshot({ path: join(outDir, 'demo-report-html.png') });
    await page.emulateMedia({ media: 'print' });
    const pdf = await page.pdf({ format: 'A4' });
    expect(pdf.subarray(0, 4).toString()).toBe('%PDF');
    await page.close();
  });
});
