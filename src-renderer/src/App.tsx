import { useEffect, useRef, useState, type DragEvent } from 'react';
import type { AppInfo, HostCommand, ProgrammeOverview } from '@shared/host/contract';
import { call, onHostCommand } from './host';
import { ProgrammeView } from './views/ProgrammeView';
import { RecordsView } from './views/records/RecordsView';
import { DateOrderDialog } from './views/records/DateOrderDialog';
import { RolesDialog } from './views/records/RolesDialog';
import { ImportProgress } from './views/records/ImportProgress';
import { useProject } from './views/records/use-project';
import { ModelsView } from './views/models/ModelsView';
import { useModels, useRefitOnOpen } from './views/models/use-models';
import { BackgroundFitStatus } from './views/models/SavedModelsPanel';
import { ReportView } from './views/report/ReportView';
import { useReportRun } from './views/report/use-report-run';
import { onRecordLink } from './views/models/diagnostics/record-link';
import { StageRail, type Stage } from './components/StageRail';
import { Cautions } from './components/Cautions';
import { RecoveryBanner } from './components/RecoveryBanner';
import { pathOfDroppedFile } from './components/dropped-file';

function isTextField(el: Element | null): boolean {
  return !!el && (el.tagName === 'INPUT' || el.tagName === 'TEXTAREA' || (el as HTMLElement).isContentEditable);
}

type Load = { state: 'loading' } | { state: 'ready'; overview: ProgrammeOverview } | { state: 'failed'; message: string };

