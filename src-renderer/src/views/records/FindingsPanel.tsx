import { useMemo, useState } from 'react';
import type { RecordFinding } from '@shared/host/contract';
import { VirtualList } from '../../components/VirtualList';
import { flagLabel } from '@shared/cleaning/finding-flags';
import { describePlace } from '@shared/cleaning/place-words';
import { showValue } from './describe-entry';
import type { ModelOutliers } from '../models/diagnostics/model-outliers';
import type { RecordLink } from '../models/diagnostics/record-link';
import { MODEL_FLAGS_CLOSED, MODEL_FLAGS_OPEN, ModelFlagsSection } from '../models/diagnostics/ModelFlagsSection';

/**
 * What the import checks found, with the place in the workbook and the usual
 * fix; name variants merge in one click, a repeated row is left out in one.
 */
export interface FindingRow {
  finding: RecordFinding;
  settled: boolean;
}

const severityRank = { error: 0, warning: 1, info: 2 } as const;
const severityWords = { error: 'Problem', warning: 'Check', info: 'Note' } as const;

export function FindingsPanel({
  rows,
  height,
  showFile,
  onMerge,
  onLeaveOut,
  onShow,
  outliers = null,
  onShowLink,
}: {
  rows: FindingRow[];
  height: number;
  showFile: boolean;
  onMerge(f: RecordFinding): void;
  onLeaveOut(f: RecordFinding): void;
  onShow(f: RecordFinding): void;
  /** The model's outlier flags, listed above the findings (null: none or out of date). */
  outliers?: ModelOutliers | null;
  onShowLink?(link: RecordLink): void;
}) {
  const [show, setShow] = useState<'open' | 'all'>('open');
  const [flagsOpen, setFlagsOpen] = useState(false);
  const withFlags = !!outliers && outliers.result.flags.length > 0;
  const listHeight = withFlags ? Math.max(120, height - (flagsOpen ? MODEL_FLAGS_OPEN : MODEL_FLAGS_CLOSED)) : height;
  const [severity, setSeverity] = useState<'' | 'error' | 'warning' | 'info'>('');
  const [text, setText] = useState('');
  const list = useMemo(
    () =>
      rows
        .filter((r) => (show === 'all' || !r.settled) && (!severity || r.finding.severity === severity))
        .filter((r) => !text.trim() || `${describePlace(r.finding, true)} ${flagLabel(r.finding.code)} ${r.finding.message}`.toLowerCase().includes(text.trim().toLowerCase()))
        .sort((a, b) => Number(a.settled) - Number(b.settled) || severityRank[a.finding.severity] - severityRank[b.finding.severity]),
    [rows, show, severity, text],
  );
  const open = rows.filter((r) => !r.settled).length;
  return (
    <section className="side-section" aria-label="Findings">
      {withFlags && outliers && <ModelFlagsSection outliers={outliers} open={flagsOpen} onToggle={setFlagsOpen} onShow={(l) => onShowLink?.(l)} />}
      <div className="side-filters">
        <select aria-label="Which findings" value={show} onChange={(e) => setShow(e.target.value as 'open' | 'all')}>
          <option value="open">Still open ({open})</option>
          <option value="all">All ({rows.length})</option>
        </select>
        <select aria-label="Finding severity" value={severity} onChange={(e) => setSeverity(e.target.value as typeof severity)}>
          <option value="">Any kind</option>
          <option value="error">Problems</option>
          <option value="warning">Checks</option>
          <option value="info">Notes</option>
        </select>
        <input type="search" placeholder="Search: row 23, pond…" aria-label="Search the findings" value={text} onChange={(e) => setText(e.target.value)} />
      </div>
      {list.length === 0 ? (
        <p className="status side-empty">{rows.length === 0 ? 'The checks found nothing to look at.' : text || severity ? 'No finding matches.' : 'Every finding here has been dealt with.'}</p>
      ) : (
        <VirtualList
          items={list}
          rowHeight={showFile ? 150 : 134}
          height={listHeight}
          label="Findings"
          testId="findings-list"
          render={({ finding: f, settled }) => (
            <article className={`finding finding-${f.severity}${settled ? ' is-settled' : ''}`} data-finding={f.code} data-place={`${f.sheet}!${f.column ?? ''}${f.row ?? ''}`}>
              <header>
                <span className={`chip chip-${f.severity}`}>{flagLabel(f.code)}</span>
                <span className="finding-place" title={describePlace(f, true)}>
                  {describePlace(f)}
                </span>
                <span className="finding-kind">{settled ? 'dealt with' : severityWords[f.severity]}</span>
              </header>
              {showFile && f.file && <p className="finding-file">{f.file}</p>}
              <p className="finding-message" title={f.message}>
                {f.message}
              </p>
              <p className="finding-fix" title={f.fix}>
                {f.fix}
              </p>
              <div className="finding-actions">
                {f.merge && !settled && (
                  <button type="button" className="button is-small is-primary" onClick={() => onMerge(f)} title={`Merge ${showValue(f.merge.from)} into ${showValue(f.merge.into)}`}>
                    Merge into {showValue(f.merge.into)}
                  </button>
                )}
                {f.code === 'repeated-visit' && !settled && (
                  <button type="button" className="button is-small is-primary" onClick={() => onLeaveOut(f)}>
                    Leave this copy out
                  </button>
                )}
                <button type="button" className="button is-small" onClick={() => onShow(f)}>
                  Show {f.recordIds.length === 1 ? 'the record' : `${f.recordIds.length} records`}
                </button>
              </div>
            </article>
          )}
        />
      )}
    </section>
  );
}
