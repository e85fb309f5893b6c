import type { FieldValue } from '@shared/cleaning/record';
import { parseNumber } from '@shared/data/table';
import { parseTextDate } from '@shared/import/text-dates';

/**
 * Reads what the analyst typed into a grid cell as the field's value, or says
 * plainly why it cannot be used and what to type instead.
 */
export type EditReading = { ok: true; value: FieldValue } | { ok: false; message: string };

export function readEdit(field: string, typed: unknown): EditReading {
  const text = typed === null || typed === undefined ? '' : String(typed).trim();
  switch (field) {
    case 'count': {
      if (text === '') return { ok: true, value: null };
      const n = parseNumber(text);
      if (!Number.isInteger(n) || n < 0) return { ok: false, message: `"${text}" is not a count. Type a whole number of 0 or more, or clear the cell to mark the count missing.` };
      return { ok: true, value: n };
    }
    case 'effort': {
      if (text === '') return { ok: true, value: null };
      const n = parseNumber(text);
      if (!Number.isFinite(n) || n <= 0) return { ok: false, message: `"${text}" is not an effort. Type a number above 0 (in the unit the column header names), or clear the cell.` };
      return { ok: true, value: n };
    }
    case 'date': {
      if (text === '') return { ok: true, value: null };
      const iso = /^\d{4}-\d{1,2}-\d{1,2}$/.test(text) || /[A-Za-z]/.test(text) ? parseTextDate(text, 'dmy') : null;
      if (!iso) return { ok: false, message: `"${text}" is not read as a date here. Type it as year-month-day, e.g. 2019-05-03, or as 3 May 2019.` };
      return { ok: true, value: iso };
    }
    default:
      if (text === '') return { ok: false, message: `The ${field} cannot be blank. Type a name, or leave the record out instead.` };
      return { ok: true, value: String(typed) };
  }
}
