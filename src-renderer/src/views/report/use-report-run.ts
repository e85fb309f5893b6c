import { useCallback, useRef, useState } from 'react';
import type { ProgrammePlan, ProgrammeProgress } from '@shared/report/programme-report';
import { call } from '../../host';
import { programmeReportInWorker } from '../../worker/report-client';

/**
 * A report run, kept by the App so that it goes on while the analyst visits
 * other stages: every species' trend and the composite in the report
 * worker, then the three files written by the host. Cancelling stops the
 * worker before anything is written; the screen goes back to what it was.
 */
export interface WrittenReport {
  readonly pdf: string;
  readonly html: string;
  readonly xlsx: string;
  readonly species: readonly string[];
  readonly madeAt: string;
}

export type ReportPhase =
  | { readonly kind: 'idle' }
  | { readonly kind: 'running'; readonly species: readonly string[]; readonly progress: ProgrammeProgress | null }
  | { readonly kind: 'writing'; readonly species: readonly string[] };

export interface ReportNote {
  readonly kind: 'info' | 'problem';
  readonly text: string;
}

const isCancel = (err: unknown) => err instanceof Error && err.name === 'FitCancelled';

export function useReportRun() {
  const [phase, setPhase] = useState<ReportPhase>({ kind: 'idle' });
  const [written, setWritten] = useState<WrittenReport | null>(null);
  const [note, setNote] = useState<ReportNote | null>(null);
  const abort = useRef<AbortController | null>(null);

  const make = useCallback(async (plan: ProgrammePlan, folder: string, stem: string) => {
    if (abort.current) return;
    const controller = new AbortController();
    abort.current = controller;
    const species = plan.groups.map((g) => g.label ?? g.group);
    setNote(null);
    setPhase({ kind: 'running', species, progress: null });
    try {
      const document = await programmeReportInWorker(plan, { signal: controller.signal, onProgress: (progress) => setPhase((p) => (p.kind === 'running' ? { ...p, progress } : p)) });
      if (controller.signal.aborted) throw Object.assign(new Error('cancelled'), { name: 'FitCancelled' });
      setPhase({ kind: 'writing', species });
      const paths = await call('report:write', { document, folder, stem });
      setWritten({ ...paths, species, madeAt: document.createdAt });
      setNote({ kind: 'info', text: `The report of ${species.length === 1 ? species[0] : `${species.length} species`} was written to ${folder}.` });
    } catch (err) {
      if (isCancel(err)) setNote({ kind: 'info', text: 'The report was cancelled before any file was written; nothing in the folder changed.' });
      else setNote({ kind: 'problem', text: `The report could not be made: ${err instanceof Error ? err.message : String(err)}` });
    } finally {
      abort.current = null;
      setPhase({ kind: 'idle' });
    }
  }, []);

  const cancel = useCallback(() => abort.current?.abort(), []);

  /** Another project was opened: forget the last report (a running one is cancelled). */
  const reset = useCallback(() => {
    abort.current?.abort();
    setWritten(null);
    setNote(null);
  }, []);

  return { phase, written, note, dismissNote: () => setNote(null), make, cancel, reset };
}

export type ReportRunControls = ReturnType<typeof useReportRun>;
