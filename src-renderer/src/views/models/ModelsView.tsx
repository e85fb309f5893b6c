import { useEffect, useMemo, useState } from 'react';
import type { ProgrammeOverview } from '@shared/host/contract';
import type { ModelSpec } from '@shared/model/spec';
import type { ProjectControls } from '../records/use-project';
import { cleanedAnalysis } from './analysis-input';
import { memoLast } from './memo-last';
import { useSiteSheet } from './site-attributes';
import { SavedModelsPanel } from './SavedModelsPanel';
import { predictorColumns, specOf, speciesOf, tableRoles, type SpecDraft, type TableRoles } from './spec-draft';
import type { DataTable } from '@shared/data/table';
import { fitTableFor, rowsOfSpecies } from './fit-table';
import { checkSpec } from '@shared/model/spec-checks';
import { blankPredictorNotes } from '@shared/model/blank-predictors';
import { modelEquation } from './equation';
import type { ModelsControls, RunningFit } from './use-models';
import { modelsOf } from './fitted-model';
import { compareModels } from '@shared/model/comparison';
import { SpecBuilder } from './SpecBuilder';
import { ComparisonPanel } from './ComparisonPanel';
import { ModelResult } from './ModelResult';
import { DiagnosticsPanel } from './DiagnosticsPanel';
import { tablistKeys } from '../../components/tablist-keys';

function FitProgress({ running, onCancel }: { running: RunningFit; onCancel: () => void }) {
  const total = running.species.length;
  const overall = Math.min(1, (running.done + running.fraction) / Math.max(1, total));
  return (
    <div className="fit-progress" role="status" data-testid="fit-progress">
      <div className="fit-progress-text">
        <strong>Fitting “{running.label}”</strong>
        <span>
          {total > 1 ? `${running.done} of ${total} species done; now ${running.current}` : running.current} ({Math.round(overall * 100)}%)
        </span>
      </div>
      <div className="fit-progress-bar">
        <progress max={1} value={overall} aria-label="Fit progress" />
        <button type="button" className="button" onClick={onCancel} data-testid="cancel-fit">
          Cancel
        </button>
      </div>
    </div>
  );
}


interface Built {
  spec: ModelSpec | null;
  problems: string[];
  /** Rows blank predictor cells leave out (notes; the fit still runs). */
  notes: string[];
  leftOut: number;
  /** The draft's species that the table has. */
  chosen: string[];
}

const tableParts = memoLast((table: DataTable | undefined, effortColumn: string | undefined) => {
  if (!table) return { roles: null, species: [] as string[], columns: [] };
  const roles = tableRoles(table, effortColumn);
  return { roles, species: speciesOf(table), columns: predictorColumns(table, roles) };
});


const speciesChecks = memoLast((draft: SpecDraft, table: DataTable | undefined, roles: TableRoles | null, species: readonly string[]): Built => {
  const chosenSpecies = draft.species.filter((s) => species.includes(s));
  if (!table || !roles) return { spec: null, problems: [], notes: [], leftOut: 0, chosen: chosenSpecies };
  let spec: ModelSpec;
  try {
    spec = specOf({ ...draft, species: chosenSpecies }, roles);
  } catch (err) {
    return { spec: null, problems: [err instanceof Error ? err.message : String(err)], notes: [], leftOut: 0, chosen: chosenSpecies };
  }
  const prepared = fitTableFor(table, spec, chosenSpecies, draft.dropBadOffsetRows);
  const rows = chosenSpecies.map((s) => ({ species: s, table: rowsOfSpecies(prepared.table, [s]) }));
  return { spec, problems: checkSpec(spec, rows, roles), notes: blankPredictorNotes(spec, rows, roles), leftOut: prepared.leftOut, chosen: chosenSpecies };
});

/** The species tab shown: the analyst's pick while it has models, else the first with any. */
function shownSpeciesOf(picked: string | null, withModels: readonly string[]): string | null {
  return picked && withModels.includes(picked) ? picked : (withModels[0] ?? null);
}

