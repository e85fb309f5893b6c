import type { ProjectModel } from '@shared/project/schema';
import type { ProjectDocument } from '@shared/project/document';
import type { ModelSpec } from '@shared/model/spec';
import { canonicalJson } from '@shared/analysis/canonical-json';
import { modelId, type FittedModel } from './fitted-model';

/**
 * The Models stage's models as the project file keeps them (doc.models and
 * doc.fitCache): specs, the choice per species and the offset-row choice,
 * never the results. A saved model read back is "waiting" until it is
 * fitted again; its fit-cache key tells whether the data are still those it
 * was fitted to.
 */
export type FitCacheEntry = ProjectDocument['fitCache'][number];

export interface WaitingModel {
  /** The session's model id (species + spec), as FittedModel.id. */
  readonly id: string;
  readonly docId: string;
  readonly name: string;
  readonly species: string;
  readonly spec: ModelSpec;
  readonly dropBadOffsetRows: boolean;
  /** Data key the model was last fitted to; null when the file does not say. */
  readonly fittedKey: string | null;
  readonly computedAt: string | null;
}

export interface SavedModels {
  readonly models: ProjectModel[];
  readonly fitCache: FitCacheEntry[];
}

export function waitingFromDocument(models: readonly ProjectModel[], fitCache: readonly FitCacheEntry[]): WaitingModel[] {
  return models.map((m) => {
    const cached = fitCache.find((c) => c.modelId === m.id);
    return { id: modelId(m.species, m.spec), docId: m.id, name: m.name, species: m.species, spec: m.spec, dropBadOffsetRows: m.dropBadOffsetRows, fittedKey: cached?.key ?? null, computedAt: cached?.computedAt ?? null };
  });
}

/** The model chosen for the report per species, by session id. */
export function choicesFromDocument(models: readonly ProjectModel[]): Record<string, string> {
  return Object.fromEntries(models.filter((m) => m.chosen).map((m) => [m.species, modelId(m.species, m.spec)]));
}

const idNumber = (id: string) => (/^m(\d+)$/.exec(id) ? Number(/^m(\d+)$/.exec(id)![1]) : 0);

/** A document id for every session model: the one it had, or the next free `m<n>`. */
export function withDocIds(ids: readonly string[], known: Readonly<Record<string, string>>): Record<string, string> {
  const out: Record<string, string> = {};
  let next = Math.max(0, ...Object.values(known).map(idNumber)) + 1;
  for (const id of ids) out[id] = known[id] ?? `m${next++}`;
  return out;
}

/** The models for the file: fitted ones first, then those still waiting, in document-id order. */
export function savedModels(fitted: readonly FittedModel[], waiting: readonly WaitingModel[], forReport: Readonly<Record<string, string>>, docIds: Readonly<Record<string, string>>): SavedModels {
  const models: ProjectModel[] = [];
  const fitCache: FitCacheEntry[] = [];
  for (const f of fitted) {
    const id = docIds[f.id];
    models.push({ id, name: f.label, species: f.species, spec: f.spec, chosen: forReport[f.species] === f.id, dropBadOffsetRows: f.dropBadOffsetRows });
    fitCache.push({ modelId: id, key: f.dataKey, computedAt: new Date(f.fittedAt).toISOString() });
  }
  for (const w of waiting) {
    if (fitted.some((f) => f.id === w.id)) continue;
    models.push({ id: w.docId, name: w.name, species: w.species, spec: w.spec, chosen: forReport[w.species] === w.id, dropBadOffsetRows: w.dropBadOffsetRows });
    if (w.fittedKey && w.computedAt) fitCache.push({ modelId: w.docId, key: w.fittedKey, computedAt: w.computedAt });
  }
  const order = (a: { id: string }, b: { id: string }) => idNumber(a.id) - idNumber(b.id) || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
  return { models: models.sort(order), fitCache: fitCache.sort((a, b) => order({ id: a.modelId }, { id: b.modelId })) };
}

/**
 * True when `next` differs from `saved` only in what a fit of unchanged
 * models adds: fit times, and keys for models the file had none for (first
 * fitted in this session). Such a change goes into the document without
 * marking the project unsaved.
 */
export function onlyFitsDiffer(next: SavedModels, saved: SavedModels): boolean {
  if (canonicalJson(next.models) !== canonicalJson(saved.models)) return false;
  const before = new Map(saved.fitCache.map((c) => [c.modelId, c.key]));
  return next.fitCache.every((c) => !before.has(c.modelId) || before.get(c.modelId) === c.key) && saved.fitCache.every((c) => next.fitCache.some((n) => n.modelId === c.modelId));
}
