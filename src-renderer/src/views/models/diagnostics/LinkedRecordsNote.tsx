import type { RecordLink } from './record-link';
import type { ModelOutliers } from './model-outliers';

/**
 * Above the cleaning grid when it shows records that came from the Models
 * stage (a chart point, or the model's outlier flags): what is shown and
 * why, and a way back to every record.
 */
export function LinkedRecordsNote({ link, outliers, showingOutliers, onClear }: { link?: RecordLink; outliers: ModelOutliers | null; showingOutliers: boolean; onClear(): void }) {
  if (!link && !(showingOutliers && outliers)) return null;
  const text = link
    ? `Showing the visit records behind ${link.label}. Season totals sum these visits.`
    : `Showing the visit records behind the ${outliers?.result.flags.length} season totals of ${outliers?.species} that are improbable under “${outliers?.model}” (tail probability below ${outliers?.result.threshold}).`;
  return (
    <div className="banner linked-note" role="status" data-testid="linked-note">
      <span>
        {text} Model flags are for review: check the field sheets and the protocol; nothing is left out unless you leave it out.
      </span>
      <button type="button" className="button is-small" onClick={onClear}>
        Show all records
      </button>
    </div>
  );
}
