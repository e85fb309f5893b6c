/** The Records stage's flags: the chip words for each finding code, and when a finding counts as dealt with. Shared by the screen and the cleaned-data export. */
import type { CleaningRecord } from './record';
import type { RecordFinding } from '../host/contract';

/** Short chip wording for each finding code, in our own words. */
export const flagLabels: Record<string, string> = {
  'count-not-surveyed': 'not surveyed',
  'count-present-only': 'heard, no count',
  'count-lower-bound': 'lower bound',
  'count-approximate': 'estimate',
  'count-unreadable': 'not a count',
  'count-as-text': 'typed as text',
  'effort-missing': 'no effort',
  'date-as-text': 'date as text',
  'date-unreadable': 'no readable date',
  'repeated-visit': 'repeated row',
  'name-variant': 'name variant',
  'negative-count': 'negative count',
  'non-integer-count': 'not a whole number',
  'count-not-finite': 'not a count',
  'huge-count': 'very large count',
  'effort-zero': 'zero effort',
  'effort-negative': 'negative effort',
  'effort-implausible': 'unusual effort',
  'area-missing': 'no area',
  'site-missing': 'no site',
  'single-visit-site': 'one visit only',
  'date-outside-season': 'outside the season',
  'formula-error': 'formula error',
};

export function flagLabel(code: string): string {
  return flagLabels[code] ?? code;
}

/**
 * A finding is dealt with for a record once the record is left out, or the
 * field the finding is about differs from the import (edited, merged,
 * converted). Whole-visit findings are dealt with only by leaving out.
 */
export function settledFor(f: RecordFinding, cleaned: CleaningRecord, raw: CleaningRecord | undefined): boolean {
  if (cleaned.excluded !== undefined) return true;
  if (!f.field || !raw) return false;
  return cleaned.fields[f.field] !== raw.fields[f.field];
}

/** Dealt with for every record it names. */
export function findingSettled(f: RecordFinding, cleanedById: ReadonlyMap<string, CleaningRecord>, rawById: ReadonlyMap<string, CleaningRecord>): boolean {
  return f.recordIds.every((id) => {
    const c = cleanedById.get(id);
    return c ? settledFor(f, c, rawById.get(id)) : true;
  });
}
