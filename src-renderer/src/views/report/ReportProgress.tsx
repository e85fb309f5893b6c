import { COMPOSITE_STEP } from '@shared/report/programme-report';
import type { ReportPhase } from './use-report-run';

/** Progress of a report run: which species (or the composite), how far, and a way to stop it. */
export function ReportProgress({ phase, onCancel }: { phase: Exclude<ReportPhase, { kind: 'idle' }>; onCancel: () => void }) {
  const p = phase.kind === 'running' ? phase.progress : null;
  const total = p?.total ?? phase.species.length;
  const overall = phase.kind === 'writing' ? 1 : p ? Math.min(1, (p.done + p.fraction) / Math.max(1, p.total)) : 0;
  const now = !p ? 'starting' : p.group === COMPOSITE_STEP ? `the composite of the species: ${p.stage}` : p.group ? `${p.group}: ${p.stage}` : p.stage;
  return (
    <div className="fit-progress" role="status" data-testid="report-progress">
      <div className="fit-progress-text">
        <strong>{phase.kind === 'writing' ? 'Writing the PDF, HTML and XLSX files…' : `Making the report of ${phase.species.length === 1 ? phase.species[0] : `${phase.species.length} species`}`}</strong>
        {phase.kind === 'running' && (
          <span data-testid="report-progress-text">
            Step {Math.min(total, (p?.done ?? 0) + 1)} of {total}; now {now} ({Math.round(overall * 100)}%)
          </span>
        )}
      </div>
      <div className="fit-progress-bar">
        <progress max={1} value={overall} aria-label="Report progress" />
        <button type="button" className="button" onClick={onCancel} disabled={phase.kind === 'writing'} data-testid="cancel-report">
          Cancel
        </button>
      </div>
    </div>
  );
}
