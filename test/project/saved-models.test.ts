import { describe, expect, it } from 'vitest';
import { parseModelSpec } from '@shared/model/spec';
import type { ProjectModel } from '@shared/project/schema';
import { modelId, type FittedModel } from '../../src-renderer/src/views/models/fitted-model';
import { choicesFromDocument, onlyFitsDiffer, savedModels, waitingFromDocument, withDocIds } from '../../src-renderer/src/views/models/saved-models';

// How the Models stage's state becomes doc.models / doc.fitCache and back
// (hand-made specs; no fitting: the results are never stored).
const poisson = parseModelSpec({ response: 'count', distribution: 'poisson' });
const nb = parseModelSpec({ response: 'count', distribution: 'negbin' });
const docModels: ProjectModel[] = [
  { id: 'm1', name: 'Poisson', species: 'Teal', spec: poisson, chosen: false, dropBadOffsetRows: true },
  { id: 'm3', name: 'Negative binomial', species: 'Teal', spec: nb, chosen: true, dropBadOffsetRows: false },
];
const fitCache = [{ modelId: 'm3', key: 'k1', computedAt: '2026-01-01T00:00:00.000Z' }];

function fitted(species: string, spec: typeof nb, label: string, key: string): FittedModel {
  return { id: modelId(species, spec), species, spec, label, table: { nrows: 0, columns: [] }, outcome: {} as FittedModel['outcome'], dataKey: key, fittedAt: Date.UTC(2026, 1, 1), dropBadOffsetRows: false };
}

describe('models kept in the project', () => {
  it('reads saved models back as waiting, with their fit keys and the choice per species', () => {
    const waiting = waitingFromDocument(docModels, fitCache);
    expect(waiting.map((w) => [w.docId, w.species, w.fittedKey, w.dropBadOffsetRows])).toEqual([
      ['m1', 'Teal', null, true],
      ['m3', 'Teal', 'k1', false],
    ]);
    expect(choicesFromDocument(docModels)).toEqual({ Teal: modelId('Teal', nb) });
  });

  it('writes waiting and fitted models back unchanged, a new model under the next free id', () => {
    const waiting = waitingFromDocument(docModels, fitCache);
    const ids = Object.fromEntries(waiting.map((w) => [w.id, w.docId]));
    const choices = choicesFromDocument(docModels);
    expect(savedModels([], waiting, choices, ids)).toEqual({ models: docModels, fitCache });
    const coot = fitted('Coot', nb, 'Negative binomial', 'k2');
    const all = { ...ids, ...withDocIds([coot.id], ids) };
    expect(all[coot.id]).toBe('m4');
    const out = savedModels([coot], waiting, choices, all);
    expect(out.models.map((m) => [m.id, m.species, m.chosen])).toEqual([
      ['m1', 'Teal', false],
      ['m3', 'Teal', true],
      ['m4', 'Coot', false],
    ]);
    expect(out.fitCache).toEqual([...fitCache, { modelId: 'm4', key: 'k2', computedAt: '2026-02-01T00:00:00.000Z' }]);
  });

  it('a refit of the same data, or a first fit, is quiet; a new choice or another data key is not', () => {
    const waiting = waitingFromDocument(docModels, fitCache);
    const ids = Object.fromEntries(waiting.map((w) => [w.id, w.docId]));
    const choices = choicesFromDocument(docModels);
    const before = { models: docModels, fitCache };
    const refit = [fitted('Teal', poisson, 'Poisson', 'k1'), fitted('Teal', nb, 'Negative binomial', 'k1')].map((f, i) => ({ ...f, label: docModels[i].name, dropBadOffsetRows: docModels[i].dropBadOffsetRows }));
    expect(onlyFitsDiffer(savedModels(refit, [], choices, ids), before)).toBe(true);
    expect(onlyFitsDiffer(savedModels(refit, [], { Teal: refit[0].id }, ids), before)).toBe(false);
    const otherData = refit.map((f) => ({ ...f, dataKey: 'k9' }));
    expect(onlyFitsDiffer(savedModels(otherData, [], choices, ids), before)).toBe(false);
  });
});
