import { mkdir, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { strToU8, zipSync } from 'fflate';
import { buildXlsx, cell, row } from './xlsx-parts';

/**
 * Writes the bad-input corpus into a folder: malformed and awkward files a
 * user may hand to the importer. Binary files are generated here (not
 * committed); every file is small except the 2 MB single line. Invented
 * contents; random bytes come from a seeded generator.
 */
export const corpusFiles = [
  'truncated.xlsx', 'not-a-zip.xlsx', 'random-bytes.xlsx', 'random-bytes.csv', 'empty.csv', 'empty.xlsx',
  'header-only.csv', 'blank-rows-only.csv', 'single-line-2mb.csv', 'utf16le-bom.csv', 'utf16be-bom.csv',
  'utf16le-no-bom.csv', 'windows-1252.csv', 'utf8-bom.csv', 'semicolon-decimal-comma.csv', 'tab-separated.txt',
  'text-in-numeric.csv', 'merged-header-two-rows.xlsx', 'merged-header-across.xlsx', 'hidden-sheet.xlsx',
  'formula-errors.xlsx', 'text-dates-styles.csv', 'ambiguous-dates.csv', 'mixed-date-order.csv',
  'prefixed-namespace-flavour.xlsx', 'huge-numbers.csv', 'unicode-sites.csv', 'date1904.xlsx', 'old-binary.xls',
  'wrong-extension.pdf', 'zip-without-workbook.xlsx', 'broken-sheet-xml.xlsx', 'trailer-and-total.csv',
  'duplicate-headers.csv', 'quoted-newlines.csv', 'shared-strings-rich.xlsx', 'only-title.xlsx', 'no-header-numbers.csv', 'no-cell-refs.xlsx', 'cell-types.xlsx',
] as const;
export type CorpusFile = (typeof corpusFiles)[number];

function seeded(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s >>> 24;
  };
}

function utf16(text: string, bigEndian: boolean, bom: boolean): Uint8Array {
  const out = new Uint8Array((text.length + (bom ? 1 : 0)) * 2);
  let o = 0;
  const put = (c: number) => {
    out[o++] = bigEndian ? c >> 8 : c & 255;
    out[o++] = bigEndian ? c & 255 : c >> 8;
  };
  if (bom) put(0xfeff);
  for (let i = 0; i < text.length; i++) put(text.charCodeAt(i));
  return out;
}

/** Windows-1252 bytes for Latin-1 text (enough for the accented names used here). */
function latin1(text: string): Uint8Array {
  return Uint8Array.from(text, (ch) => ch.charCodeAt(0));
}

const smallCsv = 'Site,Date,Count,Minutes\nÉtang Mère,2019-05-03,4,30\nÉtang Mère,2019-05-20,2,30\nLac Noir,2019-05-04,0,25\n';

function smallWorkbook(): Uint8Array {
  return buildXlsx({
    sheets: [{ name: 'Counts', rows: [row(1, ['Site', 'Date', 'Count']), row(2, ['North Pond', { serial: 43588 }, 3]), row(3, ['South Pond', { serial: 43589 }, 5])].join('') }],
  });
}