/** The Models stage: build a model, fit it per species in the worker, compare, read the diagnostics. */
export function ModelsView({ controls, models: m }: { controls: ProjectControls; models: ModelsControls; overview: ProgrammeOverview | null }) {
  const { project } = controls;
  const sources = project?.sources;
  const log = project?.document.cleaning;
  const site = useSiteSheet(project);
  const input = site.loading ? null : cleanedAnalysis(sources, log, site.sheet);
  const analysis = input?.analysis;
  const key = input?.dataKey ?? '';
  const table = analysis?.table;
  const { roles, species, columns } = tableParts(table, analysis?.effortColumn);
  const { draft, setDraft } = m;

  const built = speciesChecks(draft, table, roles, species);
  const chosenSpecies = built.chosen;
  const equation = useMemo(() => (built.spec && roles ? modelEquation(built.spec, roles, columns) : null), [built, roles, columns]);

  const fittedSpecies = useMemo(() => species.filter((s) => m.models.some((x) => x.species === s) || m.waiting.some((x) => x.species === s)), [species, m.models, m.waiting]);
  const waitingHere = useMemo(() => m.waiting.filter((x) => x.species === shownSpeciesOf(m.shown, fittedSpecies)), [m.waiting, m.shown, fittedSpecies]);
  // Saved models whose data are unchanged are fitted again in the background.
  const { autoFit } = m;
  useEffect(() => {
    if (table && key && !m.running) autoFit(table, key);
  }, [table, key, autoFit, m.running]);
  const shownSpecies = shownSpeciesOf(m.shown, fittedSpecies);
  const speciesModels = useMemo(() => (shownSpecies ? modelsOf(m.models, shownSpecies) : []), [m.models, shownSpecies]);
  const comparison = useMemo(() => compareModels(speciesModels), [speciesModels]);
  const [focusId, setFocusId] = useState<string | null>(null);
  const focus = Math.max(0, speciesModels.findIndex((x) => x.id === focusId));
  const focusModel = speciesModels[focus] ?? null;
  // A newly fitted model is the one shown; otherwise the analyst's pick stays.
  const newest = speciesModels.reduce<(typeof speciesModels)[number] | null>((a, x) => (!a || x.fittedAt >= a.fittedAt ? x : a), null);
  useEffect(() => {
    if (newest) setFocusId(newest.id);
  }, [newest?.id, newest?.fittedAt]);
  const stale = (id: string) => m.models.find((x) => x.id === id)?.dataKey !== key;
  const staleHere = speciesModels.filter((x) => stale(x.id));

  if (!project || !table || !roles) {
    return (
      <section className="records-empty" aria-labelledby="models-heading">
        <h1 id="models-heading">Models</h1>
        {project && site.loading ? (
          <p className="status">Reading the project's site list…</p>
        ) : (
          <p className="lede">Models are fitted to the cleaned records of a project. Open the demo project or import a season workbook on the Records stage first.</p>
        )}
      </section>
    );
  }

  const note = m.note ? (
    <div className={m.note.kind === 'problem' ? 'models-note is-problem' : 'models-note'} role={m.note.kind === 'problem' ? 'alert' : 'status'} data-testid="models-note">
      <span>{m.note.text}</span>
      <button type="button" className="button is-quiet is-small" onClick={m.dismissNote}>
        Dismiss
      </button>
    </div>
  ) : undefined;

  const refitStale = async () => {
    for (const x of staleHere) await m.fit(table, x.spec, [x.species], key, x.dropBadOffsetRows);
  };

  return (
    <section className="models" aria-labelledby="models-heading">
      <header className="models-head">
        <div>
          <h1 id="models-heading">Models</h1>
          <p className="records-summary" data-testid="models-summary">
            {table.nrows} analysis rows (site × season × species, counts summed over visits) from {input?.cleaned.filter((r) => !r.excluded).length ?? 0} cleaned records; {species.length} species.
          </p>
        </div>
      </header>
      <div className="models-body">
        <SpecBuilder
          draft={{ ...draft, species: chosenSpecies }}
          onChange={setDraft}
          species={species}
          columns={columns}
          roles={roles}
          equation={equation}
          problems={built.problems}
          busy={!!m.running}
          leftOut={built.leftOut}
          visitCovariates={analysis?.visitCovariates}
          notes={built.notes}
          note={note}
          progress={m.running ? <FitProgress running={m.running} onCancel={m.cancel} /> : undefined}
          onFit={() => built.spec && void m.fit(table, built.spec, chosenSpecies, key, draft.dropBadOffsetRows)}
        />
        <div className="models-results" data-testid="models-results">
          {!fittedSpecies.length && <p className="status">No model fitted yet. Choose the species and the model on the left, then Fit.</p>}
          {fittedSpecies.length > 0 && (
            <>
              <div className="tabs species-tabs" role="tablist" aria-label="Species with fitted models" onKeyDown={tablistKeys}>
                {fittedSpecies.map((s) => (
                  <button key={s} type="button" role="tab" aria-selected={s === shownSpecies} className={s === shownSpecies ? 'tab is-current' : 'tab'} onClick={() => m.setShown(s)}>
                    {s}
                    <span className="tab-count">{modelsOf(m.models, s).length + m.waiting.filter((x) => x.species === s && !m.models.some((f) => f.id === x.id)).length}</span>
                  </button>
                ))}
              </div>
              {staleHere.length > 0 && (
                <div className="banner is-warning" data-testid="stale-banner">
                  <span>
                    The cleaned records have changed since {staleHere.length === speciesModels.length ? 'these models were' : `${staleHere.length} of these models were`} fitted; they are out of date.
                  </span>
                  <button type="button" className="button" disabled={!!m.running} onClick={() => void refitStale()}>
                    Fit them again
                  </button>
                </div>
              )}
              <SavedModelsPanel waiting={waitingHere} dataKey={key} chosen={shownSpecies ? (m.forReport[shownSpecies] ?? null) : null} busy={!!m.running} onFit={(which) => void m.fitWaiting(table, key, which)} />
              {speciesModels.length > 0 && <ComparisonPanel
                comparison={comparison}
                chosen={shownSpecies ? (m.forReport[shownSpecies] ?? null) : null}
                shown={focusModel?.id ?? null}
                stale={stale}
                onChoose={(id) => shownSpecies && m.chooseForReport(shownSpecies, id)}
                onShow={setFocusId}
                onRemove={m.remove}
              />}
              {focusModel && <ModelResult model={focusModel} />}
              {shownSpecies && focusModel && <DiagnosticsPanel species={shownSpecies} models={speciesModels} focus={focus} siteColumn={roles.site} seasonColumn={roles.season} effortColumn={roles.effort?.column} />}
            </>
          )}
        </div>
      </div>
    </section>
  );
}