export function App() {
  const [info, setInfo] = useState<AppInfo | null>(null);
  const [load, setLoad] = useState<Load>({ state: 'loading' });
  const [stage, setStage] = useState<Stage>('programme');
  const [dropping, setDropping] = useState(false);
  const controls = useProject();
  const models = useModels(controls.setModels);
  // Saved models are fitted again when a project opens, whatever stage is shown.
  useRefitOnOpen(controls.project, models);
  const reportRun = useReportRun(controls.addReportEntry);
  const { project } = controls;
  const latest = useRef(controls);
  latest.current = controls;

  const openOverview = () => {
    setLoad({ state: 'loading' });
    call('demo:overview', {})
      .then((overview) => setLoad({ state: 'ready', overview }))
      .catch((err: Error) => setLoad({ state: 'failed', message: err.message }));
  };

  useEffect(() => {
    call('app:info', {}).then(setInfo).catch(() => setInfo(null));
    openOverview();
    const actions: Record<HostCommand, () => void> = {
      'open-demo': () => {
        openOverview();
        void latest.current.openDemo();
      },
      'open-project': () => void latest.current.openProject(),
      'save-project': () => void latest.current.save(),
      'save-project-as': () => void latest.current.saveAs(),
      'import-workbook': () => void latest.current.importWorkbook(),
      // From the Edit menu: in a text field the field's own undo, elsewhere the cleaning log's.
      'undo-change': () => (isTextField(document.activeElement) ? document.execCommand('undo') : latest.current.undo()),
      'redo-change': () => (isTextField(document.activeElement) ? document.execCommand('redo') : latest.current.redo()),
    };
    return onHostCommand((command) => actions[command]?.());
  }, []);

  // A chart point on the Models stage links to its records: show them on the Records stage.
  useEffect(() => onRecordLink(() => setStage('records')), []);

  // A newly opened or imported project is shown on the Records stage (saving it, which changes its path, is neither).
  const opened = project ? `${project.openId}|${project.document.createdAt}|${project.sources.length}` : '';
  const resetReport = reportRun.reset;
  useEffect(() => {
    if (opened) setStage('records');
    resetReport();
  }, [opened, resetReport]);

  // Each project opened (not saved or imported into) brings back its saved models, waiting to be fitted again.
  const restoreModels = models.restore;
  const openId = project?.openId ?? 0;
  useEffect(() => {
    restoreModels(latest.current.project?.document ?? null);
  }, [openId, restoreModels]);

  const programmeTitle = load.state === 'ready' ? load.overview.programme : 'Tallywise';
  const title = project ? project.name : programmeTitle;
  useEffect(() => {
    document.title = `${title}${project?.dirty ? ' (unsaved)' : ''} — Tallywise`;
  }, [title, project?.dirty]);

  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDropping(false);
    const file = e.dataTransfer.files[0];
    if (!file) return;
    const path = pathOfDroppedFile(file);
    if (path) void controls.importPath(path);
    else controls.showProblem({ title: `"${file.name}" cannot be read from a drop here.`, message: 'Use Import a season workbook… (or the File menu) to choose it instead.' });
  };

  return (
    <div
      className={dropping ? 'shell is-dropping' : 'shell'}
      onDragOver={(e) => {
        if (e.dataTransfer.types.includes('Files')) {
          e.preventDefault();
          setDropping(true);
        }
      }}
      onDragLeave={() => setDropping(false)}
      onDrop={onDrop}
    >
      <button type="button" className="skip-link" onClick={() => document.getElementById('workspace')?.focus()}>
        Skip to the stage
      </button>
      <header className="topbar">
        <span className="brand" aria-label="Tallywise">
          <span className="brand-mark" aria-hidden="true">
            ▮▮▮▮<span className="brand-slash">╱</span>
          </span>
          Tallywise
        </span>
        <span className="topbar-title">
          <span data-testid="programme-title">{title}</span>
          {project?.dirty && (
            <span className="unsaved" data-testid="unsaved-mark" title="There are changes not yet saved to the project file">
              ● not saved
            </span>
          )}
        </span>
        {project && (
          <button type="button" className="button is-dark" onClick={() => void controls.save()} disabled={!!controls.busy}>
            Save
          </button>
        )}
        <span className="topbar-version">{info ? `v${info.version}` : ''}</span>
      </header>
      <StageRail current={stage} onChoose={setStage} />
      {/* The stage itself is not a live region: only its status lines (role status) and problems (role alert) are announced. */}
      <main id="workspace" tabIndex={-1} className={stage === 'records' ? 'workspace is-records' : 'workspace'}>
        {controls.offer && <RecoveryBanner offer={controls.offer} onRestore={() => void controls.restoreRecovery()} onDiscard={() => void controls.discardRecovery()} />}
        {controls.problem && (
          <div className="problem" role="alert" data-testid="problem">
            <strong>{controls.problem.title}</strong> {controls.problem.message}{' '}
            <button type="button" className="button is-quiet is-small" onClick={controls.dismissProblem}>
              Dismiss
            </button>
          </div>
        )}
        {models.running && stage !== 'models' && <BackgroundFitStatus running={models.running} onCancel={models.cancel} />}
        <ImportProgress job={controls.importJob.job} note={controls.importJob.note} onCancel={controls.importJob.cancel} onDismiss={controls.importJob.dismissNote} />
        {controls.busy && !controls.importJob.job && (
          <p className="status busy" role="status">
            {controls.busy}
          </p>
        )}
        {stage === 'programme' && (
          <>
            {load.state === 'loading' && (
              <p className="status" role="status">
                Reading the programme…
              </p>
            )}
            {load.state === 'failed' && (
              <div className="problem" role="alert">
                <strong>The programme could not be opened.</strong> {load.message}
              </div>
            )}
            {load.state === 'ready' && <ProgrammeView overview={load.overview} />}
            <Cautions />
          </>
        )}
        {stage === 'records' && <RecordsView controls={controls} />}
        {stage === 'models' && <ModelsView controls={controls} models={models} overview={load.state === 'ready' ? load.overview : null} />}
        {stage === 'report' && <ReportView controls={controls} models={models} run={reportRun} version={info?.version ?? ''} onSettings={controls.changeReport} />}
      </main>
      {controls.question && <DateOrderDialog question={controls.question} onAnswer={controls.answerQuestion} />}
      {controls.rolesQuestion && <RolesDialog question={controls.rolesQuestion} onDone={controls.answerRoles} />}
      {dropping && (
        <div className="drop-hint" aria-hidden="true">
          Drop a season workbook to import it
        </div>
      )}
    </div>
  );
}
