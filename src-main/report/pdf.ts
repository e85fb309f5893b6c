/**
 * The report as a PDF (A4): fonts embedded, charts embedded as vector
 * drawings from their SVG, table headers repeated on each page a table runs
 * onto, and "page i of n" on every page.
 */
import PDFDocument from 'pdfkit';
import SVGtoPDF from 'svg-to-pdfkit';
import type { ChartSvgs } from '@shared/report/html';
import type { Block, ReportDocument, Section, TableBlock } from '@shared/report/model';
import { cellText } from '@shared/report/number-format';
import { pdfFonts } from './pdf-fonts';
import { numberPages } from './pdf-page-numbers';

const MARGIN = 50;
const INK = '#1f2933';
const MUTED = '#52606d';
const RULE = '#c8ced6';
const CAUTION = '#b7791f';

interface Ctx {
  readonly doc: PDFKit.PDFDocument;
  readonly width: number;
  readonly svgs: ChartSvgs;
}

const bottom = (doc: PDFKit.PDFDocument) => doc.page.height - doc.page.margins.bottom;

/** Starts a new page unless `height` still fits on this one. */
function ensureRoom(ctx: Ctx, height: number): void {
  if (ctx.doc.y + height > bottom(ctx.doc)) ctx.doc.addPage();
}

function text(ctx: Ctx, s: string, opts: { font?: 'body' | 'bold' | 'mono'; size?: number; color?: string; gap?: number; indent?: number } = {}): void {
  const { doc } = ctx;
  doc.font(opts.font ?? 'body').fontSize(opts.size ?? 10).fillColor(opts.color ?? INK);
  const width = ctx.width - (opts.indent ?? 0);
  ensureRoom(ctx, Math.min(doc.heightOfString(s, { width }), 60));
  doc.text(s, MARGIN + (opts.indent ?? 0), doc.y, { width });
  doc.moveDown(opts.gap ?? 0.5);
}

/** Column widths: each column's natural width, shrunk in proportion when they do not fit. */
function columnWidths(ctx: Ctx, t: TableBlock, cells: string[][]): number[] {
  const { doc } = ctx;
  const natural = t.columns.map((c, j) => {
    doc.font('bold').fontSize(8);
    const head = Math.min(doc.widthOfString(c.header), 90);
    doc.font('body').fontSize(8);
    return 8 + Math.max(head, ...cells.map((r) => doc.widthOfString(r[j] ?? '')));
  });
  return fitWidths(natural, ctx.width);
}

/** Height of a table row: its tallest (wrapped) cell. */
/** Widths that add up to at most `room`: narrow columns keep their width, the wide ones share what is left (they wrap). */
export function fitWidths(natural: readonly number[], room: number): number[] {
  const total = natural.reduce((a, b) => a + b, 0);
  if (total <= room) return [...natural];
  let keep = natural.map(() => true);
  for (;;) {
    const narrow = natural.reduce((a, w, j) => a + (keep[j] ? 0 : w), 0);
    const wide = natural.filter((_w, j) => keep[j]);
    const share = (room - narrow) / wide.length;
    const next = natural.map((w, j) => keep[j] && w > share);
    if (next.every((k, j) => k === keep[j])) {
      return natural.map((w, j) => (keep[j] ? share : w));
    }
    keep = next;
  }
}

function rowHeight(ctx: Ctx, cells: string[], widths: number[], font: 'body' | 'bold'): number {
  const { doc } = ctx;
  doc.font(font).fontSize(8);
  return 4 + Math.max(...cells.map((c, j) => doc.heightOfString(c, { width: widths[j] - 6 })));
}

function drawRow(ctx: Ctx, cells: string[], widths: number[], numeric: boolean[], font: 'body' | 'bold', height: number, shade: boolean): void {
  const { doc } = ctx;
  const y = doc.y;
  if (shade) doc.rect(MARGIN, y, widths.reduce((a, b) => a + b, 0), height).fill('#f5f7fa');
  doc.font(font).fontSize(8).fillColor(INK);
  let x = MARGIN;
  cells.forEach((c, j) => {
    doc.text(c, x + 3, y + 2, { width: widths[j] - 6, align: numeric[j] ? 'right' : 'left', lineBreak: true });
    x += widths[j];
  });
  doc.moveTo(MARGIN, y + height).lineTo(x, y + height).lineWidth(0.4).strokeColor(RULE).stroke();
  doc.x = MARGIN;
  doc.y = y + height;
}

function table(ctx: Ctx, t: TableBlock): void {
  const { doc } = ctx;
  const cells = t.rows.map((r) => r.map((c, j) => cellText(c, t.columns[j]?.format)));
  const headers = t.columns.map((c) => c.header);
  const widths = columnWidths(ctx, t, cells);
  const numeric = t.columns.map((_c, j) => t.rows.some((r) => typeof r[j] === 'number'));
  const headHeight = rowHeight(ctx, headers, widths, 'bold');
  const firstHeight = cells.length ? rowHeight(ctx, cells[0], widths, 'body') : 0;
  ensureRoom(ctx, 16 + headHeight + firstHeight);
  text(ctx, t.caption, { font: 'bold', size: 9, gap: 0.2 });
  drawRow(ctx, headers, widths, numeric, 'bold', headHeight, true);
  for (const r of cells) {
    const h = rowHeight(ctx, r, widths, 'body');
    if (doc.y + h > bottom(doc)) {
      doc.addPage();
      text(ctx, `${t.caption} (continued)`, { font: 'bold', size: 9, gap: 0.2 });
      drawRow(ctx, headers, widths, numeric, 'bold', headHeight, true);
    }
    drawRow(ctx, r, widths, numeric, 'body', h, false);
  }
  doc.moveDown(0.3);
  for (const n of t.notes ?? []) text(ctx, n, { size: 7.5, color: MUTED, gap: 0.1 });
  doc.moveDown(0.6);
}

