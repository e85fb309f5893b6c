import { useCallback, useEffect, useRef, useState } from 'react';
import type { DataTable } from '@shared/data/table';
import type { ModelSpec } from '@shared/model/spec';
import { fitGroupsInWorkers } from '../../worker/fit-client';
import { modelId, withModels, type FittedModel } from './fitted-model';
import { initialDraft, specLabel, type SpecDraft } from './spec-draft';
import { fitTableFor, rowsOfSpecies } from './fit-table';
import { choicesFromDocument, savedModels, waitingFromDocument, withDocIds, type SavedModels, type WaitingModel } from './saved-models';
import type { OpenProject } from '../records/use-project';
import { useSiteSheet } from './site-attributes';
import { cleanedAnalysis } from './analysis-input';

/**
 * The Models stage's state, kept by the App so that it lives on while the
 * analyst visits other stages (a fit keeps running meanwhile): the builder's
 * draft, the fitted models per species and spec, the fit in progress, and
 * the model chosen for the report per species (only ever set by the analyst).
 *
 * The project keeps the models' specs and choices (saved-models.ts): every
 * change the analyst makes is handed to `onSaved` (the project marks itself
 * changed); `restore` takes them back from an opened project as models
 * waiting to be fitted again, which `fitWaiting` does.
 */
export interface RunningFit {
  readonly label: string;
  readonly species: readonly string[];
  readonly done: number;
  /** Fraction of the species now being fitted. */
  readonly fraction: number;
  readonly current: string;
  readonly stage: string;
}

export interface ModelsNote {
  readonly kind: 'info' | 'problem';
  readonly text: string;
}

function isCancel(err: unknown): boolean {
  return err instanceof Error && err.name === 'FitCancelled';
}

