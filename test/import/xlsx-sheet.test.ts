import { describe, expect, it } from 'vitest';
import { readSheet } from '../../src-main/import/xlsx-sheet';
import { cellAt } from '../../src-shared/import/cells';
import type { WorkbookInfo } from '../../src-main/import/xlsx-package';

/** The worksheet scanner on XML that writers legitimately produce (XML 1.0 and ECMA-376 escapes). */
const info: WorkbookInfo = { sheets: [], date1904: false, dateStyles: [false, true], sharedStrings: ['zero', 'one'] };
const entry = { name: 'S', hidden: false, path: 'xl/worksheets/sheet1.xml' };
const read = (body: string, head = '<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main">') =>
  readSheet(new TextEncoder().encode(`<?xml version="1.0"?>\n${head}<!-- written by hand --><sheetData>${body}</sheetData></worksheet>`), 'x.xlsx', entry, info);

describe('worksheet scanner', () => {
  it('unescapes entities, character references and _xHHHH_ escapes; reads CDATA as is', async () => {
    const g = await read(`<row r="1"><c r="A1" t="inlineStr"><is><t>Fish &amp; Chips &#233;&#x4E2D;</t></is></c><c r="B1" t="inlineStr"><is><t>a_x000D_b</t></is></c><c r="C1" t="inlineStr"><is><t><![CDATA[<raw> & ok]]></t></is></c></row>`);
    expect(cellAt(g, 1, 1).text).toBe('Fish & Chips é中');
    expect(cellAt(g, 1, 2).text).toBe('a\rb');
    expect(cellAt(g, 1, 3).text).toBe('<raw> & ok');
  });
  it('copes with attributes over several lines, single quotes, a > inside a value, comments and rich inline runs', async () => {
    const g = await read(`<row\n r='2'\n spans="1:3"><c\n  r="B2"\n  s='1'><v>43588</v></c><!-- a note --><c r="C2" t="s" x:foo="a>b"><v>1</v></c><c r="D2" t="inlineStr"><is><r><t>Rich </t></r><r><t>text</t></r><rPh><t>skip</t></rPh></is></c></row>`);
    expect(g.nrows).toBe(2);
    expect(cellAt(g, 2, 2)).toEqual({ text: '2019-05-03', kind: 'date', number: 43588 });
    expect(cellAt(g, 2, 3).text).toBe('one');
    expect(cellAt(g, 2, 4).text).toBe('Rich text');
    expect(cellAt(g, 1, 1).kind).toBe('blank');
  });
  it('reads any namespace prefix and keeps merged ranges', async () => {
    const g = await readSheet(new TextEncoder().encode('<x:worksheet xmlns:x="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><x:sheetData><x:row r="1"><x:c r="A1" t="s"><x:v>0</x:v></x:c><x:c r="B1"/></x:row></x:sheetData><x:mergeCells><x:mergeCell ref="A1:C2"/></x:mergeCells></x:worksheet>'), 'x.xlsx', entry, info);
    expect(cellAt(g, 1, 1).text).toBe('zero');
    expect(cellAt(g, 1, 2).kind).toBe('blank');
    expect(g.merges).toEqual([{ top: 1, left: 1, bottom: 2, right: 3 }]);
  });
});
