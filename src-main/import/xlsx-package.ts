import { isBuiltInDateFormat, isDateFormatCode } from '../../src-shared/import/excel-dates';
import { ImportError } from '../../src-shared/import/import-error';
import { readParts, type Parts } from './zip-parts';
import { walkXml } from './xml-events';
import { inflateEntry } from './zip-entry';

/**
 * What a workbook says about itself: its sheets (name, hidden state, part
 * path), the date system, which cell styles show dates, and the shared
 * strings.
 */
export interface SheetEntry {
  readonly name: string;
  readonly hidden: boolean;
  readonly path: string;
}

export interface WorkbookInfo {
  readonly sheets: readonly SheetEntry[];
  readonly date1904: boolean;
  /** Per cell style index (the s attribute): whether its number format is a date. */
  readonly dateStyles: readonly boolean[];
  readonly sharedStrings: readonly string[];
}

function resolveTarget(baseDir: string, target: string): string {
  if (target.startsWith('/')) return target.slice(1);
  const parts = (baseDir ? `${baseDir}/${target}` : target).split('/');
  const out: string[] = [];
  for (const p of parts) {
    if (p === '..') out.pop();
    else if (p !== '.' && p !== '') out.push(p);
  }
  return out.join('/');
}

function relationships(bytes: Uint8Array | undefined): Map<string, string> {
  const map = new Map<string, string>();
  if (!bytes) return map;
  walkXml(bytes, { open: (n, a) => { if (n === 'Relationship' && a.Id && a.Target) map.set(a.Id, a.Target); }, close: () => {} });
  return map;
}

function officeDocumentPath(parts: Parts): string {
  let path = 'xl/workbook.xml';
  const rels = parts['_rels/.rels'];
  if (rels) {
    walkXml(rels, {
      open: (n, a) => { if (n === 'Relationship' && /officeDocument$/.test(a.Type ?? '')) path = resolveTarget('', a.Target); },
      close: () => {},
    });
  }
  return path;
}

function readStyles(bytes: Uint8Array | undefined): boolean[] {
  if (!bytes) return [];
  const custom = new Map<number, string>();
  const xfFormats: number[] = [];
  let inCellXfs = false;
  walkXml(bytes, {
    open: (n, a) => {
      if (n === 'numFmt') custom.set(Number(a.numFmtId), a.formatCode ?? '');
      else if (n === 'cellXfs') inCellXfs = true;
      else if (n === 'xf' && inCellXfs) xfFormats.push(Number(a.numFmtId ?? 0));
    },
    close: (n) => { if (n === 'cellXfs') inCellXfs = false; },
  });
  return xfFormats.map((id) => (custom.has(id) ? isDateFormatCode(custom.get(id)!) : isBuiltInDateFormat(id)));
}

/** Shared strings: each <si> is its <t> text, or its rich-text runs joined; phonetic hints are left out. */
function readSharedStrings(bytes: Uint8Array | undefined): string[] {
  if (!bytes) return [];
  const out: string[] = [];
  let current = '';
  let inT = false;
  let inPhonetic = false;
  walkXml(bytes, {
    open: (n) => {
      if (n === 'si') current = '';
      else if (n === 't') inT = true;
      else if (n === 'rPh') inPhonetic = true;
    },
    close: (n) => {
      if (n === 'si') out.push(current);
      else if (n === 't') inT = false;
      else if (n === 'rPh') inPhonetic = false;
    },
    text: (t) => { if (inT && !inPhonetic) current += t; },
  });
  return out;
}

/** Unpacks the workbook's own parts and the sheet parts asked for (by name; all when `wanted` is undefined). */
export function openPackage(bytes: Uint8Array, file: string): { info: WorkbookInfo; parts: Parts } {
  const parts = readParts(bytes, file, (n) => !/^xl\/worksheets\/sheet|^xl\/media\/|^xl\/drawings\/|^xl\/charts\//.test(n) || n.endsWith('.rels'));
  const wbPath = officeDocumentPath(parts);
  const wbBytes = parts[wbPath];
  if (!wbBytes) {
    throw new ImportError('damaged-workbook', `${file} is a zip file but holds no workbook part (${wbPath}). It may be another kind of document renamed to .xlsx; open it in a spreadsheet program and save it as .xlsx.`, { file });
  }
  const baseDir = wbPath.includes('/') ? wbPath.slice(0, wbPath.lastIndexOf('/')) : '';
  const relsPath = `${baseDir ? `${baseDir}/` : ''}_rels/${wbPath.slice(baseDir ? baseDir.length + 1 : 0)}.rels`;
  const rels = relationships(parts[relsPath]);
  const sheets: SheetEntry[] = [];
  let date1904 = false;
  let stylesTarget = 'styles.xml';
  let stringsTarget = 'sharedStrings.xml';
  for (const [, target] of rels) {
    if (/styles\.xml$/i.test(target)) stylesTarget = target;
    if (/sharedStrings\.xml$/i.test(target)) stringsTarget = target;
  }
  try {
    walkXml(wbBytes, {
      open: (n, a) => {
        if (n === 'workbookPr') date1904 = a.date1904 === '1' || a.date1904 === 'true';
        else if (n === 'sheet') {
          const target = rels.get(a.id ?? '');
          if (!target) return;
          sheets.push({ name: a.name ?? `Sheet${sheets.length + 1}`, hidden: a.state === 'hidden' || a.state === 'veryHidden', path: resolveTarget(baseDir, target) });
        }
      },
      close: () => {},
    });
  } catch (e) {
    throw new ImportError('damaged-workbook', `${file}: the workbook part is not well-formed XML (${(e as Error).message.split('\n')[0]}). Open the file in a spreadsheet program and save it again.`, { file });
  }
  if (sheets.length === 0) throw new ImportError('no-sheets', `${file} lists no worksheets. Save it again with at least one sheet of data.`, { file });
  const info: WorkbookInfo = {
    sheets,
    date1904,
    dateStyles: safe(() => readStyles(parts[resolveTarget(baseDir, stylesTarget)]), file, 'styles'),
    sharedStrings: safe(() => readSharedStrings(parts[resolveTarget(baseDir, stringsTarget)]), file, 'shared strings'),
  };
  return { info, parts };
}

function safe<T>(f: () => T, file: string, what: string): T {
  try {
    return f();
  } catch (e) {
    throw new ImportError('damaged-workbook', `${file}: the ${what} part is not well-formed XML (${(e as Error).message.split('\n')[0]}). Open the file in a spreadsheet program and save it again.`, { file });
  }
}

/** Inflates one sheet part (natively: it is the bulk of the file). */
export function sheetBytes(bytes: Uint8Array, file: string, sheet: SheetEntry): Uint8Array {
  let data: Uint8Array | null;
  try {
    data = inflateEntry(bytes, sheet.path);
  } catch (e) {
    throw new ImportError('damaged-workbook', `${file} is damaged: ${(e as Error).message}; it may be cut short by a download or a copy. Open it in a spreadsheet program and save it again.`, { file, sheet: sheet.name });
  }
  if (!data) throw new ImportError('damaged-workbook', `${file}: sheet "${sheet.name}" is listed but its part (${sheet.path}) is missing. Open the file in a spreadsheet program and save it again.`, { file, sheet: sheet.name });
  return data;
}
