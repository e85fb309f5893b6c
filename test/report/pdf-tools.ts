/** poppler-utils (pdftotext, pdffonts, pdftoppm) for reading the PDF report back; CI needs the Debian package poppler-utils. */
import { execFileSync } from 'node:child_process';

export function hasPoppler(): boolean {
  try {
    execFileSync('pdftotext', ['-v'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}

/** The text of the pages first..last (all when absent), layout kept. */
export function pdfText(file: string, pages?: { first: number; last: number }): string {
  const range = pages ? ['-f', String(pages.first), '-l', String(pages.last)] : [];
  return execFileSync('pdftotext', ['-layout', ...range, file, '-'], { encoding: 'utf8' });
}

export function pdfFontsTable(file: string): string {
  return execFileSync('pdffonts', [file], { encoding: 'utf8' });
}

export function pdfPageCount(file: string): number {
  return Number(/Pages:\s+(\d+)/.exec(execFileSync('pdfinfo', [file], { encoding: 'utf8' }))?.[1]);
}
