import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { importFile, listSheets, type ImportOptions } from '../../src-main/import/import-file';
import { checkFile } from '../../src-main/import/check-file';
import { ImportError, type ImportErrorCode } from '../../src-shared/import/import-error';
import type { ImportedTable } from '../../src-shared/import/imported-table';
import { corpusFiles, makeCorpus, type CorpusFile } from './make-corpus';

/**
 * One test per corpus file: either a clear ImportError (stable name and
 * code, the file named, a fix in the message) or a correct import. The
 * expected values are what the files were written to hold (make-corpus.ts).
 */
let dir: string;
let paths: Record<CorpusFile, string>;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'tw-corpus-'));
  paths = await makeCorpus(dir);
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

async function failure(name: CorpusFile, options: ImportOptions = {}): Promise<ImportError> {
  try {
    await importFile(paths[name], options);
  } catch (e) {
    expect(e).toBeInstanceOf(ImportError);
    const err = e as ImportError;
    expect(err.name).toBe('ImportError');
    expect(err.message).toContain(paths[name]);
    expect(err.message).not.toMatch(/\bat .*\(.*:\d+:\d+\)/); // no stack frames
    return err;
  }
  throw new Error(`${name} was read without an error`);
}

async function fails(name: CorpusFile, code: ImportErrorCode, fix: RegExp, options: ImportOptions = {}) {
  const err = await failure(name, options);
  expect(err.code).toBe(code);
  expect(err.message).toMatch(fix);
  return err;
}

function texts(t: ImportedTable, name: string): string[] {
  const c = t.columns.find((x) => x.name === name);
  expect(c, `column ${name}`).toBeDefined();
  return c!.texts.map((s) => s.trim());
}

function numbers(t: ImportedTable, name: string): number[] {
  return Array.from(t.columns.find((x) => x.name === name)!.numbers);
}

const csvSmall = (t: ImportedTable) => {
  expect(t.columns.map((c) => c.name)).toEqual(['Site', 'Date', 'Count', 'Minutes']);
  expect(texts(t, 'Site')).toEqual(['Étang Mère', 'Étang Mère', 'Lac Noir']);
  expect(numbers(t, 'Count')).toEqual([4, 2, 0]);
};

