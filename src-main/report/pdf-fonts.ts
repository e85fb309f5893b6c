/**
 * The fonts embedded in the PDF report: DejaVu Sans (full Unicode coverage
 * for site and species names) when the font files are installed (Debian
 * package fonts-dejavu-core), otherwise the PDF standard fonts, which cover
 * Latin-1 only.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';

export const DEJAVU_DIR = '/usr/share/fonts/truetype/dejavu';

export interface PdfFonts {
  /** Font names or TrueType file paths for pdfkit's registerFont / font. */
  readonly body: string;
  readonly bold: string;
  readonly mono: string;
  readonly embedded: 'dejavu' | 'standard';
}

export function pdfFonts(dir: string = DEJAVU_DIR): PdfFonts {
  const files = { body: join(dir, 'DejaVuSans.ttf'), bold: join(dir, 'DejaVuSans-Bold.ttf'), mono: join(dir, 'DejaVuSansMono.ttf') };
  if (Object.values(files).every((f) => existsSync(f))) return { ...files, embedded: 'dejavu' };
  return { body: 'Helvetica', bold: 'Helvetica-Bold', mono: 'Courier', embedded: 'standard' };
}
