import { describe, expect, it } from 'vitest';
import { cellAt, gridFromRows, gridRows, sheetGridSchema } from '@shared/project/sheet-grid';

describe('sheet grid', () => {
  const grid = gridFromRows('Counts', [
    [{ text: 'site', type: 'text' }, { text: 'n', type: 'text' }, { text: 'date', type: 'text' }],
    [{ text: 'A', type: 'text' }, { text: '3', type: 'number' }],
    [{ text: 'B', type: 'text' }, { text: '#N/A', type: 'error' }, { text: '2025-04-01', type: 'date' }],
  ]);

  it('stores row-major texts and one type letter per cell, padding short rows', () => {
    expect(grid).toMatchObject({ rows: 3, columns: 3, types: 'sss' + 'sn_' + 'sed' });
    expect(grid.texts).toEqual(['site', 'n', 'date', 'A', '3', '', 'B', '#N/A', '2025-04-01']);
    expect(sheetGridSchema.safeParse(grid).success).toBe(true);
  });

  it('gives cells back by row and column, blank outside the sheet', () => {
    expect(cellAt(grid, 2, 2)).toEqual({ text: '2025-04-01', type: 'date' });
    expect(cellAt(grid, 1, 2)).toEqual({ text: '', type: 'blank' });
    expect(cellAt(grid, 9, 0)).toEqual({ text: '', type: 'blank' });
    expect(gridRows(grid)[1].map((c) => c.type)).toEqual(['text', 'number', 'blank']);
  });

  it('the schema refuses a grid whose sizes do not agree', () => {
    expect(sheetGridSchema.safeParse({ ...grid, rows: 4 }).success).toBe(false);
    expect(sheetGridSchema.safeParse({ ...grid, types: grid.types.replace('e', 'x') }).success).toBe(false);
  });
});