/** `keepWith`: room to keep below the chart for what follows it (its reading), so the two share a page. */
function chart(ctx: Ctx, b: Extract<Block, { kind: 'chart' }>, keepWith = 0): void {
  const { doc } = ctx;
  const svg = ctx.svgs[b.id];
  if (svg === undefined) {
    text(ctx, `Chart not drawn. ${b.alt}`, { size: 8, color: MUTED });
    return;
  }
  const w = ctx.width;
  const h = (w * b.height) / b.width;
  ensureRoom(ctx, h + 30 + keepWith);
  const y = doc.y;
  SVGtoPDF(doc, fitToBox(svg), MARGIN, y, { width: w, height: h, fontCallback: (_f, bold) => (bold ? 'bold' : 'body'), warningCallback: () => {} });
  doc.x = MARGIN;
  doc.y = y + h + 4;
  text(ctx, b.alt, { size: 7.5, color: MUTED, gap: 0.8 });
}

/** The SVG without the root's own width and height, so that its viewBox is scaled into the box it is drawn in. */
function fitToBox(svg: string): string {
  return svg.replace(/<svg\b[^>]*>/, (tag) => tag.replace(/\s(width|height)="[^"]*"/g, ''));
}

function caution(ctx: Ctx, title: string, items: readonly string[]): void {
  const { doc } = ctx;
  doc.font('body').fontSize(9);
  const body = items.map((i) => `• ${i}`).join('\n');
  const h = 18 + doc.heightOfString(body, { width: ctx.width - 14 });
  ensureRoom(ctx, Math.min(h, 200));
  const y = doc.y;
  text(ctx, title, { font: 'bold', size: 9.5, indent: 10, gap: 0.2 });
  for (const i of items) text(ctx, `• ${i}`, { size: 9, indent: 10, gap: 0.15 });
  doc.rect(MARGIN, y, 3, doc.y - y).fill(CAUTION);
  doc.fillColor(INK);
  doc.moveDown(0.6);
}

function block(ctx: Ctx, b: Block, refNumber: (k: string) => number, next?: Block): void {
  switch (b.kind) {
    case 'paragraph': {
      const cites = b.cites?.length ? ` [${[...new Set(b.cites)].map(refNumber).join(', ')}]` : '';
      text(ctx, `${b.text}${cites}`, { font: b.emphasis ? 'bold' : 'body', size: 10, gap: 0.7 });
      return;
    }
    case 'table':
      return table(ctx, b);
    case 'chart':
      return chart(ctx, b, next?.kind === 'paragraph' ? 50 : 0);
    case 'caution':
      return caution(ctx, b.title, b.items);
    case 'list':
      if (b.title) text(ctx, b.title, { font: 'bold', size: 9.5, gap: 0.2 });
      for (const i of b.items) text(ctx, `• ${i}`, { size: 9, indent: 8, gap: 0.15 });
      ctx.doc.moveDown(0.5);
      return;
    case 'code':
      text(ctx, b.title, { font: 'bold', size: 9.5, gap: 0.2 });
      for (const line of b.text.split('\n')) text(ctx, line, { font: 'mono', size: 7.5, gap: 0 });
      ctx.doc.moveDown(0.6);
      return;
  }
}

function section(ctx: Ctx, s: Section, refNumber: (k: string) => number, newPage: boolean): void {
  if (newPage) ctx.doc.addPage();
  ensureRoom(ctx, 60);
  text(ctx, s.heading, { font: 'bold', size: 15, gap: 0.4 });
  s.blocks.forEach((b, i) => block(ctx, b, refNumber, s.blocks[i + 1]));
}

export interface PdfOptions {
  /** Folder of the DejaVu TrueType files (default: Debian's). */
  readonly fontDir?: string;
}

export function reportPdf(report: ReportDocument, svgs: ChartSvgs, options: PdfOptions = {}): Promise<Buffer> {
  const fonts = pdfFonts(options.fontDir);
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: MARGIN, bottom: MARGIN + 10, left: MARGIN, right: MARGIN },
    info: { Title: report.title, Creator: 'Tallywise', CreationDate: new Date(report.createdAt) },
  });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  doc.registerFont('body', fonts.body);
  doc.registerFont('bold', fonts.bold);
  doc.registerFont('mono', fonts.mono);
  const pages = numberPages(doc, report.title, { font: 'body', size: 8, color: MUTED, margin: MARGIN, fromBottom: MARGIN - 14 });
  const ctx: Ctx = { doc, width: doc.page.width - 2 * MARGIN, svgs };
  const refNumber = (k: string) => report.references.findIndex((r) => r.key === k) + 1;
  text(ctx, report.title, { font: 'bold', size: 20, gap: 0.2 });
  if (report.subtitle) text(ctx, report.subtitle, { size: 11, color: MUTED, gap: 0.2 });
  text(ctx, `Made ${report.createdAt}`, { size: 9, color: MUTED, gap: 1 });
  report.sections.forEach((s, i) => section(ctx, s, refNumber, i > 1 && !s.continues));
  if (report.references.length) {
    section(ctx, { id: 'references', heading: 'References', blocks: [] }, refNumber, true);
    report.references.forEach((r, i) => text(ctx, `${i + 1}. ${r.text}`, { size: 9, gap: 0.3 }));
  }
  section(ctx, report.appendix, refNumber, true);
  pages.finish();
  doc.end();
  return done;
}
