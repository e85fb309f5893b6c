import { unzipSync } from 'fflate';
import { ImportError } from '../../src-shared/import/import-error';

/**
 * The parts of an .xlsx package (a zip file), read through its central
 * directory. Only the parts asked for are inflated.
 */
export type Parts = Record<string, Uint8Array>;

const zipMagic = [0x50, 0x4b, 0x03, 0x04];
const oleMagic = [0xd0, 0xcf, 0x11, 0xe0];

function startsWith(bytes: Uint8Array, magic: number[]): boolean {
  return magic.every((b, i) => bytes[i] === b);
}

/** Throws an ImportError naming the file when the bytes are not a readable zip package. */
export function checkZip(bytes: Uint8Array, file: string): void {
  if (bytes.length === 0) throw new ImportError('empty-file', `${file} is empty (0 bytes). Choose the saved workbook, or save it again from the spreadsheet program.`, { file });
  if (startsWith(bytes, oleMagic)) {
    throw new ImportError('unsupported-file', `${file} is an old-style binary workbook (.xls), which is not read here. Open it in a spreadsheet program and save it as .xlsx (or as .csv).`, { file });
  }
  if (!startsWith(bytes, zipMagic)) {
    throw new ImportError('not-a-workbook', `${file} is not an .xlsx workbook (it is not a zip package). If it is a CSV or text file, rename it to .csv; otherwise save it again as .xlsx.`, { file });
  }
}

/** Inflates the parts whose names pass `want` (names compared without a leading slash). */
export function readParts(bytes: Uint8Array, file: string, want: (name: string) => boolean): Parts {
  checkZip(bytes, file);
  try {
    return unzipSync(bytes, { filter: (f) => want(f.name.replace(/^\//, '')) });
  } catch (e) {
    throw new ImportError('damaged-workbook', `${file} is damaged and cannot be unpacked (${(e as Error).message || 'bad zip data'}); it may be cut short by a download or a copy. Open it in a spreadsheet program and save it again.`, { file });
  }
}
