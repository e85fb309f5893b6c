import { describe, expect, it } from 'vitest';
import { readEdit } from '../../src-renderer/src/views/records/edit-values';
import { describeEntry } from '@shared/cleaning/describe-entry';
import { covariateField } from '@shared/import/visit-covariates';

// What the analyst types into a visit covariate's cell in the Records grid,
// and how the change log names the edit. Invented values.

const temp = { name: 'Water temp (°C)', field: covariateField('Water temp (°C)'), numeric: true };
const wind = { name: 'Wind', field: covariateField('Wind'), numeric: false };

describe('editing a visit covariate', () => {
  it('reads numbers with a decimal point or comma in a number column, and a blank as no value', () => {
    expect(readEdit(temp.field, '12.5', [temp, wind])).toEqual({ ok: true, value: 12.5 });
    expect(readEdit(temp.field, ' 12,5 ', [temp, wind])).toEqual({ ok: true, value: 12.5 });
    expect(readEdit(temp.field, '', [temp, wind])).toEqual({ ok: true, value: null });
  });

  it('refuses text in a number column, naming the column and what to type', () => {
    const r = readEdit(temp.field, 'warm', [temp, wind]);
    expect(r.ok).toBe(false);
    expect(!r.ok && r.message).toBe('"warm" is not a number, and "Water temp (°C)" holds numbers. Type a number (12.5 or 12,5), or clear the cell if the visit has no value.');
  });

  it('keeps text as typed in a text column', () => {
    expect(readEdit(wind.field, 'breezy', [temp, wind])).toEqual({ ok: true, value: 'breezy' });
    expect(readEdit(wind.field, '3', [temp, wind])).toEqual({ ok: true, value: '3' });
  });

  it('is named by the covariate in the change log', () => {
    const text = describeEntry({ id: 'e1', time: '2026-01-01T00:00:00.000Z', kind: 'set-value', recordId: 'r1', field: temp.field, old: null, new: 11.5 });
    expect(text.what).toBe('Set Water temp (°C)');
    expect(text.new).toBe('11.5');
  });
});
