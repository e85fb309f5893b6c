/**
 * The record the cleaning log works on: one row of the import after mapping
 * and field-code rules, identified by a stable id.
 *
 * A minimal generic shape, kept here until the import defines its own record
 * type; the log only needs an id, named field values and an exclusion reason.
 */
export type FieldValue = string | number | null;

export interface CleaningRecord {
  /** Stable id (for example `file#sheet#row`); never changes between sessions. */
  readonly id: string;
  readonly fields: Readonly<Record<string, FieldValue>>;
  /** Set when the record is left out of the analysis: the reason given. */
  readonly excluded?: string;
}
