import { useEffect, useMemo, useState } from 'react';
import { projectReportPlan, REPORT_SEED_KEY, reportStem, sourceInputs } from '@shared/report/programme-plan';
import { call } from '../../host';
import { Cautions } from '../../components/Cautions';
import type { ProjectControls } from '../records/use-project';
import type { ModelsControls } from '../models/use-models';
import { cleanedAnalysis } from '../models/analysis-input';
import { useSiteSheet } from '../models/site-attributes';
import { fixFor, reportChoices } from './report-choices';
import { ReportProgress } from './ReportProgress';
import { ReportWritten } from './ReportWritten';
import { LastReportLine } from './LastReportLine';
import type { ReportRunControls } from './use-report-run';

/** The report's settings kept in the project: the output folder and the species, in order. */
export interface ReportSettings {
  readonly outputFolder: string | null;
  readonly species: readonly string[];
}

interface Props {
  controls: ProjectControls;
  models: ModelsControls;
  run: ReportRunControls;
  version: string;
  /** Remembers the settings in the project (marks it changed). */
  onSettings: (s: ReportSettings) => void;
}

/** The Report stage: choose species and a folder, make the report, then open it. */
export function ReportView({ controls, models, run, version, onSettings }: Props) {
  const { project } = controls;
  // The same analysis table as the Models stage (one memo for both), so the report refits what was chosen there.
  const site = useSiteSheet(project);
  const input = site.loading ? null : cleanedAnalysis(project?.sources, project?.document.cleaning, site.sheet);
  const analysis = input ? { table: input.analysis.table, dataKey: input.dataKey } : null;
  const saved = project?.document.report;
  const { chosen, candidates, choices } = useMemo(() => (input ? reportChoices(input.analysis.table, models.models, models.forReport, input.dataKey) : { chosen: [], candidates: [], choices: [] }), [input, models.models, models.forReport]);
  const ready = choices.filter((c) => c.model).map((c) => c.species);
  const [picked, setPicked] = useState<readonly string[] | null>(null);
  const wanted = picked ?? (saved?.species.length ? saved.species : ready);
  const species = ready.filter((s) => wanted.includes(s));
  const folder = saved?.outputFolder ?? null;
  const [problem, setProblem] = useState<string | null>(null);
  useEffect(() => setPicked(null), [project?.document.createdAt]);

  if (!project || !analysis) {
    return (
      <section className="records-empty" aria-labelledby="report-heading">
        <h1 id="report-heading">Report</h1>
        <p className="lede">The report is made from the models chosen on the Models stage. Open the demo project or import a season workbook on the Records stage, then fit and choose a model for each species.</p>
      </section>
    );
  }

  const toggle = (s: string) => {
    const next = species.includes(s) ? species.filter((x) => x !== s) : ready.filter((x) => x === s || species.includes(x));
    setPicked(next);
    onSettings({ outputFolder: folder, species: next });
  };

  const chooseFolder = async () => {
    const r = await call('dialog:choose-folder', { title: 'Folder for the report' }).catch((err: Error) => (setProblem(err.message), null));
    if (r?.path) onSettings({ outputFolder: r.path, species });
  };

  const stem = reportStem(project.document.programme.name);
  const busy = run.phase.kind !== 'idle';
  const blocker = species.length === 0 ? 'Choose at least one species.' : !folder ? 'Choose the folder to write the report into.' : null;

  const make = async () => {
    if (blocker || !folder) return;
    setProblem(null);
    try {
      const projectFile = project.path && !project.dirty ? await call('file:fingerprint', { path: project.path }) : null;
      const plan = projectReportPlan({
        programme: project.document.programme.name,
        table: analysis.table,
        chosen,
        candidates,
        cleaning: project.document.cleaning,
        ...(input ? { cleaningRecords: input } : {}),
        species,
        projectFile,
        sources: sourceInputs(project.sources),
        software: { name: 'Tallywise', version },
        createdAt: new Date().toISOString(),
        command: `Made on the Report stage of the app. The same report from the command line: tallywise report --project ${projectFile ? `"${projectFile.name}"` : 'FILE'} --out DIR --species ${species.join(',')}`,
        seed: project.document.seeds[REPORT_SEED_KEY],
        dataKey: analysis.dataKey,
        previous: project.document.reportHistory.at(-1) ?? null,
      });
      await run.make(plan, folder, stem);
    } catch (err) {
      setProblem(err instanceof Error ? err.message : String(err));
    }
  };

  return (
    <section className="report-stage" aria-labelledby="report-heading">
      <h1 id="report-heading">Report</h1>
      <p className="lede">
        One PDF, one web page (HTML) and one workbook (XLSX) with the trend of each species from the model chosen for it, the composite of the species, the methods and the cautions.
      </p>
      {(problem || run.note) && (
        <div className={problem || run.note?.kind === 'problem' ? 'models-note is-problem' : 'models-note'} role={problem || run.note?.kind === 'problem' ? 'alert' : 'status'} data-testid="report-note">
          <span>{problem ?? run.note?.text}</span>
          <button type="button" className="button is-quiet is-small" onClick={() => (problem ? setProblem(null) : run.dismissNote())}>
            Dismiss
          </button>
        </div>
      )}
      <div className="report-columns">
        <fieldset className="report-species" disabled={busy}>
          <legend>Species</legend>
          {choices.length === 0 && <p className="hint">The analysis table has no species.</p>}
          <ul>
            {choices.map((c) => (
              <li key={c.species} className={c.model ? undefined : 'is-unavailable'}>
                <label>
                  <input type="checkbox" checked={species.includes(c.species)} disabled={!c.model} onChange={() => toggle(c.species)} data-testid={`report-species-${c.species}`} />
                  <span className="report-species-name">{c.species}</span>
                </label>
                {c.model ? (
                  <span className="hint">{c.model.name}</span>
                ) : (
                  <span className="hint" data-testid="report-species-why">
                    Not available: {c.problem}. {fixFor(c.problem!)}
                  </span>
                )}
              </li>
            ))}
          </ul>
        </fieldset>
        <div className="report-output">
          <h2>Output</h2>
          <p className="report-folder">
            <span className="hint">Folder</span>
            <span data-testid="report-folder">{folder ?? 'not chosen yet'}</span>
            <button type="button" className="button is-small" onClick={() => void chooseFolder()} disabled={busy}>
              {folder ? 'Change…' : 'Choose folder…'}
            </button>
          </p>
          <LastReportLine history={project.document.reportHistory} />
          <p className="hint" data-testid="report-files">
            Files: <code>{stem}</code> .pdf, .html and .xlsx; files of those names in the folder are replaced.
          </p>
          {(project.dirty || !project.path) && (
            <p className="banner is-warning report-unsaved" data-testid="report-unsaved">
              {project.path ? 'The project has changes not saved to its file.' : 'The project has not been saved to a file yet.'} Save it first, so that the report names the project file and its SHA-256 and can be made again from it.
            </p>
          )}
          {run.phase.kind === 'idle' ? (
            <p className="report-make">
              <button type="button" className="button is-primary" onClick={() => void make()} disabled={!!blocker} data-testid="make-report">
                Make report
              </button>
              {blocker && <span className="hint">{blocker}</span>}
            </p>
          ) : (
            <ReportProgress phase={run.phase} onCancel={run.cancel} />
          )}
          {run.written && run.phase.kind === 'idle' && <ReportWritten written={run.written} onProblem={setProblem} />}
        </div>
      </div>
      <Cautions />
    </section>
  );
}
