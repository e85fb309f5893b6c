/**
 * Page feet drawn as each page begins (pdf-page-numbers.ts): every page says
 * "page i of n" with the right n, and text that flows across a page break
 * keeps its own size (the foot's 8 pt must not leak into it). Read back with
 * poppler-utils: pdftotext's word boxes give each word's height.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { ReportDocument } from '@shared/report/model';
import { reportPdf } from '../../src-main/report/pdf';
import { hasPoppler, pdfPageCount, pdfText } from './pdf-tools';

const dir = mkdtempSync(join(tmpdir(), 'tw-pdf-feet-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** One paragraph long enough to run over several pages by itself. */
function longParagraphDoc(): ReportDocument {
  const text = Array.from({ length: 900 }, (_v, i) => `word${i + 1}`).join(' ');
  return {
    title: 'Feet',
    subtitle: '',
    createdAt: '2026-01-02T03:04:05.000Z',
    sections: [{ id: 's', heading: 'Long', blocks: [{ kind: 'paragraph', text }] }],
    appendix: { id: 'appendix', heading: 'Appendix', blocks: [] },
    references: [],
    sheets: [],
  };
}

/** Heights of the words of page p whose text matches `which`, from pdftotext -bbox. */
function wordHeights(file: string, p: number, which: RegExp): number[] {
  const html = execFileSync('pdftotext', ['-bbox', '-f', String(p), '-l', String(p), file, '-'], { encoding: 'utf8' });
  const out: number[] = [];
  for (const m of html.matchAll(/<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/g)) {
    if (which.test(m[5])) out.push(Number(m[4]) - Number(m[2]));
  }
  return out;
}

describe.skipIf(!hasPoppler())('page feet', () => {
  it('number every page of a paragraph that runs over pages, and leave its text its own size', async () => {
    const file = join(dir, 'feet.pdf');
    writeFileSync(file, await reportPdf(longParagraphDoc(), {}));
    const n = pdfPageCount(file);
    expect(n).toBeGreaterThanOrEqual(3);
    for (let p = 1; p <= n; p++) expect(pdfText(file, { first: p, last: p })).toContain(`Feet — page ${p} of ${n}`);
    const body1 = wordHeights(file, 1, /^word\d+$/);
    const body2 = wordHeights(file, 2, /^word\d+$/);
    const foot2 = wordHeights(file, 2, /^page$/);
    expect(body2.length).toBeGreaterThan(100);
    const median = (a: number[]) => [...a].sort((x, y) => x - y)[a.length >> 1];
    // The paragraph's words are as tall on the page it flowed onto as on its first page, and taller than the foot's.
    expect(median(body2)).toBeCloseTo(median(body1), 1);
    expect(median(body2)).toBeGreaterThan(1.15 * median(foot2));
  });
});
