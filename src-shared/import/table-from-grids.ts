import { CellKind, columnLetter, type SheetGrid } from './cells';
import type { Finding } from './findings';
import { detectLayout, type SheetLayout } from './header-detect';
import { ImportError } from './import-error';
import type { ImportedColumn, ImportedTable, ImportQuestion, SourceInfo } from './imported-table';
import { looksLikeTextDate, readDateColumn, type DateOrder } from './text-dates';

export interface TableOptions {
  /** The answer to an ambiguous-date-order question, when the caller has it. */
  readonly dateOrder?: DateOrder;
}

function rowList(rows: readonly number[]): string {
  if (rows.length <= 6) return rows.join(', ');
  return `${rows.slice(0, 5).join(', ')} and ${rows.length - 5} more`;
}

/** Header names: blank ones become "Column C", repeated ones get " (2)", " (3)". */
function headerNames(layout: SheetLayout, grid: SheetGrid, findings: Finding[], hasData: (c: number) => boolean): (string | null)[] {
  const seen = new Map<string, number>();
  return layout.headerTexts.map((text, j) => {
    const letter = columnLetter(j + 1);
    let name = text;
    if (name === '') {
      if (!hasData(j)) return null;
      name = `Column ${letter}`;
      findings.push({
        code: 'blank-header', severity: 'warning', file: grid.file, sheet: grid.sheet, row: layout.headerEnd, column: letter,
        message: `Column ${letter} holds data but has no header; it is called "${name}" for now.`,
        fix: 'Type a header for this column in the sheet, or map it by its letter.',
      });
    }
    const n = (seen.get(name) ?? 0) + 1;
    seen.set(name, n);
    if (n > 1) {
      const renamed = `${name} (${n})`;
      findings.push({
        code: 'duplicate-header', severity: 'warning', file: grid.file, sheet: grid.sheet, row: layout.headerEnd, column: letter, columnName: name,
        message: `The header "${name}" appears more than once; this one is called "${renamed}".`,
        fix: 'Give every column its own header, or check that the repeated column is not a copy.',
      });
      name = renamed;
    }
    return name;
  });
}

function layoutFindings(grid: SheetGrid, layout: SheetLayout, findings: Finding[]): void {
  const base = { file: grid.file, sheet: grid.sheet };
  if (grid.hidden) {
    findings.push({ ...base, code: 'hidden-sheet', severity: 'warning', message: `Sheet "${grid.sheet}" is hidden in the workbook but was read.`, fix: 'Make sure a hidden sheet is meant to be part of the data; leave it out otherwise.' });
  }
  if (layout.notesAbove.length) {
    findings.push({ ...base, code: 'rows-above-header', severity: 'info', row: layout.notesAbove[0], message: `Row(s) ${rowList(layout.notesAbove)} above the header (row ${layout.headerRow}) were read as titles or notes, not data.`, fix: 'Nothing to do if these are titles; if the header is elsewhere, choose the header row by hand.' });
  }
  if (layout.filledFromMerge.length) {
    findings.push({ ...base, code: 'merged-header', severity: 'info', row: layout.headerRow, column: columnLetter(layout.filledFromMerge[0]), message: `Merged header cells were filled across to column(s) ${layout.filledFromMerge.map(columnLetter).join(', ')}.`, fix: 'Check the column names; unmerge the header cells and name each column to be sure.' });
  }
  if (layout.blankRows.length) {
    findings.push({ ...base, code: 'blank-row', severity: 'info', row: layout.blankRows[0], message: `Blank row(s) ${rowList(layout.blankRows)} inside the data were skipped.`, fix: 'Nothing to do unless rows were meant to be there; delete empty rows to silence this.' });
  }
  const notes = layout.trailerRows.filter((r) => !layout.totalRows.includes(r));
  if (notes.length) {
    findings.push({ ...base, code: 'trailer-note', severity: 'info', row: notes[0], message: `Row(s) ${rowList(notes)} below the data hold a single note each and were not read as data.`, fix: 'Nothing to do if these are notes; if a row is data, fill in its other cells.' });
  }
  if (layout.totalRows.length) {
    findings.push({ ...base, code: 'total-row', severity: 'warning', row: layout.totalRows[0], message: `Row(s) ${rowList(layout.totalRows)} look like totals and were left out so that counts are not doubled.`, fix: 'Remove total rows from the data sheet, or keep them below a blank row.' });
  }
}

function dateQuestions(table: { columns: readonly ImportedColumn[] }, sheet: string, options: TableOptions, findings: Finding[], file: string): ImportQuestion[] {
  const questions: ImportQuestion[] = [];
  for (const col of table.columns) {
    // A cheap look at the first texts first, so that number columns cost nothing.
    let probe = 0;
    let dateish = 0;
    for (let i = 0; i < col.texts.length && probe < 20; i++) {
      if (col.kinds[i] !== CellKind.text) continue;
      probe++;
      if (looksLikeTextDate(col.texts[i])) dateish++;
    }
    if (probe === 0 || dateish * 2 < probe) continue;
    const reading = readDateColumn(col.texts);
    if (reading.dateLike * 2 < reading.nonBlank) continue;
    const letter = col.letters.find((l) => l !== '') ?? '';
    if (reading.order === 'ambiguous' && !options.dateOrder) {
      questions.push({
        code: 'ambiguous-date-order', sheet, column: letter, columnName: col.name, examples: reading.examples, options: ['dmy', 'mdy'],
        message: `The dates in column ${letter} ("${col.name}") can be read day-first or month-first (for example ${reading.examples.map((e) => `"${e}"`).join(', ')}). Say which: day/month/year or month/day/year.`,
      });
    }
    if (reading.order === 'mixed') {
      findings.push({
        code: 'mixed-date-order', severity: 'error', file, sheet, column: letter, columnName: col.name,
        message: `Column ${letter} ("${col.name}") mixes day-first dates (like "${reading.conflict!.dayFirst}") and month-first dates (like "${reading.conflict!.monthFirst}").`,
        fix: 'Retype the dates in one style, best as year-month-day (2019-05-03).',
      });
    }
  }
  return questions;
}

