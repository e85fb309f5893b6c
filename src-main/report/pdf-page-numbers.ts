/**
 * "Title — page i of n" at the foot of every page of a pdfkit document,
 * without keeping every page in memory until the end.
 *
 * pdfkit can go back to earlier pages only when it buffers them all
 * (bufferPages), which for a report of many species holds hundreds of
 * megabytes of page content until the document ends. Here each foot is
 * drawn as its page begins, and the total n, not known then, is one small
 * form XObject (PDF 1.7, ISO 32000-1, section 8.10) that every foot draws
 * and whose content — the digits of n — is written once at the end. Text
 * extraction reads it in place ("page 3 of 12").
 *
 * The foot is left-aligned at the margin, so its width never depends on n.
 */

/** The private parts of pdfkit 0.20 this module relies on (font state, page resources, references). */
interface PdfkitFont {
  readonly id: string;
  ref(): unknown;
  encode(text: string): [string[], unknown[]];
  readonly ascender: number;
}
interface PdfkitInternals {
  _font: PdfkitFont;
  _fontSize: number;
  page: PDFKit.PDFPage & { xobjects: Record<string, unknown> };
  ref(data: Record<string, unknown>): { data: Record<string, unknown>; write(chunk: string): void; end(): void };
  addContent(s: string): void;
}

const XOBJECT = 'TwPageTotal';

export interface FootStyle {
  readonly font: string;
  readonly size: number;
  readonly color: string;
  readonly margin: number;
  /** Distance of the foot's top above the page's bottom edge. */
  readonly fromBottom: number;
}

/**
 * Numbers the current page and every page added after it. Call `finish()`
 * before `doc.end()`; it writes the total and returns it.
 */
export function numberPages(doc: PDFKit.PDFDocument, title: string, style: FootStyle): { finish(): number } {
  const d = doc as unknown as PdfkitInternals & PDFKit.PDFDocument;
  const total = d.ref({ Type: 'XObject', Subtype: 'Form', BBox: [0, -style.size, 20 * style.size, 2 * style.size] });
  let pages = 0;
  const foot = () => {
    pages++;
    // The text flowing onto this page goes on with its own font, size, place and colour.
    const { x, y } = d;
    const font = d._font;
    const size = d._fontSize;
    const bottomMargin = d.page.margins.bottom;
    d.page.margins.bottom = 0;
    d.save();
    d.font(style.font).fontSize(style.size).fillColor(style.color);
    const lead = `${title} — page ${pages} of `;
    const top = d.page.height - style.fromBottom;
    d.text(lead, style.margin, top, { lineBreak: false });
    // The total at the end of the lead, on the same baseline: pdfkit's text space is flipped, the form's is not.
    const baseline = d.page.height - top - (d._font.ascender / 1000) * style.size;
    d.page.xobjects[XOBJECT] = total;
    d.addContent(`q 1 0 0 -1 0 ${d.page.height} cm 1 0 0 1 ${style.margin + d.widthOfString(lead)} ${baseline} cm /${XOBJECT} Do Q`);
    d.restore();
    d.page.margins.bottom = bottomMargin;
    d._font = font;
    d._fontSize = size;
    d.x = x;
    d.y = y;
  };
  foot();
  doc.on('pageAdded', foot);
  return {
    finish() {
      doc.off('pageAdded', foot);
      d.font(style.font);
      const font = d._font;
      // Encoding the digits also puts their glyphs in the embedded subset of the font.
      const [glyphs] = font.encode(String(pages));
      const [r, g, b] = [1, 3, 5].map((k) => parseInt(style.color.slice(k, k + 2), 16) / 255);
      total.data.Resources = { Font: { [font.id]: font.ref() } };
      total.write(`${r.toFixed(3)} ${g.toFixed(3)} ${b.toFixed(3)} rg BT /${font.id} ${style.size} Tf 0 0 Td <${glyphs.join('')}> Tj ET`);
      total.end();
      return pages;
    },
  };
}
