import type { SiteListCheck } from '@shared/analysis/site-list';

const SHOWN = 10;

/**
 * What the proposed site list gives the records: how many of their sites it
 * names, the sites it lacks (the first ten, with a merge into a close list
 * name where there is one) and what is wrong with the list itself.
 */
export function SiteListPreview({ check, onMerge }: { check: SiteListCheck; onMerge(from: string, into: string): void }) {
  if (check.unusable) {
    return (
      <div className="problem" role="alert" data-testid="site-list-problem">
        {check.problems[0]}
      </div>
    );
  }
  const total = check.matched.length + check.unmatched.length;
  const missing = check.unmatched.reduce((n, u) => n + u.records, 0);
  return (
    <div className="site-list-preview" data-testid="site-list-preview">
      <p className={check.unmatched.length ? 'site-list-count is-warning' : 'site-list-count'} data-testid="site-list-match">
        {check.matched.length} of the records' {total} sites are in the list ({check.listed} site{check.listed === 1 ? '' : 's'} listed).
        {check.unmatched.length === 0 && ' Every record has its site’s area and attributes.'}
      </p>
      {check.unmatched.length > 0 && (
        <div className="site-list-unmatched" data-testid="site-list-unmatched">
          <p>
            {check.unmatched.length} site{check.unmatched.length === 1 ? '' : 's'} of the records ({missing} record{missing === 1 ? '' : 's'}) {check.unmatched.length === 1 ? 'is' : 'are'} not in the list, so {check.unmatched.length === 1 ? 'it gets' : 'they get'} no area and no attributes. Fix it by merging the records’ name into the list’s (kept in the change log, can be undone), or correct the list in the workbook and import it again:
          </p>
          <ul>
            {check.unmatched.slice(0, SHOWN).map((u) => (
              <li key={u.name}>
                <strong>“{u.name}”</strong> <span className="muted">({u.records} record{u.records === 1 ? '' : 's'})</span>{' '}
                {u.like ? (
                  <button type="button" className="button is-small" onClick={() => onMerge(u.name, u.like!)}>
                    Merge into “{u.like}”
                  </button>
                ) : (
                  <span className="muted">no list name looks like it</span>
                )}
              </li>
            ))}
          </ul>
          {check.unmatched.length > SHOWN && <p className="hint">…and {check.unmatched.length - SHOWN} more.</p>}
        </div>
      )}
      {check.unused.length > 0 && (
        <p className="hint">
          The list has {check.unused.length} site{check.unused.length === 1 ? '' : 's'} no record names: {check.unused.slice(0, SHOWN).map((s) => `“${s}”`).join(', ')}
          {check.unused.length > SHOWN ? ' …' : ''}.
        </p>
      )}
      {check.problems.length > 0 && (
        <div className="problem" role="status" data-testid="site-list-problems">
          <strong>The list itself needs a look:</strong>
          <ul>
            {check.problems.slice(0, SHOWN).map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
          {check.problems.length > SHOWN && <p>…and {check.problems.length - SHOWN} more.</p>}
        </div>
      )}
    </div>
  );
}
