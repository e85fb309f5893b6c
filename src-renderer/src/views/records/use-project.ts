import { useCallback, useEffect, useRef, useState } from 'react';
import type { EditDraft, EditLog } from '@shared/cleaning/edit-entry';
import { revertEntry } from '@shared/cleaning/edit-log';
import { appendGroup, redoGroup, undoGroup } from './edit-groups';
import { createProjectDocument } from '@shared/project/document';
import type { ColumnRoles, LoadedSource, OpenedProject, RecoveryOffer, WireDocument } from '@shared/host/contract';
import { call } from '../../host';
import { onlyFitsDiffer, type SavedModels } from '../models/saved-models';
import { useImportJob } from './use-import-job';

/**
 * The open project in the page: its document (sources by identity, the
 * cleaning log ...), the records of its sources, where it is saved and
 * whether it has unsaved changes. All file work goes through host calls.
 */
export interface OpenProject {
  document: WireDocument;
  path: string | null;
  name: string;
  dirty: boolean;
  sources: LoadedSource[];
  /** Raised each time a project is opened or started (not by saving or importing into it): the Models stage restores the project's models then. */
  openId: number;
}

export interface DateQuestion {
  path: string;
  message: string;
  examples: string[];
  roles?: ColumnRoles;
}

/** The headers did not tell which column is which: the analyst chooses. */
export interface RolesQuestion {
  path: string;
  message: string;
  headers: string[];
}

export interface Problem {
  title: string;
  message: string;
}

const PROJECT_EXT = ['tallywise'];
const WORKBOOK_EXT = ['xlsx', 'xlsm', 'csv', 'txt'];
const AUTOSAVE_PAUSE_MS = 800;

let opens = 0;

function fromOpened(o: OpenedProject): OpenProject {
  return { document: o.document, path: o.path, name: o.name, dirty: false, sources: o.sources, openId: ++opens };
}

/** Before something replaces the open project: true when there is nothing unsaved, or the analyst agrees to drop it. */
function mayReplace(p: OpenProject | null): boolean {
  if (!p?.dirty) return true;
  return window.confirm(`"${p.name}" has changes that are not saved. Open the other project anyway and drop them?`);
}

function fileNameOf(path: string): string {
  return path.replace(/^.*[\\/]/, '');
}

