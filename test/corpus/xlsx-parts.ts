import { strToU8, zipSync } from 'fflate';

/**
 * Builds small .xlsx packages from hand-written XML parts, so that corpus
 * files can hold exactly the awkward thing they test (hidden sheets, error
 * cells, merged headers, the 1904 date system, prefixed namespaces, inline
 * strings without a shared-strings part).
 */
export interface PartSheet {
  readonly name: string;
  /** The <sheetData> rows, e.g. '<row r="1"><c r="A1" t="inlineStr"><is><t>Site</t></is></c></row>'. */
  readonly rows: string;
  readonly hidden?: boolean;
  /** Extra XML after </sheetData> (e.g. <mergeCells>). */
  readonly after?: string;
  /** The whole worksheet part as given (for broken XML). */
  readonly raw?: string;
}

export interface PartWorkbook {
  readonly sheets: readonly PartSheet[];
  readonly sharedStrings?: readonly string[];
  readonly date1904?: boolean;
  /** Namespace prefix for the spreadsheet elements ('' = default namespace). */
  readonly prefix?: string;
  /** cellXfs numFmtIds; index = the s attribute (default: 0 General, 1 date 14). */
  readonly cellFormats?: readonly number[];
}

const ns = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main';
const relNs = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';
const pkgRel = 'http://schemas.openxmlformats.org/package/2006/relationships';

function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

export function buildXlsx(wb: PartWorkbook): Uint8Array {
  const p = wb.prefix ? `${wb.prefix}:` : '';
  const xmlns = wb.prefix ? `xmlns:${wb.prefix}="${ns}"` : `xmlns="${ns}"`;
  const files: Record<string, Uint8Array> = {};
  const put = (name: string, text: string) => (files[name] = strToU8(text));
  const decl = '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n';
  put('[Content_Types].xml', `${decl}<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/><Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/></Types>`);
  put('_rels/.rels', `${decl}<Relationships xmlns="${pkgRel}"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/></Relationships>`);
  const sheetsXml = wb.sheets.map((s, i) => `<${p}sheet name="${esc(s.name)}" sheetId="${i + 1}"${s.hidden ? ' state="hidden"' : ''} r:id="rId${i + 1}"/>`).join('');
  put('xl/workbook.xml', `${decl}<${p}workbook ${xmlns} xmlns:r="${relNs}"><${p}workbookPr${wb.date1904 ? ' date1904="1"' : ''}/><${p}sheets>${sheetsXml}</${p}sheets></${p}workbook>`);
  const rels = wb.sheets.map((_, i) => `<Relationship Id="rId${i + 1}" Type="${relNs}/worksheet" Target="worksheets/sheet${i + 1}.xml"/>`);
  rels.push(`<Relationship Id="rIdS" Type="${relNs}/styles" Target="styles.xml"/>`);
  if (wb.sharedStrings) rels.push(`<Relationship Id="rIdT" Type="${relNs}/sharedStrings" Target="sharedStrings.xml"/>`);
  put('xl/_rels/workbook.xml.rels', `${decl}<Relationships xmlns="${pkgRel}">${rels.join('')}</Relationships>`);
  const formats = wb.cellFormats ?? [0, 14];
  put('xl/styles.xml', `${decl}<${p}styleSheet ${xmlns}><${p}numFmts count="1"><${p}numFmt numFmtId="164" formatCode="dd/mm/yyyy"/></${p}numFmts><${p}cellStyleXfs count="1"><${p}xf numFmtId="0"/></${p}cellStyleXfs><${p}cellXfs count="${formats.length}">${formats.map((f) => `<${p}xf numFmtId="${f}" xfId="0"/>`).join('')}</${p}cellXfs></${p}styleSheet>`);
  if (wb.sharedStrings) {
    put('xl/sharedStrings.xml', `${decl}<${p}sst ${xmlns} count="${wb.sharedStrings.length}">${wb.sharedStrings.map((s) => `<${p}si><${p}t xml:space="preserve">${esc(s)}</${p}t></${p}si>`).join('')}</${p}sst>`);
  }
  wb.sheets.forEach((s, i) => {
    put(`xl/worksheets/sheet${i + 1}.xml`, s.raw ?? `${decl}<${p}worksheet ${xmlns} xmlns:r="${relNs}"><${p}sheetData>${s.rows}</${p}sheetData>${s.after ?? ''}</${p}worksheet>`);
  });
  return zipSync(files);
}

/** Inline-string, number and raw cells for writing rows by hand. */
export const cell = {
  text: (ref: string, t: string, prefix = '') => {
    const p = prefix ? `${prefix}:` : '';
    return `<${p}c r="${ref}" t="inlineStr"><${p}is><${p}t>${esc(t)}</${p}t></${p}is></${p}c>`;
  },
  num: (ref: string, v: number, style = 0, prefix = '') => {
    const p = prefix ? `${prefix}:` : '';
    return `<${p}c r="${ref}"${style ? ` s="${style}"` : ''}><${p}v>${v}</${p}v></${p}c>`;
  },
  shared: (ref: string, index: number) => `<c r="${ref}" t="s"><v>${index}</v></c>`,
  error: (ref: string, e: string, formula = '1/0') => `<c r="${ref}" t="e"><f>${esc(formula)}</f><v>${esc(e)}</v></c>`,
  formula: (ref: string, formula: string, cached: number) => `<c r="${ref}"><f>${esc(formula)}</f><v>${cached}</v></c>`,
};

/** A row of cells: values are text, numbers, or {date serial}. */
export function row(r: number, values: readonly (string | number | null | { serial: number })[], prefix = ''): string {
  const p = prefix ? `${prefix}:` : '';
  const cells = values.map((v, j) => {
    const ref = `${String.fromCharCode(65 + j)}${r}`;
    if (v === null) return '';
    if (typeof v === 'string') return cell.text(ref, v, prefix);
    if (typeof v === 'number') return cell.num(ref, v, 0, prefix);
    return cell.num(ref, v.serial, 1, prefix);
  });
  return `<${p}row r="${r}">${cells.join('')}</${p}row>`;
}