describe('bad-input corpus', () => {
  it('has at least 30 files', () => {
    expect(corpusFiles.length).toBeGreaterThanOrEqual(30);
  });

  it('truncated.xlsx: damaged, save again', async () => {
    await fails('truncated.xlsx', 'damaged-workbook', /save it again/);
  });
  it('not-a-zip.xlsx: text renamed to .xlsx', async () => {
    await fails('not-a-zip.xlsx', 'not-a-workbook', /rename it to \.csv/);
  });
  it('random-bytes.xlsx: not a workbook', async () => {
    await fails('random-bytes.xlsx', 'not-a-workbook', /not a zip package/);
  });
  it('random-bytes.csv: binary, not text', async () => {
    await fails('random-bytes.csv', 'unreadable-file', /binary data.*export the data again/);
  });
  it('empty.csv: empty file', async () => {
    await fails('empty.csv', 'empty-file', /0 bytes/);
  });
  it('empty.xlsx: empty file', async () => {
    await fails('empty.xlsx', 'empty-file', /0 bytes/);
  });
  it('header-only.csv: header row 1, no data', async () => {
    const e = await fails('header-only.csv', 'no-data', /header in row 1 but no data rows.*Add the data rows/);
    expect(e.place.row).toBe(1);
  });
  it('blank-rows-only.csv: empty', async () => {
    await fails('blank-rows-only.csv', 'no-data', /is empty/);
  });
  it('single-line-2mb.csv: too many fields, check the delimiter', async () => {
    const e = await fails('single-line-2mb.csv', 'too-wide', /row 1 splits into 262145 fields.*another delimiter/);
    expect(e.place.row).toBe(1);
  });
  it('utf16le-bom.csv: UTF-16 LE with BOM', async () => {
    const t = await importFile(paths['utf16le-bom.csv']);
    expect(t.source.encoding).toBe('utf-16le');
    csvSmall(t);
  });
  it('utf16be-bom.csv: UTF-16 BE with BOM', async () => {
    const t = await importFile(paths['utf16be-bom.csv']);
    expect(t.source.encoding).toBe('utf-16be');
    csvSmall(t);
  });
  it('utf16le-no-bom.csv: UTF-16 LE told by its zero bytes', async () => {
    const t = await importFile(paths['utf16le-no-bom.csv']);
    expect(t.source.encoding).toBe('utf-16le');
    csvSmall(t);
  });
  it('windows-1252.csv: é and è decoded', async () => {
    const t = await importFile(paths['windows-1252.csv']);
    expect(t.source.encoding).toBe('windows-1252');
    csvSmall(t);
  });
  it('utf8-bom.csv: BOM not part of the first header', async () => {
    const t = await importFile(paths['utf8-bom.csv']);
    expect(t.source.encoding).toBe('utf-8 with BOM');
    csvSmall(t);
  });
  it('semicolon-decimal-comma.csv: ; and , detected', async () => {
    const t = await importFile(paths['semicolon-decimal-comma.csv']);
    expect(t.source.delimiter).toBe(';');
    expect(t.source.decimalMark).toBe(',');
    expect(numbers(t, 'Hours')).toEqual([1.5, 0.75, 2]);
    expect(texts(t, 'Hours')).toEqual(['1,5', '0,75', '2']); // original texts kept
  });
  it('tab-separated.txt: tab detected', async () => {
    const t = await importFile(paths['tab-separated.txt']);
    expect(t.source.delimiter).toBe('\t');
    expect(texts(t, 'Site')).toEqual(['North', 'South']);
  });
  it('text-in-numeric.csv: "lots" is an invalid count at row 3, column C', async () => {
    const r = await checkFile(paths['text-in-numeric.csv']);
    const f = r.findings.filter((x) => x.code === 'invalid-count');
    expect(f).toHaveLength(1);
    expect(f[0]).toMatchObject({ row: 3, column: 'C', severity: 'error' });
    expect(f[0].message).toContain('"lots"');
    expect(r.needsAction).toBe(true);
  });
  it('merged-header-two-rows.xlsx: names from the merged cells above', async () => {
    const t = await importFile(paths['merged-header-two-rows.xlsx']);
    expect(t.columns.map((c) => c.name)).toEqual(['Site', 'Date', 'Newt', 'Toad', 'Frog']);
    expect(Array.from(t.rowNumbers)).toEqual([4, 5]);
    expect(numbers(t, 'Frog')).toEqual([3, 6]);
  });
  it('merged-header-across.xlsx: merged header filled across, numbered', async () => {
    const t = await importFile(paths['merged-header-across.xlsx']);
    expect(t.columns.map((c) => c.name)).toEqual(['Site', 'Minutes', 'Minutes (2)', 'Count']);
    expect(t.findings.map((f) => f.code).sort()).toEqual(['duplicate-header', 'merged-header']);
    expect(t.findings.find((f) => f.code === 'merged-header')!.column).toBe('C');
  });
  it('hidden-sheet.xlsx: hidden flag listed, first visible sheet read, hidden one warned about', async () => {
    expect(await listSheets(paths['hidden-sheet.xlsx'])).toEqual([{ name: 'Old counts', hidden: true }, { name: 'Counts', hidden: false }]);
    const t = await importFile(paths['hidden-sheet.xlsx']);
    expect(t.sheets).toEqual(['Counts']);
    expect(texts(t, 'Site')).toEqual(['North', 'South']);
    const hidden = await importFile(paths['hidden-sheet.xlsx'], { sheet: 'Old counts' });
    expect(hidden.findings.map((f) => f.code)).toContain('hidden-sheet');
    const e = await fails('hidden-sheet.xlsx', 'no-such-sheet', /"Old counts" \(hidden\), "Counts"/, { sheet: 'Nope' });
    expect(e.place.sheet).toBe('Nope');
  });
  it('formula-errors.xlsx: errors kept as errors, cached values read, each error found', async () => {
    const t = await importFile(paths['formula-errors.xlsx']);
    expect(texts(t, 'Count')).toEqual(['#DIV/0!', '2', '5', '#REF!']);
    const r = await checkFile(paths['formula-errors.xlsx']);
    const errs = r.findings.filter((f) => f.code === 'formula-error').map((f) => `${f.column}${f.row}`).sort();
    expect(errs).toEqual(['C2', 'C5', 'D4']);
  });
  it('text-dates-styles.csv: every style read, day-first settled by 15/05/2019', async () => {
    const r = await checkFile(paths['text-dates-styles.csv']);
    expect(r.questions).toEqual([]);
    expect(r.findings.filter((f) => f.code.startsWith('date-'))).toEqual([]);
    const t = await importFile(paths['text-dates-styles.csv']);
    expect(t.questions).toEqual([]);
  });
  it('ambiguous-dates.csv: a question, not a guess; answered with dateOrder', async () => {
    const t = await importFile(paths['ambiguous-dates.csv']);
    expect(t.questions).toHaveLength(1);
    expect(t.questions[0]).toMatchObject({ code: 'ambiguous-date-order', column: 'B', columnName: 'Date', options: ['dmy', 'mdy'] });
    const answered = await importFile(paths['ambiguous-dates.csv'], { dateOrder: 'mdy' });
    expect(answered.questions).toEqual([]);
  });
  it('mixed-date-order.csv: both orders in one column is an error', async () => {
    const t = await importFile(paths['mixed-date-order.csv']);
    const f = t.findings.find((x) => x.code === 'mixed-date-order');
    expect(f).toMatchObject({ severity: 'error', column: 'B' });
    expect(f!.message).toContain('"15/05/2019"');
    expect(f!.message).toContain('"05/16/2019"');
  });
  it('prefixed-namespace-flavour.xlsx: prefixed namespaces, inline strings, no shared strings', async () => {
    const t = await importFile(paths['prefixed-namespace-flavour.xlsx']);
    expect(t.sheets).toEqual(['Feuille1']);
    expect(texts(t, 'Site')).toEqual(['Étang', 'Mare']);
    // 43588 and 43600 in the 1900 system (R as.Date origin 1899-12-30; see import-reference.json): 2019-05-03, 2019-05-15
    expect(texts(t, 'Date')).toEqual(['2019-05-03', '2019-05-15']);
    expect(numbers(t, 'Count')).toEqual([3, 0]);
  });
  it('huge-numbers.csv: too large is an error, very large a warning, never NaN', async () => {
    const r = await checkFile(paths['huge-numbers.csv']);
    const byRow = (code: string) => r.findings.filter((f) => f.code === code).map((f) => f.row).sort();
    expect(byRow('count-not-finite')).toEqual([3]);
    expect(byRow('huge-count')).toEqual([2, 4]);
    expect(JSON.stringify(r)).not.toContain('NaN');
  });
  it('unicode-sites.csv: accents, CJK and emoji kept exactly, not taken for variants', async () => {
    const t = await importFile(paths['unicode-sites.csv']);
    expect([...new Set(texts(t, 'Site'))]).toEqual(['Étang de la Fôret', '北池', '🐸 Pond']);
    const r = await checkFile(paths['unicode-sites.csv']);
    expect(r.findings.filter((f) => f.code === 'similar-site-name')).toEqual([]);
    expect(r.summary.sites).toBe(3);
  });
  it('date1904.xlsx: serials in the 1904 system', async () => {
    const t = await importFile(paths['date1904.xlsx']);
    expect(t.source.date1904).toBe(true);
    // R: as.Date(c(0, 42126), origin = "1904-01-01") (import-reference.json)
    expect(texts(t, 'Date')).toEqual(['1904-01-01', '2019-05-03']);
  });
  it('old-binary.xls: old format, save as .xlsx', async () => {
    await fails('old-binary.xls', 'unsupported-file', /save it as \.xlsx/);
  });
  it('wrong-extension.pdf: not a table file', async () => {
    await fails('wrong-extension.pdf', 'unsupported-file', /\.pdf.*Give an \.xlsx workbook or a \.csv/);
  });
  it('zip-without-workbook.xlsx: a zip, but no workbook part', async () => {
    await fails('zip-without-workbook.xlsx', 'damaged-workbook', /no workbook part/);
  });
  it('broken-sheet-xml.xlsx: sheet cut short, row named', async () => {
    const e = await fails('broken-sheet-xml.xlsx', 'damaged-workbook', /sheet "Counts" cannot be read near row 2/);
    expect(e.place).toMatchObject({ sheet: 'Counts', row: 2 });
  });
  it('trailer-and-total.csv: total row and note left out of the data', async () => {
    const t = await importFile(paths['trailer-and-total.csv']);
    expect(t.nrows).toBe(2);
    expect(t.findings.find((f) => f.code === 'total-row')!.row).toBe(5);
    expect(t.findings.find((f) => f.code === 'trailer-note')!.row).toBe(6);
  });
  it('duplicate-headers.csv: second "Count" numbered and warned about', async () => {
    const t = await importFile(paths['duplicate-headers.csv']);
    expect(t.columns.map((c) => c.name)).toEqual(['Site', 'Count', 'Count (2)']);
    expect(t.findings.find((f) => f.code === 'duplicate-header')).toMatchObject({ column: 'C', row: 1 });
  });
  it('quoted-newlines.csv: quotes, embedded commas and newlines', async () => {
    const t = await importFile(paths['quoted-newlines.csv']);
    expect(texts(t, 'Site')).toEqual(['North, upper', 'South']);
    expect(t.columns[2].texts).toEqual(['line one\nline two', 'said "hi"']);
    expect(Array.from(t.rowNumbers)).toEqual([2, 3]);
  });
  it('shared-strings-rich.xlsx: escaped shared strings, a code among numbers', async () => {
    const t = await importFile(paths['shared-strings-rich.xlsx']);
    expect(texts(t, 'Site')).toEqual(['North & East', '<South>']);
    expect(texts(t, 'Count')).toEqual(['7', 'NS']);
  });
  it('only-title.xlsx: a title and nothing else', async () => {
    await fails('only-title.xlsx', 'no-data', /no data rows/);
  });
  it('no-cell-refs.xlsx: rows and cells without references are placed in order', async () => {
    const t = await importFile(paths['no-cell-refs.xlsx']);
    expect(texts(t, 'Site')).toEqual(['North', 'South']);
    expect(numbers(t, 'Count')).toEqual([3, 4]);
    expect(Array.from(t.rowNumbers)).toEqual([2, 5]);
  });
  it('cell-types.xlsx: formula strings, ISO date cells, booleans and explicit numbers', async () => {
    const t = await importFile(paths['cell-types.xlsx']);
    expect(texts(t, 'Site')).toEqual(['North', 'South']);
    expect(texts(t, 'Date')).toEqual(['2019-05-03', '2019-05-04']);
    expect(numbers(t, 'Count')).toEqual([2, 0]);
    expect(texts(t, 'Checked')).toEqual(['TRUE', 'FALSE']);
  });
  it('no-header-numbers.csv: numbers only, asks for a header row', async () => {
    await fails('no-header-numbers.csv', 'no-header', /Add one row of column names/);
  });
});