/**
 * The table of one sheet, or of several sheets stacked by header name (the
 * same header in every sheet makes one column).
 */
export function tableFromGrids(grids: readonly SheetGrid[], source: SourceInfo, options: TableOptions = {}): ImportedTable {
  if (grids.length === 0) throw new ImportError('no-sheets', 'There is no sheet to read.');
  const file = grids[0].file;
  const findings: Finding[] = [];
  const names: string[] = [];
  const letters = new Map<string, string[]>();
  const layouts: SheetLayout[] = [];
  const sheetNames: (string | null)[][] = [];
  const where = (g: SheetGrid) => (g.sheet ? `${file}: sheet "${g.sheet}"` : file);
  grids.forEach((grid, s) => {
    const layout = detectLayout(grid);
    if (!layout) {
      const empty = grid.nrows === 0 || grid.columns.every((c) => c.kinds.every((k) => k === CellKind.blank));
      throw new ImportError(
        empty ? 'no-data' : 'no-header',
        empty
          ? `${where(grid)} is empty${grid.sheet ? '' : ' (it holds only blank rows)'}. Choose the ${grid.sheet ? 'sheet' : 'file'} that holds the counts${grids.length > 1 ? ', or leave this one out of the stack' : ''}.`
          : `${where(grid)} has no row that looks like a header (a row of column names above the data). Add one row of column names above the data.`,
        { file, sheet: grid.sheet || undefined },
      );
    }
    layoutFindings(grid, layout, findings);
    const hasData = (j: number) => layout.dataRows.some((r) => grid.columns[j].kinds[r - 1] !== CellKind.blank);
    const sheetHeader = headerNames(layout, grid, findings, hasData);
    sheetHeader.forEach((name, j) => {
      if (name === null) return;
      if (!letters.has(name)) {
        names.push(name);
        letters.set(name, new Array(grids.length).fill(''));
      }
      letters.get(name)![s] = columnLetter(j + 1);
    });
    layouts.push(layout);
    sheetNames.push(sheetHeader);
  });
  const nrows = layouts.reduce((n, l) => n + l.dataRows.length, 0);
  if (nrows === 0) {
    const g = grids[0];
    throw new ImportError('no-data', `${where(g)} has a header in row ${layouts[0].headerRow} but no data rows below it. ${g.sheet ? 'Choose the sheet that holds the counts, or add the data.' : 'Add the data rows, or choose the file that holds the counts.'}`, { file, sheet: g.sheet || undefined, row: layouts[0].headerRow });
  }
  const rowNumbers = new Int32Array(nrows);
  const sheetIndex = new Uint16Array(nrows);
  let at = 0;
  layouts.forEach((l, s) => {
    for (const r of l.dataRows) {
      rowNumbers[at] = r;
      sheetIndex[at++] = s;
    }
  });
  const columns: ImportedColumn[] = names.map((name) => {
    const texts = new Array<string>(nrows);
    const kinds = new Uint8Array(nrows);
    const numbers = new Float64Array(nrows).fill(Number.NaN);
    let i = 0;
    grids.forEach((grid, s) => {
      const j = sheetNames[s].indexOf(name);
      const src = j >= 0 ? grid.columns[j] : undefined;
      for (const r of layouts[s].dataRows) {
        if (src) {
          texts[i] = src.texts[r - 1];
          kinds[i] = src.kinds[r - 1];
          numbers[i] = src.numbers[r - 1];
        } else texts[i] = '';
        i++;
      }
    });
    return { name, letters: letters.get(name)!, texts, kinds, numbers };
  });
  if (grids.length > 1) {
    for (const name of names) {
      const missing = grids.filter((_, s) => letters.get(name)![s] === '').map((g) => `"${g.sheet}"`);
      if (missing.length) {
        findings.push({ code: 'stack-column-missing', severity: 'warning', file, columnName: name, message: `Column "${name}" is missing from sheet(s) ${missing.join(', ')}; those rows have it blank.`, fix: 'Use the same headers in every sheet you stack, or read the sheets one at a time.' });
      }
    }
  }
  const questions = dateQuestions({ columns }, grids[0].sheet, options, findings, file);
  const notes = grids.flatMap((g, s) => [
    ...layouts[s].notesAbove.map((row) => ({ sheet: g.sheet, row, text: rowText(g, row), where: 'above' as const })),
    ...layouts[s].trailerRows.map((row) => ({ sheet: g.sheet, row, text: rowText(g, row), where: 'below' as const })),
  ]);
  return {
    file, sheets: grids.map((g) => g.sheet), headerRows: layouts.map((l) => l.headerRow),
    columns, nrows, rowNumbers, sheetIndex, notes, findings, questions, source,
  };
}

function rowText(grid: SheetGrid, row: number): string {
  return grid.columns.map((c) => c.texts[row - 1]?.trim() ?? '').filter((t) => t !== '').join(' | ');
}
