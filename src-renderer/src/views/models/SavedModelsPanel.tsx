import type { RunningFit } from './use-models';
import type { WaitingModel } from './saved-models';

/**
 * The models of a species the project file keeps but that are not fitted in
 * this session yet (results are never stored, only specs and choices): each
 * with its choice for the report and why it waits, and a button to fit it
 * again with the current cleaned records.
 */
export function SavedModelsPanel({ waiting, dataKey, chosen, busy, onFit }: { waiting: readonly WaitingModel[]; dataKey: string; chosen: string | null; busy: boolean; onFit: (which: readonly WaitingModel[]) => void }) {
  if (!waiting.length) return null;
  return (
    <section className="saved-models banner" aria-labelledby="saved-models-heading" data-testid="saved-models">
      <div>
        <strong id="saved-models-heading">Saved in the project, not fitted in this session yet</strong>
        <ul>
          {waiting.map((w) => (
            <li key={w.id} data-testid="saved-model">
              <strong>{w.name}</strong>
              {w.id === chosen && <span className="tag"> chosen for the report</span>}
              <span className="muted">
                {' '}
                — {w.fittedKey && w.fittedKey !== dataKey ? 'the cleaned records have changed since it was fitted' : busy ? 'being fitted in the background (progress on the left)…' : 'not fitted yet'}
              </span>
            </li>
          ))}
        </ul>
      </div>
      <button type="button" className="button" disabled={busy} onClick={() => onFit(waiting)}>
        Fit again
      </button>
    </section>
  );
}

/**
 * A fit running while another stage is shown (the saved models of an opened
 * project are fitted again in the background): what is being fitted, how
 * far, and Cancel, as on the Models stage.
 */
export function BackgroundFitStatus({ running, onCancel }: { running: RunningFit; onCancel: () => void }) {
  const overall = Math.min(1, (running.done + running.fraction) / Math.max(1, running.species.length));
  return (
    <div className="banner background-fit" role="status" data-testid="background-fit">
      <span>
        Fitting “{running.label}” for {running.species.join(', ')} in the background ({Math.round(overall * 100)}%); the project’s saved models are fitted again on opening, and the Report stage lists a chosen model once it is fitted.
      </span>
      <progress max={1} value={overall} aria-label="Background fit progress" />
      <button type="button" className="button is-small" onClick={onCancel}>
        Cancel
      </button>
    </div>
  );
}
