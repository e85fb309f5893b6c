import { useCallback, useRef, useState } from 'react';
import type { ProgrammePlan, ProgrammeProgress } from '@shared/report/programme-report';
import type { ReportHistoryEntry } from '@shared/project/report-history';
import { historyEntry } from '@shared/report/history-record';
import type { Verdict } from '@shared/report/since-last';
import { call } from '../../host';
import { programmeReportInWorker } from '../../worker/report-client';

/**
 * A report run, kept by the App so that it goes on while the analyst visits
 * other stages: every species' trend and the composite in the report
 * worker, then the three files written by the host. Cancelling stops the
 * worker before anything is written; the screen goes back to what it was.
 * A report written is handed to `onRecorded` as an entry of the project's
 * report history (its numbers and the files' SHA-256), which marks the
 * project unsaved, and the note says whether it reproduced the last report.
 */
export interface WrittenReport {
  readonly pdf: string;
  readonly html: string;
  readonly xlsx: string;
  readonly species: readonly string[];
  readonly madeAt: string;
  /** How the report compares with the last one in the project's history; null when there was none. */
  readonly verdict: Verdict | null;
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

/** What the note says of the last report, by how this one compares with it. */
export function verdictSentence(verdict: Verdict | null, differences: number): string {
  switch (verdict) {
    case null:
      return '';
    case 'exact':
      return ' Nothing changed since the last report, and it was reproduced exactly.';
    case 'rounding':
      return ' Nothing changed since the last report, and it was reproduced but for the last digits of some numbers.';
    case 'differs':
      return ` Nothing changed since the last report, yet ${differences === 1 ? 'one number differs' : `${differences} numbers differ`}: it was not reproduced (see "Since the last report" in the report).`;
    case 'models-changed':
      return ' The records are the same as for the last report but some models or species changed; "Since the last report" in the report says what.';
    case 'data-changed':
      return ' The records changed since the last report; "Since the last report" in the report shows how the numbers moved.';
  }
}

export function useReportRun(onRecorded: (entry: ReportHistoryEntry) => void = () => {}) {
  const [phase, setPhase] = useState<ReportPhase>({ kind: 'idle' });
  const [written, setWritten] = useState<WrittenReport | null>(null);
  const [note, setNote] = useState<ReportNote | null>(null);
  const abort = useRef<AbortController | null>(null);
  const recorded = useRef(onRecorded);
  recorded.current = onRecorded;

  const make = useCallback(async (plan: ProgrammePlan, folder: string, stem: string) => {
    if (abort.current) return;
    const controller = new AbortController();
    abort.current = controller;
    const species = plan.groups.map((g) => g.label ?? g.group);
    setNote(null);
    setPhase({ kind: 'running', species, progress: null });
    try {
      const { document, record, sinceLast } = await programmeReportInWorker(plan, { signal: controller.signal, onProgress: (progress) => setPhase((p) => (p.kind === 'running' ? { ...p, progress } : p)) });
      if (controller.signal.aborted) throw Object.assign(new Error('cancelled'), { name: 'FitCancelled' });
      setPhase({ kind: 'writing', species });
      // The main process gives each file's SHA-256 from the bytes it wrote.
      const { files, ...paths } = await call('report:write', { document, folder, stem });
      // Another project opened meanwhile (reset): the entry belongs to the one that was closed, so it is not added.
      if (!controller.signal.aborted) recorded.current(historyEntry(record, files));
      const verdict = sinceLast?.verdict ?? null;
      setWritten({ ...paths, species, madeAt: document.createdAt, verdict });
      setNote({
        kind: verdict === 'differs' ? 'problem' : 'info',
        text: `The report of ${species.length === 1 ? species[0] : `${species.length} species`} was written to ${folder} and added to the project's report history (save the project to keep it).${verdictSentence(verdict, sinceLast?.differences.length ?? 0)}`,
      });
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
