import { useRef, useState, type ReactNode } from 'react';
import { call } from '../../../host';
import { cleanedExportInWorker } from '../../../worker/export-client';
import { useSiteSheet } from '../../models/site-attributes';
import type { OpenProject } from '../use-project';

/**
 * The Records stage's "Export cleaned data…" action: asks for a file (.xlsx
 * for every table, .csv for the analysis table), builds the export tables in
 * the export worker from what the stage shows (the project's sources with
 * its change log, unsaved changes included; the same cleanedAnalysisOf the
 * Models stage uses), with a progress line and a way to cancel, and has the
 * host write them; then says what was written, with a way to show the file
 * in its folder.
 */
type Phase = { kind: 'idle' } | { kind: 'busy'; stage: string } | { kind: 'written'; path: string; text: string } | { kind: 'problem'; text: string } | { kind: 'note'; text: string };

const fmt = new Intl.NumberFormat('en-GB');

function defaultName(project: OpenProject): string {
  const stem = (project.path ? project.name : project.document.programme.name).replace(/\.tallywise$/i, '').replace(/[/\\:*?"<>|]+/g, ' ').trim() || 'project';
  return `${stem} cleaned data.xlsx`;
}

const isCancel = (err: unknown) => err instanceof Error && err.name === 'FitCancelled';

export function useCleanedExport(project: OpenProject | null): { button: ReactNode; banner: ReactNode } {
  const site = useSiteSheet(project);
  const [phase, setPhase] = useState<Phase>({ kind: 'idle' });
  const abort = useRef<AbortController | null>(null);

  const run = async () => {
    if (!project || abort.current) return;
    const controller = new AbortController();
    abort.current = controller;
    setPhase({ kind: 'busy', stage: 'choosing the file' });
    try {
      const chosen = await call('dialog:choose-save', { title: 'Export the cleaned data', defaultName: defaultName(project), extensions: ['xlsx', 'csv'] });
      if (!chosen.path) return setPhase({ kind: 'idle' });
      const path = /\.(xlsx|csv)$/i.test(chosen.path) ? chosen.path : `${chosen.path}.xlsx`;
      const info = await call('app:info', {});
      // The project file's SHA-256 only when the export holds exactly what it saved.
      const projectFile = project.path && !project.dirty ? await call('file:fingerprint', { path: project.path }) : null;
      const request = {
        sources: project.sources,
        log: project.document.cleaning,
        siteSheet: site.sheet,
        origin: {
          programme: project.document.programme.name,
          project: { name: project.name, saved: !!project.path && !project.dirty },
          projectFile,
          software: { name: info.name, version: info.version },
          createdAt: new Date().toISOString(),
        },
      };
      const document = await cleanedExportInWorker(request, { signal: controller.signal, onProgress: (_f, stage) => setPhase({ kind: 'busy', stage }) });
      if (controller.signal.aborted) throw Object.assign(new Error('cancelled'), { name: 'FitCancelled' });
      setPhase({ kind: 'busy', stage: 'writing the file' });
      const w = await call('export:write', { document, path });
      const { records, kept, analysisRows } = document.counts;
      const what = w.format === 'xlsx' ? `${w.sheets.length} tables (${w.sheets.join(', ')})` : `the ${w.sheets[0].toLowerCase()}`;
      const counts = `${fmt.format(records)} records, ${fmt.format(kept)} kept; ${fmt.format(analysisRows)} analysis rows`;
      const unsaved = project.path && !project.dirty ? '' : ' The project has changes not yet saved; the export holds them, and its About sheet says so.';
      setPhase({ kind: 'written', path: w.path, text: `Exported ${what}: ${counts}.${unsaved}` });
    } catch (err) {
      if (isCancel(err)) setPhase({ kind: 'note', text: 'The export was cancelled; no file was written.' });
      else setPhase({ kind: 'problem', text: `The cleaned data could not be exported: ${err instanceof Error ? err.message : String(err)}` });
    } finally {
      abort.current = null;
    }
  };

  const reveal = (path: string) =>
    call('file:reveal', { path })
      .then((r) => (r.ok ? undefined : setPhase({ kind: 'problem', text: `"${path}" could not be shown here; open its folder from the file manager.` })))
      .catch((err: Error) => setPhase({ kind: 'problem', text: err.message }));

  const busy = phase.kind === 'busy';
  const button = (
    <button type="button" className="button" disabled={!project || busy || site.loading} onClick={() => void run()} title="Write the records after cleaning, the analysis table, the change log and where they came from to a workbook (.xlsx), or the analysis table to a CSV file" data-testid="export-cleaned">
      {busy ? 'Exporting…' : 'Export cleaned data…'}
    </button>
  );
  const progress =
    phase.kind === 'busy' && phase.stage !== 'choosing the file' ? (
      <div className="banner" role="status" data-testid="export-progress">
        <span>Exporting the cleaned data: {phase.stage} …</span>
        <span className="banner-actions">
          <button type="button" className="button is-small" onClick={() => abort.current?.abort()} disabled={phase.stage === 'writing the file'}>
            Cancel
          </button>
        </span>
      </div>
    ) : null;
  const dismiss = (
    <button type="button" className="button is-quiet is-small" onClick={() => setPhase({ kind: 'idle' })}>
      Dismiss
    </button>
  );
  const banner =
    phase.kind === 'written' ? (
      <div className="banner" role="status" data-testid="export-written">
        <span>
          {phase.text} <code>{phase.path}</code>
        </span>
        <span className="banner-actions">
          <button type="button" className="button is-small" onClick={() => void reveal(phase.path)}>
            Show in folder
          </button>
          {dismiss}
        </span>
      </div>
    ) : phase.kind === 'note' ? (
      <div className="banner" role="status" data-testid="export-note">
        <span>{phase.text}</span>
        <span className="banner-actions">{dismiss}</span>
      </div>
    ) : phase.kind === 'problem' ? (
      <div className="problem" role="alert" data-testid="export-problem">
        {phase.text} {dismiss}
      </div>
    ) : progress;
  return { button, banner };
}
