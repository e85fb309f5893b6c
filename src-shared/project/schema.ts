import { z } from 'zod';
import { modelSpecSchema } from '../model/spec';
import { editLogSchema } from '../cleaning/edit-entry';
import { fieldCodeRuleSchema } from '../import/field-codes';
import { importedSourceSchema } from './imported-source';
import { siteSheetLinkSchema } from './site-sheet-link';
import { reportHistorySchema } from './report-history';

/**
 * The project document: everything a project file holds. Results are not
 * stored; they are recomputed from these inputs (the fit cache only keeps
 * keys so the app can tell whether a stored result is still current).
 *
 * `formatVersion` is an integer raised by one for every change of shape;
 * migrations.ts turns each older version into the next.
 */
export const CURRENT_FORMAT_VERSION = 3;

const isoTime = z.iso.datetime({ offset: true });

/** How visit records are combined into one analysis unit (one row per group). */
export const aggregationRuleSchema = z.object({
  /** Fields that make one unit, e.g. site and season. */
  groupBy: z.array(z.string().min(1)).min(1),
  /** How the counts of a unit's visits combine. */
  count: z.enum(['sum', 'mean', 'max']),
  /** How the visits' effort combines (`none`: effort is not carried). */
  effort: z.enum(['sum', 'mean', 'none']),
  /** Units with fewer visits than this are left out. */
  minVisits: z.number().int().min(1).default(1),
});

/** A model the analyst fitted to one species: its spec and whether the report uses it. */
export const projectModelSchema = z.object({
  id: z.string().min(1),
  name: z.string().min(1),
  /** The value of the analysis table's species column the model was fitted to ('' when not known, after converting a version-1 file). */
  species: z.string(),
  spec: modelSpecSchema,
  /** The model the report uses for its species (at most one per species). */
  chosen: z.boolean(),
  /** Rows whose effort or area offset cannot be logged (blank, zero) were left out of the fit. */
  dropBadOffsetRows: z.boolean().default(false),
});
export type ProjectModel = z.infer<typeof projectModelSchema>;

/** A fitted result known to match its inputs: the key is a hash of the data and spec it was fitted to. */
export const fitCacheEntrySchema = z.object({
  modelId: z.string().min(1),
  key: z.string().min(1),
  computedAt: isoTime,
});

export const reportSettingsSchema = z.object({
  outputFolder: z.string().nullable(),
  /** Species the report covers, in the order given. */
  species: z.array(z.string()),
});

function uniqueIds(xs: readonly { id: string }[]): boolean {
  return new Set(xs.map((x) => x.id)).size === xs.length;
}

/** The species with more than one model chosen for the report. */
export function speciesChosenTwice(models: readonly { species: string; chosen: boolean }[]): string[] {
  const seen = new Set<string>();
  const twice = new Set<string>();
  for (const m of models) {
    if (!m.chosen) continue;
    if (seen.has(m.species)) twice.add(m.species);
    seen.add(m.species);
  }
  return [...twice];
}

const projectModelsSchema = z
  .array(projectModelSchema)
  .refine(uniqueIds, 'two models have the same id')
  .superRefine((models, ctx) => {
    for (const sp of speciesChosenTwice(models)) {
      ctx.addIssue({ code: 'custom', message: `more than one model of "${sp || '(species not said)'}" is chosen for the report; keep "chosen": true on one of them` });
    }
  });

export const projectDocumentSchema = z.object({
  formatVersion: z.literal(CURRENT_FORMAT_VERSION),
  programme: z.object({ name: z.string().min(1, 'the programme needs a name') }),
  createdAt: isoTime,
  modifiedAt: isoTime,
  sources: z.array(importedSourceSchema).refine(uniqueIds, 'two sources have the same id'),
  /** Column mapping, as the import writes it (checked by the import's own schema). */
  mapping: z.json().nullable(),
  /** What count-cell texts mean ("NS" = not surveyed, ">50" = at least 50), in the import's own rule shape. */
  fieldCodeRules: z.array(fieldCodeRuleSchema),
  cleaning: editLogSchema,
  aggregation: aggregationRuleSchema.nullable(),
  /** Where the sites' area and other attributes come from: a sheet of an imported source, or null. */
  sites: siteSheetLinkSchema.nullable(),
  models: projectModelsSchema,
  fitCache: z.array(fitCacheEntrySchema),
  report: reportSettingsSchema,
  /** The reports made from the project, oldest first (report-history.ts): what was written and the numbers it gave. */
  reportHistory: reportHistorySchema,
  /** Random seeds by purpose (bootstrap, simulation ...), so reruns give the same numbers. */
  seeds: z.record(z.string(), z.number().int()),
});

export type ProjectDocument = z.infer<typeof projectDocumentSchema>;
export type ProjectDocumentInput = z.input<typeof projectDocumentSchema>;
