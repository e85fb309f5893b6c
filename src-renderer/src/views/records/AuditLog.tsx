import { useMemo, useState } from 'react';
import type { EditEntry, EditKind, EditLog } from '@shared/cleaning/edit-entry';
import { filterLog } from '@shared/cleaning/log-filter';
import { VirtualList } from '../../components/VirtualList';
import { describeEntry, kindWords, statusWords } from './describe-entry';
import type { RecordSet } from './record-set';

/** Every change to the records, newest first: what, where, old and new value, reason, when; each revertible. */
const time = new Intl.DateTimeFormat('en-GB', { dateStyle: 'short', timeStyle: 'medium' });

export function AuditLog({ log, set, height, onRevert }: { log: EditLog; set: RecordSet; height: number; onRevert(id: string): void }) {
  const [kind, setKind] = useState<'' | EditKind>('');
  const [text, setText] = useState('');
  const byId = useMemo(() => new Map<string, EditEntry>(log.entries.map((e) => [e.id, e])), [log]);
  const rows = useMemo(() => {
    const picked = filterLog(log, kind ? { kinds: [kind] } : {});
    const q = text.trim().toLowerCase();
    return picked
      .map((p) => ({ ...p, text: describeEntry(p.entry, set, byId) }))
      .filter((r) => !q || `${r.entry.id} ${r.text.what} ${r.text.where} ${r.text.old} ${r.text.new} ${r.entry.reason ?? ''}`.toLowerCase().includes(q))
      .reverse();
  }, [log, kind, text, set, byId]);
  return (
    <section className="side-section" aria-label="Change log">
      <div className="side-filters">
        <select aria-label="Kind of change" value={kind} onChange={(e) => setKind(e.target.value as '' | EditKind)}>
          <option value="">All changes ({log.entries.length})</option>
          {(Object.keys(kindWords) as EditKind[]).map((k) => (
            <option key={k} value={k}>
              {kindWords[k]}
            </option>
          ))}
        </select>
        <input type="search" placeholder="Search the log" aria-label="Search the log" value={text} onChange={(e) => setText(e.target.value)} />
      </div>
      {rows.length === 0 ? (
        <p className="status side-empty">{log.entries.length === 0 ? 'No changes yet. Edits, merges and records left out will be listed here.' : 'No change matches.'}</p>
      ) : (
        <VirtualList
          items={rows}
          rowHeight={104}
          height={height}
          label="Changes"
          testId="audit-list"
          render={({ entry, status, text: t }) => (
            <article className={`entry is-${status}`} data-entry={entry.id} data-kind={entry.kind} data-status={status}>
              <header>
                <span className="entry-id">{entry.id}</span>
                <strong>{t.what}</strong>
                <span className={`entry-status status-${status}`}>{statusWords[status]}</span>
              </header>
              <p className="entry-where" title={t.file ? `${t.where} (${t.file})` : t.where}>
                {t.where}
              </p>
              <p className="entry-change">
                <span className="old">{t.old}</span> → <span className="new">{t.new}</span>
              </p>
              <p className="entry-reason" title={entry.reason}>
                {entry.reason ? `Reason: ${entry.reason}` : 'No reason given'}
              </p>
              <footer>
                <span className="entry-file">{t.file ?? ''}</span>
                <time dateTime={entry.time}>{time.format(new Date(entry.time))}</time>
                {status === 'in-effect' && (
                  <button type="button" className="button is-small" onClick={() => onRevert(entry.id)} title="Cancel this change; the log keeps both">
                    Revert
                  </button>
                )}
              </footer>
            </article>
          )}
        />
      )}
    </section>
  );
}