export function useProject() {
  const [project, setProject] = useState<OpenProject | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  const [problem, setProblem] = useState<Problem | null>(null);
  const [question, setQuestion] = useState<DateQuestion | null>(null);
  const [rolesQuestion, setRolesQuestion] = useState<RolesQuestion | null>(null);
  const [offer, setOffer] = useState<RecoveryOffer | null>(null);
  const current = useRef<OpenProject | null>(null);
  current.current = project;
  const autosaveTimer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  const importJob = useImportJob();

  const run = useCallback(async <T,>(label: string, title: string, work: () => Promise<T>): Promise<T | undefined> => {
    setBusy(label);
    setProblem(null);
    try {
      return await work();
    } catch (err) {
      setProblem({ title, message: err instanceof Error ? err.message : String(err) });
      return undefined;
    } finally {
      setBusy(null);
    }
  }, []);

  const scheduleAutosave = useCallback((p: OpenProject) => {
    clearTimeout(autosaveTimer.current);
    autosaveTimer.current = setTimeout(() => {
      call('project:autosave', { path: p.path, document: p.document }).catch(() => undefined);
    }, AUTOSAVE_PAUSE_MS);
  }, []);

  const changeLog = useCallback(
    (change: (log: EditLog) => EditLog) => {
      const p = current.current;
      if (!p) return;
      let log: EditLog;
      try {
        log = change(p.document.cleaning);
      } catch (err) {
        setProblem({ title: 'That change could not be made.', message: err instanceof Error ? err.message : String(err) });
        return;
      }
      if (log === p.document.cleaning) return;
      const next = { ...p, dirty: true, document: { ...p.document, cleaning: log } };
      current.current = next;
      setProject(next);
      scheduleAutosave(next);
    },
    [scheduleAutosave],
  );

  /**
   * The Models stage's models and choices changed: into the document, marked
   * unsaved; a fit that only adds fit times or first keys for the same
   * models goes in quietly (nothing the analyst decided has changed).
   */
  const setModels = useCallback(
    (saved: SavedModels) => {
      const p = current.current;
      if (!p) return;
      const quiet = onlyFitsDiffer(saved, { models: p.document.models, fitCache: p.document.fitCache });
      const next = { ...p, dirty: p.dirty || !quiet, document: { ...p.document, models: saved.models, fitCache: saved.fitCache } };
      current.current = next;
      setProject(next);
      if (!quiet) scheduleAutosave(next);
    },
    [scheduleAutosave],
  );

  const edit = useCallback((...drafts: EditDraft[]) => changeLog((log) => (drafts.length ? appendGroup(log, drafts) : log)), [changeLog]);

  /** The Report stage's settings (output folder, species) kept in the project; a change marks it unsaved. */
  const changeReport = useCallback(
    (report: { outputFolder: string | null; species: readonly string[] }) => {
      const p = current.current;
      if (!p || (p.document.report.outputFolder === report.outputFolder && p.document.report.species.join('\u0000') === report.species.join('\u0000'))) return;
      const next = { ...p, dirty: true, document: { ...p.document, report: { outputFolder: report.outputFolder, species: [...report.species] } } };
      current.current = next;
      setProject(next);
      scheduleAutosave(next);
    },
    [scheduleAutosave],
  );
  /** A report was made: its entry goes at the end of the project's report history, which marks the project unsaved. */
  const addReportEntry = useCallback(
    (entry: WireDocument['reportHistory'][number]) => {
      const p = current.current;
      if (!p) return;
      const next = { ...p, dirty: true, document: { ...p.document, reportHistory: [...p.document.reportHistory, entry] } };
      current.current = next;
      setProject(next);
      scheduleAutosave(next);
    },
    [scheduleAutosave],
  );
  /** The project's link to its site list (doc.sites), or none; a change marks the project unsaved. */
  const setSites = useCallback(
    (sites: WireDocument['sites']) => {
      const p = current.current;
      if (!p || JSON.stringify(p.document.sites) === JSON.stringify(sites)) return;
      const next = { ...p, dirty: true, document: { ...p.document, sites } };
      current.current = next;
      setProject(next);
      scheduleAutosave(next);
    },
    [scheduleAutosave],
  );
  const undo = useCallback(() => changeLog(undoGroup), [changeLog]);
  const redo = useCallback(() => changeLog(redoGroup), [changeLog]);
  const revert = useCallback((id: string) => changeLog((log) => revertEntry(log, id)), [changeLog]);

  const checkRecovery = useCallback(async (path: string | null) => {
    const { offer: found } = await call('project:check-recovery', { path });
    setOffer(found);
  }, []);

  /** The demo programme, raw as its workbooks come in, or (recorded) with the cleaning and models recorded for it. */
  const openDemo = useCallback(async (recorded = false) => {
    if (!mayReplace(current.current)) return;
    const opened = await run('Writing and reading the demo workbooks…', 'The demo project could not be made.', () => call('project:new-from-demo', recorded ? { recorded } : {}));
    if (opened) setProject(fromOpened(opened));
  }, [run]);

  const importPath = useCallback(
    async (path: string, dateOrder?: 'dmy' | 'mdy', roles?: ColumnRoles) => {
      // With progress and a cancel; a cancelled import gives null and a note, and changes nothing.
      const into = current.current?.openId ?? null;
      const reading = await run(`Reading ${fileNameOf(path)}…`, `${fileNameOf(path)} could not be imported.`, () => importJob.read(fileNameOf(path), { path, dateOrder, roles }));
      if (!reading) return;
      if (!reading.source) {
        if (reading.rolesNeeded) {
          setRolesQuestion({ path, message: reading.rolesNeeded, headers: reading.headers });
          return;
        }
        const q = reading.questions[0];
        setQuestion({ path, message: q?.message ?? 'Say how the dates are written.', examples: q?.examples ?? [], roles });
        return;
      }
      const source = reading.source;
      const p = current.current;
      if ((p?.openId ?? null) !== into) {
        setProblem({ title: `${source.summary.fileName} was not added.`, message: 'Another project was opened while it was being read. Import it again to add it to this project.' });
        return;
      }
      if (p?.sources.some((s) => s.summary.id === source.summary.id)) {
        setProblem({ title: `${source.summary.fileName} is already in the project.`, message: 'The same file (same content) was imported before; its records are in the grid.' });
        return;
      }
      const { summary } = source;
      const ref = { id: summary.id, fileName: summary.fileName, size: summary.size, sha256: summary.sha256, importedAt: summary.importedAt };
      const base: OpenProject = p ?? { document: createProjectDocument(summary.fileName.replace(/\.[^.]+$/, '')), path: null, name: 'Untitled project', dirty: false, sources: [], openId: ++opens };
      const next: OpenProject = { ...base, dirty: true, sources: [...base.sources, source], document: { ...base.document, sources: [...base.document.sources, ref] } };
      current.current = next;
      setProject(next);
      scheduleAutosave(next);
    },
    [run, scheduleAutosave, importJob.read],
  );

  const answerQuestion = useCallback(
    (order: 'dmy' | 'mdy' | null) => {
      const q = question;
      setQuestion(null);
      if (q && order) void importPath(q.path, order, q.roles);
    },
    [question, importPath],
  );

  const answerRoles = useCallback(
    (roles: ColumnRoles | null) => {
      const q = rolesQuestion;
      setRolesQuestion(null);
      if (q && roles) void importPath(q.path, undefined, roles);
    },
    [rolesQuestion, importPath],
  );

  const importWorkbook = useCallback(async () => {
    const { path } = await call('dialog:choose-open', { title: 'Import a season workbook', extensions: WORKBOOK_EXT });
    if (path) await importPath(path);
  }, [importPath]);

  const openPath = useCallback(
    async (path: string, fromRecovery = false) => {
      const opened = await run(`Opening ${fileNameOf(path)}…`, `${fileNameOf(path)} could not be opened.`, () => call('project:open', { path, fromRecovery }));
      if (!opened) return;
      const p = fromOpened(opened);
      // Restored work is not in the project file yet.
      if (fromRecovery) p.dirty = true;
      current.current = p;
      setProject(p);
      setOffer(null);
      if (!fromRecovery) await checkRecovery(opened.path).catch(() => undefined);
    },
    [run, checkRecovery],
  );

  const openProject = useCallback(async () => {
    if (!mayReplace(current.current)) return;
    const { path } = await call('dialog:choose-open', { title: 'Open a project', extensions: PROJECT_EXT });
    if (path) await openPath(path);
  }, [openPath]);

  const saveTo = useCallback(
    async (path: string) => {
      const p = current.current;
      if (!p) return;
      // No autosave may land while saving: it would leave a recovery file newer than the saved project.
      clearTimeout(autosaveTimer.current);
      const saved = await run('Saving…', 'The project could not be saved.', () => call('project:save', { path, document: p.document }));
      if (!saved) {
        if (current.current?.dirty) scheduleAutosave(current.current);
        return;
      }
      const latest = current.current ?? p;
      const next = { ...latest, path: saved.path, name: saved.name, dirty: latest.document !== p.document };
      current.current = next;
      setProject(next);
      if (next.dirty) scheduleAutosave(next);
    },
    [run, scheduleAutosave],
  );

  const saveAs = useCallback(async () => {
    const p = current.current;
    if (!p) return;
    const { path } = await call('dialog:choose-save', { title: 'Save the project', defaultName: `${p.path ? p.name : p.document.programme.name}.tallywise`, extensions: PROJECT_EXT });
    if (path) await saveTo(path);
  }, [saveTo]);

  const save = useCallback(async () => {
    const p = current.current;
    if (!p) return;
    if (p.path) await saveTo(p.path);
    else await saveAs();
  }, [saveTo, saveAs]);

  const restoreRecovery = useCallback(async () => {
    if (offer && mayReplace(current.current)) await openPath(offer.recoveryPath, true);
  }, [offer, openPath]);

  const discardRecovery = useCallback(async () => {
    setOffer(null);
    await call('project:discard-recovery', { path: offer?.projectPath ?? null }).catch(() => undefined);
  }, [offer]);

  // Closing the window with unsaved changes asks first (the desktop shell shows the question; see window.ts).
  const dirty = !!project?.dirty;
  useEffect(() => {
    if (!dirty) return;
    const ask = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      e.returnValue = '';
    };
    window.addEventListener('beforeunload', ask);
    return () => window.removeEventListener('beforeunload', ask);
  }, [dirty]);

  useEffect(() => {
    checkRecovery(null).catch(() => undefined);
    return () => clearTimeout(autosaveTimer.current);
  }, [checkRecovery]);

  return {
    project, busy, problem, question, rolesQuestion, offer, importJob,
    dismissProblem: () => setProblem(null),
    showProblem: setProblem,
    edit, undo, redo, revert, setModels, changeReport, addReportEntry, setSites,
    openDemo, importWorkbook, importPath, answerQuestion, answerRoles, openProject, save, saveAs, restoreRecovery, discardRecovery,
  };
}

export type ProjectControls = ReturnType<typeof useProject>;
