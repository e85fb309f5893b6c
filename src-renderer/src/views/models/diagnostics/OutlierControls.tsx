import { useEffect, useState } from 'react';
import type { DataTable } from '@shared/data/table';
import type { FitOutcome } from '@shared/engine/types';
import { modelOutliersInWorker } from '../diagnostics-client';
import type { OutlierResult } from '../diagnostics-outliers';
import { probabilityText, publishModelOutliers } from './model-outliers';
import { showRecords } from './record-link';

/**
 * Model-based outlier flags for the model shown: the analyst sets the tail
 * probability, the worker finds the analysis rows below it, and the flags
 * go to the cleaning grid for review. Nothing is removed.
 */
const DEFAULT_THRESHOLD = 0.001;

type State = { state: 'working' } | { state: 'ready'; result: OutlierResult } | { state: 'failed'; message: string };

export function OutlierControls({ species, model, dataKey, outcome, table, siteColumn, seasonColumn }: { species: string; model: string; dataKey: string; outcome: FitOutcome; table: DataTable; siteColumn: string; seasonColumn: string }) {
  const [typed, setTyped] = useState(String(DEFAULT_THRESHOLD));
  const [threshold, setThreshold] = useState(DEFAULT_THRESHOLD);
  const [state, setState] = useState<State>({ state: 'working' });
  const value = Number(typed);
  const bad = !(value > 0 && value < 0.5);

  useEffect(() => {
    const controller = new AbortController();
    setState({ state: 'working' });
    modelOutliersInWorker({ outcome, table, threshold, siteColumn, seasonColumn }, { signal: controller.signal })
      .then((result) => {
        publishModelOutliers(species, model, result, dataKey);
        setState({ state: 'ready', result });
      })
      .catch((err: Error) => {
        if (err.name !== 'FitCancelled') setState({ state: 'failed', message: err.message });
      });
    return () => controller.abort();
  }, [species, model, dataKey, outcome, table, threshold, siteColumn, seasonColumn]);

  const flags = state.state === 'ready' ? state.result.flags : [];
  return (
    <section className="outlier-controls" aria-labelledby="outliers-heading" data-testid="outlier-controls">
      <h3 id="outliers-heading">Counts the model finds improbable</h3>
      <form
        className="outlier-form"
        onSubmit={(e) => {
          e.preventDefault();
          if (!bad) setThreshold(value);
        }}
      >
        <label>
          <span>Flag a season total when P(a total at least this large) is below</span>
          <input type="number" inputMode="decimal" step="any" min="0" max="0.5" value={typed} onChange={(e) => setTyped(e.target.value)} aria-label="Outlier tail probability" aria-invalid={bad} />
        </label>
        <button type="submit" className="button is-small" disabled={bad || value === threshold}>
          Apply
        </button>
        {bad && (
          <span className="problem-inline" role="alert">
            Type a probability between 0 and 0.5, e.g. 0.001; the flags below are for {threshold}.
          </span>
        )}
      </form>
      {state.state === 'working' && <p className="status">Checking each season total against “{model}”…</p>}
      {state.state === 'failed' && (
        <p className="problem" role="alert">
          The outlier flags could not be worked out: {state.message}
        </p>
      )}
      {state.state === 'ready' && (
        <p data-testid="outlier-summary">
          {flags.length === 0
            ? `No season total of ${species} has a tail probability below ${state.result.threshold} under “${model}”.`
            : `${flags.length} of ${state.result.rowsChecked} season totals of ${species} fall below ${state.result.threshold} under “${model}” (a fitting model would give about ${Number(state.result.expectedByChance.toPrecision(2))} by chance); the smallest has ${probabilityText(flags[0].probability)}.`}{' '}
          Each total sums a site's visits in a season; its visit records are flagged in the Records grid for review. Nothing is left out: check the field sheets and the protocol before changing anything.{' '}
          {flags.length > 0 && (
            <button type="button" className="button is-small" onClick={() => showRecords({ label: `Model outliers of ${species} under “${model}”`, keys: flags.map((f) => f.key), asOutliers: true })}>
              Show the {flags.length} flagged total{flags.length === 1 ? '' : 's'} in Records
            </button>
          )}
        </p>
      )}
      {state.state === 'ready' && state.result.note && <p className="hint">{state.result.note}</p>}
    </section>
  );
}
