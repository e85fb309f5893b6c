import { z } from 'zod';

/**
 * One entry of the cleaning audit log. The cleaned table is the raw import
 * with the log's entries replayed in order; nothing in the import is changed.
 *
 * Every entry is reversible: undo moves the log's cursor back over it, and a
 * `revert` entry cancels one earlier entry while keeping both in the history
 * (see edit-log.ts).
 */
const fieldValue = z.union([z.string(), z.number(), z.null()]);

const entryBase = {
  /** Unique within the log (`e1`, `e2` ...). */
  id: z.string().min(1),
  /** When the edit was made, ISO 8601. */
  time: z.iso.datetime({ offset: true }),
  author: z.string().optional(),
  reason: z.string().optional(),
};

/** One cell of one record set to a new value; `old` is the value the analyst saw. */
export const setValueEntrySchema = z.object({
  ...entryBase,
  kind: z.literal('set-value'),
  recordId: z.string().min(1),
  field: z.string().min(1),
  old: fieldValue,
  new: fieldValue,
});

/** Records left out of the analysis; `reason` is required here. */
export const excludeEntrySchema = z.object({
  ...entryBase,
  kind: z.literal('exclude'),
  recordIds: z.array(z.string().min(1)).min(1),
  reason: z.string().min(1, 'say why the records are excluded'),
});

/** Records taken back into the analysis. */
export const includeEntrySchema = z.object({
  ...entryBase,
  kind: z.literal('include'),
  recordIds: z.array(z.string().min(1)).min(1),
});

/** Every record whose `field` reads exactly `from` gets `into` (a site or species name variant). */
export const mergeNameEntrySchema = z.object({
  ...entryBase,
  kind: z.literal('merge-name'),
  field: z.string().min(1),
  from: z.string(),
  into: z.string(),
});

/** A numeric field of the listed records multiplied by `factor` (minutes to hours: 1/60). */
export const convertUnitEntrySchema = z.object({
  ...entryBase,
  kind: z.literal('convert-unit'),
  field: z.string().min(1),
  recordIds: z.array(z.string().min(1)).min(1),
  factor: z.number().positive().refine(Number.isFinite, 'the factor must be a finite number'),
  fromUnit: z.string().optional(),
  toUnit: z.string().optional(),
});

/** Cancels the entry `target` (an earlier entry; reverting a revert restores its target). */
export const revertEntrySchema = z.object({
  ...entryBase,
  kind: z.literal('revert'),
  target: z.string().min(1),
});

export const editEntrySchema = z.discriminatedUnion('kind', [
  setValueEntrySchema,
  excludeEntrySchema,
  includeEntrySchema,
  mergeNameEntrySchema,
  convertUnitEntrySchema,
  revertEntrySchema,
]);

export type EditEntry = z.infer<typeof editEntrySchema>;
export type EditKind = EditEntry['kind'];
export const editKinds: readonly EditKind[] = ['set-value', 'exclude', 'include', 'merge-name', 'convert-unit', 'revert'];

/** An entry as the caller describes it; the log gives it its id and time. */
export type EditDraft = EditEntry extends infer E ? (E extends EditEntry ? Omit<E, 'id' | 'time'> & { time?: string } : never) : never;

/**
 * The log as stored: all entries ever kept, and the cursor. Entries before
 * `cursor` are in effect; those from `cursor` on were undone and can be
 * redone until a new edit is made. `nextSeq` numbers the next entry's id so
 * ids are never reused.
 */
export const editLogSchema = z
  .object({
    entries: z.array(editEntrySchema),
    cursor: z.number().int().min(0),
    nextSeq: z.number().int().min(1),
  })
  .refine((log) => log.cursor <= log.entries.length, { message: 'the cursor is past the last entry', path: ['cursor'] })
  .refine((log) => new Set(log.entries.map((e) => e.id)).size === log.entries.length, {
    message: 'two entries have the same id',
    path: ['entries'],
  });

export type EditLog = z.infer<typeof editLogSchema>;