export function useModels(onSaved?: (saved: SavedModels) => void) {
  const [draft, setDraft] = useState<SpecDraft>(initialDraft);
  const [models, setModels] = useState<FittedModel[]>([]);
  const [running, setRunning] = useState<RunningFit | null>(null);
  const [note, setNote] = useState<ModelsNote | null>(null);
  const [forReport, setForReport] = useState<Record<string, string>>({});
  const [shown, setShown] = useState<string | null>(null);
  const [waiting, setWaiting] = useState<WaitingModel[]>([]);
  const [docIds, setDocIds] = useState<Record<string, string>>({});
  const abort = useRef<AbortController | null>(null);
  /** Set by the analyst's actions (not by restoring): the next state is handed to the project. */
  const touched = useRef(false);
  /** Waiting models already fitted again automatically since the project was opened. */
  const tried = useRef(new Set<string>());
  const savedTo = useRef(onSaved);
  savedTo.current = onSaved;

  useEffect(() => {
    if (!touched.current) return;
    touched.current = false;
    savedTo.current?.(savedModels(models, waiting, forReport, docIds));
  }, [models, waiting, forReport, docIds]);

  /** Fits the spec to each species of the full analysis table (rows with unusable offsets left out when asked); true when it did not run to the end (busy, cancelled). */
  const fit = useCallback(async (full: DataTable, spec: ModelSpec, species: readonly string[], key: string, dropBadOffsetRows: boolean): Promise<boolean> => {
    if (abort.current) return true;
    const controller = new AbortController();
    abort.current = controller;
    const label = specLabel(spec);
    setNote(null);
    setRunning({ label, species, done: 0, fraction: 0, current: species[0] ?? '', stage: 'starting' });
    const { table } = fitTableFor(full, spec, species, dropBadOffsetRows);
    try {
      const results = await fitGroupsInWorkers(table, spec, 'species', {
        signal: controller.signal,
        onProgress: (group, fraction, stage) => setRunning((r) => (r ? { ...r, current: group, fraction, stage } : r)),
        onResult: (_r, done) => setRunning((r) => (r ? { ...r, done, fraction: 0 } : r)),
      });
      const fitted: FittedModel[] = [];
      const failed: string[] = [];
      const now = Date.now();
      for (const r of results) {
        if ('outcome' in r) {
          fitted.push({ id: modelId(r.group, spec), species: r.group, spec, label, table: rowsOfSpecies(table, [r.group]), outcome: r.outcome, dataKey: key, fittedAt: now, dropBadOffsetRows });
        } else failed.push(`${r.group}: ${r.error.message}`);
      }
      touched.current = true;
      const fittedIds = new Set(fitted.map((f) => f.id));
      setModels((m) => withModels(m, fitted));
      setWaiting((w) => w.filter((x) => !fittedIds.has(x.id)));
      setDocIds((d) => ({ ...d, ...withDocIds([...fittedIds].filter((id) => !d[id]), d) }));
      if (fitted.length) setShown((s) => (s && fitted.some((f) => f.species === s) ? s : fitted[0].species));
      if (failed.length) setNote({ kind: 'problem', text: `${failed.length === results.length ? 'The fit failed' : `${failed.length} of ${results.length} fits failed`}. ${failed.join(' ')}` });
      else setNote({ kind: 'info', text: `Fitted "${label}" for ${fitted.map((f) => f.species).join(', ')}.` });
      return false;
    } catch (err) {
      if (isCancel(err)) setNote({ kind: 'info', text: 'The fit was cancelled; no result was added and the models fitted before are as they were.' });
      else setNote({ kind: 'problem', text: `The fit could not be run: ${err instanceof Error ? err.message : String(err)}` });
      return isCancel(err);
    } finally {
      abort.current = null;
      setRunning(null);
    }
  }, []);

  const cancel = useCallback(() => abort.current?.abort(), []);

  const remove = useCallback((id: string) => {
    touched.current = true;
    setModels((m) => m.filter((x) => x.id !== id));
    setWaiting((w) => w.filter((x) => x.id !== id));
    setForReport((r) => Object.fromEntries(Object.entries(r).filter(([, v]) => v !== id)));
  }, []);

  const chooseForReport = useCallback((species: string, id: string | null) => {
    touched.current = true;
    setForReport((r) => {
      const next = { ...r };
      if (id) next[species] = id;
      else delete next[species];
      return next;
    });
  }, []);

  /**
   * Another project was opened (a running fit is cancelled): its saved
   * models wait to be fitted again, with their choices; none when it has none.
   */
  const restore = useCallback((saved: { models: SavedModels['models']; fitCache: SavedModels['fitCache'] } | null) => {
    abort.current?.abort();
    touched.current = false;
    tried.current = new Set();
    const list = saved ? waitingFromDocument(saved.models, saved.fitCache) : [];
    setModels([]);
    setWaiting(list);
    setDocIds(Object.fromEntries(list.map((w) => [w.id, w.docId])));
    setForReport(saved ? choicesFromDocument(saved.models) : {});
    setShown(null);
    setNote(null);
  }, []);

  /** Fits the given waiting models again, one spec (with its species) at a time; stops at a cancel. */
  const fitWaiting = useCallback(
    async (full: DataTable, key: string, which: readonly WaitingModel[]) => {
      const groups = new Map<string, { spec: ModelSpec; drop: boolean; species: string[] }>();
      for (const w of which) {
        const k = `${JSON.stringify(w.spec)}|${w.dropBadOffsetRows}`;
        const g = groups.get(k) ?? { spec: w.spec, drop: w.dropBadOffsetRows, species: [] };
        g.species.push(w.species);
        groups.set(k, g);
      }
      for (const g of groups.values()) {
        const cancelled = await fit(full, g.spec, g.species, key, g.drop);
        if (cancelled) break;
      }
    },
    [fit],
  );

  /**
   * After opening a project: the waiting models whose data are unchanged
   * since they were fitted (or that were never fitted) are fitted in the
   * background, once each (with the usual progress and cancel); those fitted
   * to other data wait for "Fit again", so the analyst sees why.
   */
  const autoFit = useCallback(
    (full: DataTable, key: string) => {
      if (abort.current) return;
      const due = waiting.filter((w) => (w.fittedKey === key || w.fittedKey === null) && !tried.current.has(w.id));
      if (!due.length) return;
      for (const w of due) tried.current.add(w.id);
      void fitWaiting(full, key, due);
    },
    [waiting, fitWaiting],
  );

  const reset = useCallback(() => restore(null), [restore]);

  return { draft, setDraft, models, waiting, reset, restore, fitWaiting, autoFit, running, note, dismissNote: () => setNote(null), forReport, chooseForReport, shown, setShown, fit, cancel, remove };
}

export type ModelsControls = ReturnType<typeof useModels>;

/**
 * Called by the App whatever stage is shown: the saved models of an opened
 * project are fitted again in the background as soon as its analysis table
 * is ready (autoFit, once each), so the Report stage finds the chosen models
 * without a visit to the Models stage. The table is only made while some
 * saved model waits.
 */
export function useRefitOnOpen(project: OpenProject | null, models: ModelsControls): void {
  // Only models restored from this project (not those of the project open before, in the moment before restoring).
  const own = !!project && models.waiting.length > 0 && models.waiting.every((w) => project.document.models.some((d) => d.id === w.docId && d.species === w.species));
  const needed = own ? project : null;
  const site = useSiteSheet(needed);
  const input = needed && !site.loading ? cleanedAnalysis(needed.sources, needed.document.cleaning, site.sheet) : null;
  const table = input?.analysis.table;
  const key = input?.dataKey ?? '';
  const { autoFit, running } = models;
  useEffect(() => {
    if (table && key && !running) autoFit(table, key);
  }, [table, key, autoFit, running]);
}