export async function makeCorpus(dir: string): Promise<Record<CorpusFile, string>> {
  await mkdir(dir, { recursive: true });
  const paths = {} as Record<CorpusFile, string>;
  const write = async (name: CorpusFile, data: Uint8Array | string) => {
    const path = join(dir, name);
    await writeFile(path, data);
    paths[name] = path;
  };
  const rand = seeded(42);
  const good = smallWorkbook();
  await write('truncated.xlsx', good.subarray(0, Math.floor(good.length / 2)));
  await write('not-a-zip.xlsx', 'Site,Count\nNorth,3\n');
  await write('random-bytes.xlsx', Uint8Array.from({ length: 4096 }, rand));
  await write('random-bytes.csv', Uint8Array.from({ length: 4096 }, rand));
  await write('empty.csv', '');
  await write('empty.xlsx', new Uint8Array(0));
  await write('header-only.csv', 'Site,Date,Count\n');
  await write('blank-rows-only.csv', ',,,\n\n,,\n\n');
  await write('single-line-2mb.csv', '1234567,'.repeat(262_144));
  await write('utf16le-bom.csv', utf16(smallCsv, false, true));
  await write('utf16be-bom.csv', utf16(smallCsv, true, true));
  await write('utf16le-no-bom.csv', utf16(smallCsv, false, false));
  await write('windows-1252.csv', latin1(smallCsv));
  await write('utf8-bom.csv', new Uint8Array([0xef, 0xbb, 0xbf, ...strToU8(smallCsv)]));
  await write('semicolon-decimal-comma.csv', 'Site;Date;Count;Hours\nNorth;2019-05-03;4;1,5\nNorth;2019-05-21;6;0,75\nSouth;2019-05-04;1;2\n');
  await write('tab-separated.txt', 'Site\tDate\tCount\nNorth\t2019-05-03\t4\nSouth\t2019-05-04\t7\n');
  await write('text-in-numeric.csv', 'Site,Date,Count\nNorth,2019-05-03,4\nNorth,2019-05-20,lots\nSouth,2019-05-04,3\nSouth,2019-05-22,2\n');
  await write('merged-header-two-rows.xlsx', buildXlsx({
    sheets: [{
      name: 'Counts',
      rows: [row(1, ['Pond survey']), row(2, ['Site', 'Date', 'Counts', null, null]), row(3, [null, null, 'Newt', 'Toad', 'Frog']),
        row(4, ['North', '2019-05-03', 1, 2, 3]), row(5, ['South', '2019-05-04', 4, 5, 6])].join(''),
      after: '<mergeCells count="3"><mergeCell ref="A2:A3"/><mergeCell ref="B2:B3"/><mergeCell ref="C2:E2"/></mergeCells>',
    }],
  }));
  await write('merged-header-across.xlsx', buildXlsx({
    sheets: [{
      name: 'Counts',
      rows: [row(1, ['Site', 'Minutes', null, 'Count']), row(2, ['North', 10, 15, 3]), row(3, ['South', 20, 5, 1])].join(''),
      after: '<mergeCells count="1"><mergeCell ref="B1:C1"/></mergeCells>',
    }],
  }));
  await write('hidden-sheet.xlsx', buildXlsx({
    sheets: [
      { name: 'Old counts', hidden: true, rows: [row(1, ['Site', 'Count']), row(2, ['Old Pond', 9])].join('') },
      { name: 'Counts', rows: [row(1, ['Site', 'Count']), row(2, ['North', 3]), row(3, ['South', 4])].join('') },
    ],
  }));
  await write('formula-errors.xlsx', buildXlsx({
    sheets: [{
      name: 'Counts',
      rows: [
        row(1, ['Site', 'Date', 'Count', 'Minutes']),
        `<row r="2">${cell.text('A2', 'North')}${cell.text('B2', '2019-05-03')}${cell.error('C2', '#DIV/0!', 'D2/0')}${cell.num('D2', 30)}</row>`,
        `<row r="3">${cell.text('A3', 'North')}${cell.text('B3', '2019-05-20')}${cell.formula('C3', 'D3/10', 2)}${cell.num('D3', 20)}</row>`,
        `<row r="4">${cell.text('A4', 'South')}${cell.text('B4', '2019-05-04')}${cell.num('C4', 5)}${cell.error('D4', '#N/A', 'VLOOKUP(A4,X:Y,2,0)')}</row>`,
        `<row r="5">${cell.text('A5', 'South')}${cell.text('B5', '2019-05-22')}${cell.error('C5', '#REF!', '#REF!+1')}${cell.num('D5', 25)}</row>`,
      ].join(''),
    }],
  }));
  await write('text-dates-styles.csv', 'Site,Date,Count\nNorth,2019-05-03,1\nNorth,3 May 2019,2\nNorth,"May 4, 2019",3\nSouth,05.05.2019,4\nSouth,15/05/2019,5\nSouth,06/05/2019,6\nEast,7-May-19,7\n');
  await write('ambiguous-dates.csv', 'Site,Date,Count\nNorth,03/05/2019,1\nNorth,04/06/2019,2\nSouth,03/05/2019,3\nSouth,05/06/2019,4\n');
  await write('mixed-date-order.csv', 'Site,Date,Count\nNorth,15/05/2019,1\nNorth,05/16/2019,2\nSouth,03/05/2019,3\nSouth,20/05/2019,4\n');
  const x = 'x';
  await write('prefixed-namespace-flavour.xlsx', buildXlsx({
    prefix: x,
    sheets: [{ name: 'Feuille1', rows: [row(1, ['Site', 'Date', 'Count'], x), row(2, ['Étang', { serial: 43588 }, 3], x), row(3, ['Mare', { serial: 43600 }, 0], x)].join('') }],
  }));
  await write('huge-numbers.csv', 'Site,Date,Count\nNorth,2019-05-03,99999999999999999999\nNorth,2019-05-20,1e400\nSouth,2019-05-04,1.7976931348623157e308\nSouth,2019-05-21,3\n');
  await write('unicode-sites.csv', 'Site,Date,Count\nÉtang de la Fôret,2019-05-03,1\nÉtang de la Fôret,2019-05-20,2\n北池,2019-05-04,3\n北池,2019-05-21,4\n🐸 Pond,2019-05-05,5\n🐸 Pond,2019-05-22,6\n');
  await write('date1904.xlsx', buildXlsx({
    date1904: true,
    sheets: [{ name: 'Counts', rows: [row(1, ['Site', 'Date', 'Count']), row(2, ['North', { serial: 0 }, 1]), row(3, ['North', { serial: 42126 }, 2])].join('') }],
  }));
  await write('old-binary.xls', new Uint8Array([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, ...Array.from({ length: 504 }, () => 0)]));
  await write('wrong-extension.pdf', '%PDF-1.4\n%\u00e2\u00e3\n');
  await write('zip-without-workbook.xlsx', zipSync({ 'readme.txt': strToU8('not a workbook') }));
  const cut = `<?xml version="1.0"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>${row(1, ['Site', 'Count'])}<row r="2"><c r="A2" t="inlineStr"><is><t>North</t></is></c><c r="B2"`;
  const broken = buildXlsx({ sheets: [{ name: 'Counts', rows: '', raw: cut }] });
  await write('broken-sheet-xml.xlsx', broken);
  await write('trailer-and-total.csv', 'Site,Date,Count,Minutes\nNorth,2019-05-03,4,30\nSouth,2019-05-04,6,30\n\nTotal,,10,60\nChecked by the coordinator,,,\n');
  await write('duplicate-headers.csv', 'Site,Count,Count\nNorth,1,2\nSouth,3,4\n');
  await write('quoted-newlines.csv', 'Site,Count,Remarks\n"North, upper",3,"line one\nline two"\nSouth,4,"said ""hi"""\n');
  await write('shared-strings-rich.xlsx', buildXlsx({
    sharedStrings: ['Site', 'Count', 'North & East', '<South>', 'NS'],
    sheets: [{ name: 'Counts', rows: `<row r="1">${cell.shared('A1', 0)}${cell.shared('B1', 1)}</row><row r="2">${cell.shared('A2', 2)}<c r="B2"><v>7</v></c></row><row r="3">${cell.shared('A3', 3)}${cell.shared('B3', 4)}</row>` }],
  }));
  await write('only-title.xlsx', buildXlsx({ sheets: [{ name: 'Counts', rows: row(1, ['Pond survey 2019 — data to follow']) }] }));
  await write('no-header-numbers.csv', '1,2,3\n4,5,6\n7,8,9\n');
  const t = (v: string) => `<c t="inlineStr"><is><t>${v}</t></is></c>`;
  await write('no-cell-refs.xlsx', buildXlsx({
    sheets: [{ name: 'Counts', rows: `<row>${t('Site')}${t('Count')}</row><row>${t('North')}<c><v>3</v></c></row><row r="5">${t('South')}<c><v>4</v></c></row>` }],
  }));
  await write('cell-types.xlsx', buildXlsx({
    sheets: [{
      name: 'Counts',
      rows: `<row r="1">${cell.text('A1', 'Site')}${cell.text('B1', 'Date')}${cell.text('C1', 'Count')}${cell.text('D1', 'Checked')}</row>`
        + `<row r="2"><c r="A2" t="str"><f>"Nor"&amp;"th"</f><v>North</v></c><c r="B2" t="d"><v>2019-05-03T00:00:00Z</v></c><c r="C2"><v>2</v></c><c r="D2" t="b"><v>1</v></c></row>`
        + `<row r="3">${cell.text('A3', 'South')}<c r="B3" t="d"><v>2019-05-04</v></c><c r="C3" t="n"><v>0</v></c><c r="D3" t="b"><v>0</v></c></row>`,
    }],
  }));
  return paths;
}
