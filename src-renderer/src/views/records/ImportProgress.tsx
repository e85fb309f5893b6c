import type { JobProgress } from '@shared/host/contract';
import type { ImportJob } from './use-import-job';

/** The stage of an import in words. */
export function describeImportStage(p: JobProgress | null): string {
  if (!p) return 'starting';
  switch (p.stage) {
    case 'reading-file':
      return 'reading the file';
    case 'reading-sheet': {
      const rows = p.rowsRead ? `, ${p.rowsRead.toLocaleString('en')} rows so far` : '';
      return `reading sheet ${p.sheetIndex ?? 1} of ${p.sheetCount ?? 1}${p.sheet ? ` ("${p.sheet}")` : ''}${rows}`;
    }
    case 'checking':
      return 'finding the header and checking the columns';
    case 'building':
      return 'building the records and their findings';
    case 'done':
      return 'handing the records over';
  }
}

/** A running import: the file, its stage, a bar, and Cancel; or, after a cancel, the note that nothing changed. */
export function ImportProgress({ job, note, onCancel, onDismiss }: { job: ImportJob | null; note: string | null; onCancel: () => void; onDismiss: () => void }) {
  if (job) {
    const fraction = job.progress?.fraction ?? 0;
    return (
      <div className="fit-progress" role="status" data-testid="import-progress">
        <div className="fit-progress-text">
          <strong>Importing {job.fileName}</strong>
          <span data-testid="import-progress-text">
            {job.cancelling ? 'Cancelling: the import stops at its next check…' : `Now ${describeImportStage(job.progress)} (${Math.round(fraction * 100)}%)`}
          </span>
        </div>
        <div className="fit-progress-bar">
          <progress max={1} value={fraction} aria-label="Import progress" />
          <button type="button" className="button" onClick={onCancel} disabled={job.cancelling} data-testid="cancel-import">
            Cancel
          </button>
        </div>
      </div>
    );
  }
  if (!note) return null;
  return (
    <p className="status" role="status" data-testid="import-note">
      {note}{' '}
      <button type="button" className="button is-quiet is-small" onClick={onDismiss}>
        Dismiss
      </button>
    </p>
  );
}
