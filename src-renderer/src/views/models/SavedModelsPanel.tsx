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
