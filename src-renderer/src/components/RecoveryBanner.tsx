import type { RecoveryOffer } from '@shared/host/contract';

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

/** Offers the unsaved work autosave kept when Tallywise last stopped. */
export function RecoveryBanner({ offer, onRestore, onDiscard }: { offer: RecoveryOffer; onRestore(): void; onDiscard(): void }) {
  return (
    <div className="banner" role="alert" data-testid="recovery-offer">
      <div>
        <strong>Unsaved work was kept.</strong>{' '}
        {offer.problem
          ? `A recovery file from ${when.format(new Date(offer.savedAt))} was found but cannot be read: ${offer.problem}`
          : `${offer.programme ?? 'A project'} had ${offer.edits} change${offer.edits === 1 ? '' : 's'} in its log when it was last autosaved (${when.format(new Date(offer.savedAt))}), ${offer.projectPath ? 'after its last save' : 'and was never saved to a project file'}.`}
      </div>
      <div className="banner-actions">
        {!offer.problem && (
          <button type="button" className="button is-primary" onClick={onRestore}>
            Restore that work
          </button>
        )}
        <button type="button" className="button" onClick={onDiscard}>
          Discard it
        </button>
      </div>
    </div>
  );
}
