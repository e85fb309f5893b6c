/**
 * The demo programme's full report written as PDF, HTML and XLSX, read back
 * with outside tools: poppler (pdftotext, pdffonts, pdftoppm), exceljs and
 * LibreOffice. The numbers checked are the engine's own outputs for the demo
 * (the engine itself is checked against R in test/engine and test/trend);
 * here the question is whether the documents carry them faithfully. The
 * files are left in test-output/report/ to look at.
 */
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import ExcelJS from 'exceljs';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_TRUTH, logSlope } from '@shared/demo/truth';
import { writeReportFiles, type WrittenReport } from '../../src-main/report/write-report';
import { demoReport, DEMO_LOG } from './demo-report';
import { hasPoppler, pdfFontsTable, pdfPageCount, pdfText } from './pdf-tools';
import { MARKUP } from './ships-report';

const outDir = resolve(__dirname, '../../test-output/report');
let written: WrittenReport;

beforeAll(async () => {
  mkdirSync(outDir, { recursive: true });
  written = await writeReportFiles((await demoReport()).doc, outDir, 'demo-report');
}, 120_000);

const hasSoffice = (() => {
  try {
    execFileSync('soffice', ['--version'], { stdio: 'ignore', timeout: 60_000 });
    return true;
  } catch {
    return false;
  }
})();

describe('the demo report', () => {
  it('names each file written with the SHA-256 of the bytes on disk (node:crypto)', () => {
    expect(written.files.map((f) => f.name)).toEqual(['demo-report.pdf', 'demo-report.html', 'demo-report.xlsx']);
    for (const [f, path] of written.files.map((f, i) => [f, [written.pdf, written.html, written.xlsx][i]] as const)) {
      expect(f.sha256).toBe(createHash('sha256').update(readFileSync(path)).digest('hex'));
    }
  });

  it('recovers each species’ true trend within its 95% limits (the simulation’s known rates, resources/demo/truth.json)', async () => {
    const { groups } = await demoReport();
    for (const s of DEMO_TRUTH.species) {
      const g = groups.find((x) => x.group === s.key)!;
      const truth = Math.exp(logSlope(s)) - 1;
      expect(g.result!.slope.lower).toBeLessThan(truth);
      expect(g.result!.slope.upper).toBeGreaterThan(truth);
    }
  });

  it('chose a zero-inflated NB for the natterjack and says so in its methods, with the comparison behind it', async () => {
    const { doc } = await demoReport();
    const natterjack = doc.sections.find((s) => s.id === 'group-natterjack')!;
    const texts = natterjack.blocks.flatMap((b) => (b.kind === 'paragraph' ? [b.text] : []));
    expect(texts.some((t) => t.includes('"Zero-inflated NB, pond effects", chosen by the analyst'))).toBe(true);
    expect(texts.some((t) => t.startsWith('The counts in "count" were modelled with a zero-inflated negative binomial model'))).toBe(true);
    const toad = doc.sections.find((s) => s.id === 'group-common-toad')!;
    expect(toad.blocks.some((b) => b.kind === 'paragraph' && b.text.includes('a negative binomial generalised linear model'))).toBe(true);
    const specs = doc.appendix.blocks.flatMap((b) => (b.kind === 'code' ? [[b.title, JSON.parse(b.text).distribution]] : []));
    expect(specs).toEqual([['Model spec of Common frog, Common toad and Pool frog (JSON)', 'negbin'], ['Model spec of Natterjack toad (JSON)', 'zinb']]);
  });
});

