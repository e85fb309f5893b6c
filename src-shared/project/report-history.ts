import { z } from 'zod';
import { modelSpecSchema } from '../model/spec';

/**
 * The report history kept in a project: one compact entry per report made,
 * oldest first. An entry holds what identifies the run (when, the Tallywise
 * version, the files written with their SHA-256, the data key of the cleaned
 * records, each species' model) and the numbers readers saw (trend a season
 * and the indices with their limits, theta and AIC, the composite's indices),
 * never any record. The next report compares itself with the last entry
 * ("Since the last report"), and `tallywise report --verify` checks that an
 * unchanged project gives the same numbers.
 *
 * Numbers are stored as computed (not rounded); a number without a finite
 * value (an open limit) is stored as null.
 */
const isoTime = z.iso.datetime({ offset: true });
const value = z.number().nullable();

export const historyIndexSchema = z.object({
  season: z.union([z.number(), z.string()]),
  index: value,
  lower: value,
  upper: value,
});
export type HistoryIndex = z.infer<typeof historyIndexSchema>;

export const historyTrendSchema = z.object({
  /** Change a season as a fraction (exp(b) - 1), with its 95% limits. */
  perSeason: value,
  lower: value,
  upper: value,
});

export const historySpeciesSchema = z.object({
  /** The value of the species column. */
  species: z.string(),
  /** The name printed in the report, when it is not the species value. */
  label: z.string().optional(),
  model: z.object({ name: z.string(), spec: modelSpecSchema, dropBadOffsetRows: z.boolean() }),
  /** Null when the trend could not be fitted (then `error` says why). */
  result: z
    .object({
      converged: z.boolean(),
      rows: z.number().int(),
      theta: value,
      aic: value,
      base: z.union([z.number(), z.string()]),
      trend: historyTrendSchema,
      indices: z.array(historyIndexSchema),
    })
    .nullable(),
  error: z.string().nullable(),
});
export type HistorySpecies = z.infer<typeof historySpeciesSchema>;

export const historyCompositeSchema = z.object({
  replicates: z.number().int(),
  seed: z.number().int(),
  indices: z.array(historyIndexSchema),
});
export type HistoryComposite = z.infer<typeof historyCompositeSchema>;

export const reportHistoryEntrySchema = z.object({
  madeAt: isoTime,
  software: z.object({ name: z.string(), version: z.string() }),
  /** The files written (no folder) with the SHA-256 of their bytes. */
  files: z.array(z.object({ name: z.string().min(1), sha256: z.string().regex(/^[0-9a-f]{64}$/, 'a SHA-256 of 64 lower-case hex digits') })),
  /** The data key of the cleaned records (src-shared/analysis/data-key.ts); null when not known. */
  dataKey: z.string().nullable(),
  species: z.array(historySpeciesSchema),
  composite: historyCompositeSchema.nullable(),
});
export type ReportHistoryEntry = z.infer<typeof reportHistoryEntrySchema>;

/** An entry before its files are written: what the report run itself knows. */
export type ReportRecord = Omit<ReportHistoryEntry, 'files'>;

export const reportHistorySchema = z.array(reportHistoryEntrySchema);
