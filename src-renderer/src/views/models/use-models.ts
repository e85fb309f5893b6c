import { useCallback, useRef, useState } from 'react';
import type { DataTable } from '@shared/data/table';
import type { ModelSpec } from '@shared/model/spec';
import { fitGroupsInWorkers } from '../../worker/fit-client';
import { modelId, withModels, type FittedModel } from './fitted-model';
import { initialDraft, specLabel, type SpecDraft } from './spec-draft';
import { fitTableFor, rowsOfSpecies } from './fit-table';

/**
 * The Models stage's state, kept by the App so that it lives on while the
 * analyst visits other stages (a fit keeps running meanwhile): the builder's
 * draft, the fitted models per species and spec, the fit in progress, and
 * the model chosen for the report per species (only ever set by the analyst).
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

export function useModels() {
  const [draft, setDraft] = useState<SpecDraft>(initialDraft);
  const [models, setModels] = useState<FittedModel[]>([]);
  const [running, setRunning] = useState<RunningFit | null>(null);
  const [note, setNote] = useState<ModelsNote | null>(null);
  const [forReport, setForReport] = useState<Record<string, string>>({});
  const [shown, setShown] = useState<string | null>(null);
  const abort = useRef<AbortController | null>(null);

  /** Fits the spec to each species of the full analysis table (rows with unusable offsets left out when asked). */
  const fit = useCallback(async (full: DataTable, spec: ModelSpec, species: readonly string[], key: string, dropBadOffsetRows: boolean) => {
    if (abort.current) return;
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
      setModels((m) => withModels(m, fitted));
      if (fitted.length) setShown((s) => (s && fitted.some((f) => f.species === s) ? s : fitted[0].species));
      if (failed.length) setNote({ kind: 'problem', text: `${failed.length === results.length ? 'The fit failed' : `${failed.length} of ${results.length} fits failed`}. ${failed.join(' ')}` });
      else setNote({ kind: 'info', text: `Fitted "${label}" for ${fitted.map((f) => f.species).join(', ')}.` });
    } catch (err) {
      if (isCancel(err)) setNote({ kind: 'info', text: 'The fit was cancelled; no result was added and the models fitted before are as they were.' });
      else setNote({ kind: 'problem', text: `The fit could not be run: ${err instanceof Error ? err.message : String(err)}` });
    } finally {
      abort.current = null;
      setRunning(null);
    }
  }, []);

  const cancel = useCallback(() => abort.current?.abort(), []);

  const remove = useCallback((id: string) => {
    setModels((m) => m.filter((x) => x.id !== id));
    setForReport((r) => Object.fromEntries(Object.entries(r).filter(([, v]) => v !== id)));
  }, []);

  const chooseForReport = useCallback((species: string, id: string | null) => {
    setForReport((r) => {
      const next = { ...r };
      if (id) next[species] = id;
      else delete next[species];
      return next;
    });
  }, []);

  /** Another project was opened: its models start from nothing (a running fit is cancelled). */
  const reset = useCallback(() => {
    abort.current?.abort();
    setModels([]);
    setForReport({});
    setShown(null);
    setNote(null);
  }, []);

  return { draft, setDraft, models, reset, running, note, dismissNote: () => setNote(null), forReport, chooseForReport, shown, setShown, fit, cancel, remove };
}

export type ModelsControls = ReturnType<typeof useModels>;