describe.skipIf(!hasPoppler())('the demo report as PDF', () => {
  it('holds each species’ indices, trend and model comparison as the engine gave them', async () => {
    const { groups } = await demoReport();
    const text = pdfText(written.pdf).replace(/[ \t]+/g, ' ');
    for (const g of groups) {
      for (const r of g.result!.indices) expect(text).toContain(`${r.time} ${r.index.toFixed(1)} ${r.lower.toFixed(1)} ${r.upper.toFixed(1)}`);
      for (const row of g.comparison!.rows) expect(text).toContain(row.aic!.toFixed(1));
    }
    expect(text).not.toMatch(/NaN|Infinity|undefined|\[object/);
  });

  it('numbers every page, embeds every font, and every page renders', () => {
    const n = pdfPageCount(written.pdf);
    for (let p = 1; p <= n; p++) expect(pdfText(written.pdf, { first: p, last: p })).toContain(`page ${p} of ${n}`);
    for (const line of pdfFontsTable(written.pdf).split('\n').slice(2).filter((l) => l.trim())) expect(line).toMatch(/\byes\s+yes\b/);
    const pages = join(outDir, 'pages');
    rmSync(pages, { recursive: true, force: true });
    mkdirSync(pages);
    execFileSync('pdftoppm', ['-r', '60', '-png', written.pdf, join(pages, 'page')]);
    expect(readdirSync(pages).filter((f) => f.endsWith('.png'))).toHaveLength(n);
  });
});

describe('the demo report as XLSX', () => {
  async function workbook(): Promise<ExcelJS.Workbook> {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(readFileSync(written.xlsx) as unknown as ArrayBuffer);
    return wb;
  }

  it('has one sheet per table, each with a frozen, bold header row', async () => {
    const wb = await workbook();
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Trend summary', 'Indices', 'Coefficients', 'Model comparison', 'Data summary', 'Audit log']);
    for (const ws of wb.worksheets) {
      expect(ws.views[0]).toMatchObject({ state: 'frozen', ySplit: 1 });
      expect(ws.getRow(1).font?.bold).toBe(true);
    }
  });

  it('holds the engine’s indices, comparison and data summary as numbers with number formats', async () => {
    const { groups } = await demoReport();
    const wb = await workbook();
    const indices = wb.getWorksheet('Indices')!;
    let row = 2;
    for (const g of groups) {
      for (const r of g.result!.indices) {
        const cells = indices.getRow(row++);
        expect(cells.getCell(1).value).toBe(g.label);
        expect(cells.getCell(2).value).toBe(r.time);
        expect(cells.getCell(3).value).toBe(r.index);
        expect(cells.getCell(5).value).toBe(r.upper);
        expect(cells.getCell(3).numFmt).toBe('0.0');
      }
    }
    const comparison = wb.getWorksheet('Model comparison')!;
    const rows = groups.flatMap((g) => g.comparison!.rows.map((r) => ({ g, r })));
    rows.forEach(({ g, r }, i) => {
      const cells = comparison.getRow(i + 2);
      expect(cells.getCell(1).value).toBe(g.label);
      expect(cells.getCell(6).value).toBe(r.aic);
      expect(cells.getCell(12).value || null).toBe(r.label === g.comparison!.chosen ? 'yes' : null);
    });
    const data = wb.getWorksheet('Data summary')!;
    const first = groups[0].data!.seasons[0];
    expect((data.getRow(2).values as unknown[]).slice(1, 8)).toEqual([groups[0].label, first.time, first.sites, first.records, first.visits, first.counted, first.effort]);
  });

  it('lists the whole cleaning log, a site named as markup as plain text', async () => {
    const ws = (await workbook()).getWorksheet('Audit log')!;
    expect(ws.getColumn(1).values.slice(2, 2 + DEMO_LOG.entries.length)).toEqual(DEMO_LOG.entries.map((e) => e.id));
    expect(ws.getRow(2).getCell(8).value).toBe(MARKUP);
  });

  it.skipIf(!hasSoffice)('converts in LibreOffice headless without error, every sheet', () => {
    const dir = mkdtempSync(join(tmpdir(), 'tw-soffice-'));
    try {
      const profile = `file://${join(dir, 'profile')}`;
      // One CSV per sheet: the csv filter's sheet option -1 writes them all (LibreOffice 7.2+).
      execFileSync('soffice', [`-env:UserInstallation=${profile}`, '--headless', '--convert-to', 'csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,false,false,false,-1', '--outdir', dir, written.xlsx], { stdio: 'pipe', timeout: 120_000 });
      const csvs = readdirSync(dir).filter((f) => f.endsWith('.csv'));
      expect(csvs).toHaveLength(6);
      const indices = readFileSync(join(dir, csvs.find((f) => f.includes('Indices'))!), 'utf8');
      expect(indices.split('\n')[0]).toBe('species,season,Index,Lower 95%,Upper 95%');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

