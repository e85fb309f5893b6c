import type { FieldValue } from '@shared/cleaning/record';
import { parseNumber } from '@shared/data/table';
import { parseTextDate } from '@shared/import/text-dates';
import { covariateOfField } from '@shared/import/visit-covariates';

/**
 * Reads what the analyst typed into a grid cell as the field's value, or says
 * plainly why it cannot be used and what to type instead.
 */
export type EditReading = { ok: true; value: FieldValue } | { ok: false; message: string };

/**
 * A visit covariate (field `cov:<name>`): blank is allowed (the visit has no
 * value); a number column takes numbers only ("12,5" read as 12.5, as the
 * import reads a decimal comma), a text column any text.
 */
function readCovariate(name: string, text: string, numeric: boolean): EditReading {
  if (text === '') return { ok: true, value: null };
  const n = Number.isNaN(parseNumber(text)) ? parseNumber(text, ',') : parseNumber(text);
  if (Number.isFinite(n)) return { ok: true, value: numeric ? n : text };
  if (numeric) return { ok: false, message: `"${text}" is not a number, and "${name}" holds numbers. Type a number (12.5 or 12,5), or clear the cell if the visit has no value.` };
  return { ok: true, value: text };
}

export function readEdit(field: string, typed: unknown, covariates: readonly { field: string; name: string; numeric: boolean }[] = []): EditReading {
  const text = typed === null || typed === undefined ? '' : String(typed).trim();
  const covariate = covariateOfField(field);
  if (covariate !== null) return readCovariate(covariate, text, covariates.find((c) => c.field === field)?.numeric ?? false);
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
