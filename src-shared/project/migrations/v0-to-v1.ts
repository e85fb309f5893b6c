import { z } from 'zod';
import { parseNumber } from '../../data/table';
import type { EditEntry } from '../../cleaning/edit-entry';
import { countStatuses, type FieldCodeRule } from '../../import/field-codes';
import type { Migration } from '../migrations';
import { gridFromRows, type GridCell } from '../sheet-grid';

/**
 * Version 0: the early shape, before the format had `formatVersion`
 * (it said `version: 0`). Sheets were plain arrays of row arrays of text,
 * edits had no ids and only set values or excluded rows, specs had no
 * names, one seed served every purpose.
 *
 * To version 1: sheets become compact grids (types inferred from the text:
 * blank, number or text), edits get ids `e1`... and the log's cursor sits
 * after the last one, specs are named "Model 1"... with the chosen index as
 * a flag, codes become field-code rules (one exact text each), and the
 * single seed becomes the `bootstrap` seed.
 */
const v0Schema = z.object({
  version: z.literal(0),
  name: z.string().min(1),
  created: z.iso.datetime({ offset: true }),
  files: z.array(
    z.object({
      fileName: z.string().min(1),
      bytes: z.number().int().min(0),
      sha256: z.string(),
      imported: z.iso.datetime({ offset: true }),
      sheets: z.record(z.string(), z.array(z.array(z.string()))),
    }),
  ),
  mapping: z.json().nullable().optional(),
  codes: z.array(z.object({ code: z.string().min(1), means: z.string() })).default([]),
  edits: z
    .array(
      z.discriminatedUnion('type', [
        z.object({ type: z.literal('set'), record: z.string(), field: z.string(), from: z.string().nullable(), to: z.string().nullable(), at: z.iso.datetime({ offset: true }), who: z.string().optional() }),
        z.object({ type: z.literal('exclude'), record: z.string(), why: z.string().min(1), at: z.iso.datetime({ offset: true }), who: z.string().optional() }),
      ]),
    )
    .default([]),
  aggregate: z.enum(['sum', 'max']).optional(),
  specs: z.array(z.unknown()).default([]),
  chosenSpec: z.number().int().min(0).nullable().optional(),
  outputDir: z.string().nullable().optional(),
  seed: z.number().int().optional(),
});

function inferCell(text: string): GridCell {
  if (text.trim() === '') return { text, type: 'blank' };
  return { text, type: Number.isNaN(parseNumber(text)) ? 'text' : 'number' };
}

/** A version-0 code ("NS" means not-surveyed) as a field-code rule; an unknown meaning becomes `invalid`, with a note. */
function fieldCodeRule(c: { code: string; means: string }, i: number): FieldCodeRule {
  const known = (countStatuses as readonly string[]).includes(c.means);
  return {
    id: `code-${i + 1}`,
    status: known ? (c.means as FieldCodeRule['status']) : 'invalid',
    texts: [c.code],
    ...(known ? {} : { note: `Read as invalid: the older project said "${c.means}".` }),
  };
}

function upgrade(input: unknown): unknown {
  const v0 = v0Schema.parse(input);
  const entries: EditEntry[] = v0.edits.map((e, i) => {
    const base = { id: `e${i + 1}`, time: e.at, ...(e.who ? { author: e.who } : {}) };
    return e.type === 'set'
      ? { ...base, kind: 'set-value', recordId: e.record, field: e.field, old: e.from, new: e.to }
      : { ...base, kind: 'exclude', recordIds: [e.record], reason: e.why };
  });
  return {
    formatVersion: 1,
    programme: { name: v0.name },
    createdAt: v0.created,
    modifiedAt: v0.created,
    sources: v0.files.map((f, i) => ({
      id: `s${i + 1}`,
      fileName: f.fileName,
      size: f.bytes,
      sha256: f.sha256.toLowerCase(),
      importedAt: f.imported,
      sheets: Object.entries(f.sheets).map(([name, rows]) => gridFromRows(name, rows.map((r) => r.map(inferCell)))),
    })),
    mapping: v0.mapping ?? null,
    fieldCodeRules: v0.codes.map(fieldCodeRule),
    cleaning: { entries, cursor: entries.length, nextSeq: entries.length + 1 },
    aggregation: v0.aggregate ? { groupBy: ['site', 'season'], count: v0.aggregate, effort: 'sum', minVisits: 1 } : null,
    models: v0.specs.map((spec, i) => ({ id: `m${i + 1}`, name: `Model ${i + 1}`, chosen: v0.chosenSpec === i, spec })),
    fitCache: [],
    report: { outputFolder: v0.outputDir ?? null, species: [] },
    seeds: v0.seed === undefined ? {} : { bootstrap: v0.seed },
  };
}

export const v0ToV1: Migration = {
  from: 0,
  to: 1,
  summary: 'compact sheet grids, numbered edits, named models, seeds by purpose',
  upgrade,
};
