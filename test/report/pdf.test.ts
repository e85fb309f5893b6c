import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { ReportDocument } from '@shared/report/model';
import { fitWidths, reportPdf } from '../../src-main/report/pdf';
import { renderDocumentCharts } from '../../src-main/report/svg';
import { hasPoppler, pdfFontsTable, pdfPageCount, pdfText } from './pdf-tools';
import { MARKUP, reference, shipsReport } from './ships-report';

const dir = mkdtempSync(join(tmpdir(), 'tw-report-pdf-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function shipsPdf(): Promise<string> {
  const { doc } = await shipsReport();
  const file = join(dir, 'ships.pdf');
  writeFileSync(file, await reportPdf(doc, renderDocumentCharts(doc)));
  return file;
}

/** A document with one table far longer than a page. */
function longTableDoc(): ReportDocument {
  const rows = Array.from({ length: 150 }, (_v, i) => [`site ${i + 1}`, i * 1.5, i / 1000]);
  return {
    title: 'Long table',
    subtitle: '',
    createdAt: '2026-01-02T03:04:05.000Z',
    sections: [{ id: 's', heading: 'Sites', blocks: [{ kind: 'table', id: 't', caption: 'Every site', columns: [{ header: 'Site name' }, { header: 'Visits total', format: { kind: 'fixed', decimals: 1 } }, { header: 'Share', format: { kind: 'percent', decimals: 2 } }], rows }] }],
    appendix: { id: 'appendix', heading: 'Appendix', blocks: [] },
    references: [],
    sheets: [],
  };
}

describe.skipIf(!hasPoppler())('PDF report (read back with poppler-utils)', () => {
  it('holds the engine numbers: indices and slope of stats::glm on MASS::ships as shown', async () => {
    const text = pdfText(await shipsPdf());
    for (const r of reference.indices) expect(text).toMatch(new RegExp(`${r.time}\\s+${r.index.toFixed(1)}\\s+${r.lower.toFixed(1)}\\s+${r.upper.toFixed(1)}`));
    const pct = (x: number) => `${x >= 0 ? '+' : ''}${(100 * x).toFixed(1)}%`;
    expect(text.replace(/\s+/g, ' ')).toContain(`${pct(reference.slope.perYear)} a season, limits ${pct(reference.slope.lower)} to ${pct(reference.slope.upper)}`);
    // A string from the data is printed as it is.
    expect(text).toContain(MARKUP);
    expect(text).not.toMatch(/NaN|Infinity|undefined/);
  });

  it('embeds its fonts, numbers its pages and draws the chart (its title is text in the PDF)', async () => {
    const file = await shipsPdf();
    const fonts = pdfFontsTable(file).split('\n').slice(2).filter((l) => l.trim());
    expect(fonts.length).toBeGreaterThan(0);
    for (const line of fonts) expect(line).toMatch(/\byes\s+yes\b/); // emb, sub
    const n = pdfPageCount(file);
    for (let p = 1; p <= n; p++) expect(pdfText(file, { first: p, last: p })).toContain(`page ${p} of ${n}`);
    expect(pdfText(file).replace(/\s+/g, ' ')).toContain(`How has ${MARKUP} changed?`);
  });

  it('repeats a table header on every page the table runs onto', async () => {
    const file = join(dir, 'long.pdf');
    writeFileSync(file, await reportPdf(longTableDoc(), {}));
    const n = pdfPageCount(file);
    expect(n).toBeGreaterThanOrEqual(3);
    for (let p = 2; p <= n - 1; p++) {
      const page = pdfText(file, { first: p, last: p });
      expect(page).toContain('Every site (continued)');
      expect(page).toMatch(/Site name\s+Visits total\s+Share/);
    }
    const all = pdfText(file);
    for (const i of [1, 75, 150]) expect(all).toMatch(new RegExp(`site ${i}\\s+${((i - 1) * 1.5).toFixed(1)}\\s+${((i - 1) / 10).toFixed(2)}%`));
  });

  it('page 1 renders to an image', async () => {
    const file = await shipsPdf();
    execFileSync('pdftoppm', ['-r', '50', '-png', '-f', '1', '-l', '1', '-singlefile', file, join(dir, 'page1')]);
    const png = readFileSync(join(dir, 'page1.png'));
    expect(png.subarray(1, 4).toString()).toBe('PNG');
    expect(statSync(join(dir, 'page1.png')).size).toBeGreaterThan(5000);
  });
});

describe('PDF table layout', () => {
  it('keeps narrow columns and shares what is left among the wide ones', () => {
    expect(fitWidths([10, 20], 100)).toEqual([10, 20]);
    expect(fitWidths([10, 200, 300], 110)).toEqual([10, 50, 50]);
    expect(fitWidths([10, 20, 300], 110).reduce((a, b) => a + b, 0)).toBeCloseTo(110);
  });
});
