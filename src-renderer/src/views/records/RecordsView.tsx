import { useCallback, useEffect, useMemo, useState } from 'react';
import type { RecordFinding } from '@shared/host/contract';
import { canRedo, canUndo } from '@shared/cleaning/edit-log';
import { useElementHeight } from '../../components/useElementHeight';
import { ReasonDialog } from '../../components/ReasonDialog';
import { tablistKeys } from '../../components/tablist-keys';
import { RecordsGrid } from './RecordsGrid';
import { FindingsPanel, type FindingRow } from './FindingsPanel';
import { AuditLog } from './AuditLog';
import { ConvertEffortDialog } from './ConvertEffortDialog';
import { describePlace } from '@shared/cleaning/place-words';
import { buildRecordSet } from './record-set';
import { cleanRecords } from './cleaned';
import { findingSettled, flagLabels } from '@shared/cleaning/finding-flags';
import { distinctValues, linkedFilter, noFilter, type RecordFilter } from './record-filter';
import { takeRecordLink } from '../models/diagnostics/record-link';
import { LinkedRecordsNote } from '../models/diagnostics/LinkedRecordsNote';
import { useModelOutliers } from '../models/diagnostics/model-outliers';
import { dataKey } from '@shared/analysis/data-key';
import { readEdit } from './edit-values';
import { covariateOfField } from '@shared/import/visit-covariates';
import type { ProjectControls } from './use-project';
import { useSiteListAction } from './site-list/use-site-list-action';
import { useCleanedExport } from './export/use-cleaned-export';

const fmt = new Intl.NumberFormat('en-GB');
const visitFields = new Set(['site', 'date', 'effort']);
const noRecords: never[] = [];

type Ask =
  | { kind: 'leave-out'; ids: string[]; title: string; detail: string; initial: string }
  | { kind: 'convert'; ids: string[] }
  | null;

function isTyping(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  if (!el) return false;
  return el.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(el.tagName) || !!el.closest?.('.ag-cell-inline-editing');
}

/** The Records stage: the cleaning grid, its filters and actions, the findings and the change log. */
export function RecordsView({ controls }: { controls: ProjectControls }) {
  const { project, edit, undo, redo, revert } = controls;
  const sources = project?.sources;
  const set = useMemo(() => buildRecordSet(sources ?? []), [sources]);
  const log = project?.document.cleaning;
  const cleaned = useMemo(() => (log ? cleanRecords(set.raw, log) : null), [set, log]);
  // Records a chart point on the Models stage links to are shown on arrival.
  const [filter, setFilter] = useState<RecordFilter>(() => {
    const link = takeRecordLink();
    return link ? linkedFilter(link) : noFilter;
  });
  // Model-based outlier flags, shown only while the records are those the model was fitted to.
  const modelOutliers = useModelOutliers();
  const siteLink = project?.document.sites ?? null;
  const currentKey = useMemo(() => (sources && log ? dataKey(sources.map((s) => s.summary.id), log, siteLink) : ''), [sources, log, siteLink]);
  const outliers = modelOutliers && modelOutliers.dataKey === currentKey ? modelOutliers : null;
  const [selected, setSelected] = useState<string[]>([]);
  const [shown, setShown] = useState(0);
  const [tab, setTab] = useState<'findings' | 'log'>('findings');
  const [ask, setAsk] = useState<Ask>(null);
  const [note, setNote] = useState<string | null>(null);
  /** A reason the analyst may give for the cell edits, merges and conversions that follow. */
  const [reason, setReason] = useState('');
  const because = reason.trim() ? { reason: reason.trim() } : {};
  const [sideRef, sideHeight] = useElementHeight<HTMLDivElement>(500);
  const siteList = useSiteListAction(controls, cleaned?.records ?? noRecords);
  const cleanedExport = useCleanedExport(project);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (!(e.ctrlKey || e.metaKey) || isTyping(e.target) || ask) return;
      const k = e.key.toLowerCase();
      if (k === 'z' && !e.shiftKey) {
        e.preventDefault();
        undo();
      } else if (k === 'y' || (k === 'z' && e.shiftKey)) {
        e.preventDefault();
        redo();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [undo, redo, ask]);

  const findingRows = useMemo<FindingRow[]>(
    () => (cleaned ? set.findings.map((f) => ({ finding: f, settled: findingSettled(f, cleaned.byId, set.rawById) })) : []),
    [set, cleaned],
  );
  const lists = useMemo(
    () => ({
      site: cleaned ? distinctValues(cleaned.records, 'site') : [],
      species: cleaned ? distinctValues(cleaned.records, 'species') : [],
      season: cleaned ? distinctValues(cleaned.records, 'season') : [],
      codes: [...new Set(set.findings.map((f) => f.code))],
    }),
    [cleaned, set],
  );

  const onEdit = useCallback(
    (recordId: string, field: string, typed: unknown) => {
      const rec = cleaned?.byId.get(recordId);
      if (!rec) return;
      const reading = readEdit(field, typed, set.covariates);
      if (!reading.ok) {
        setNote(reading.message);
        return;
      }
      setNote(null);
      // Site, date, effort and the visit covariates belong to the visit: the correction goes to every record of its row.
      const ids = visitFields.has(field) || covariateOfField(field) !== null ? (set.visitOf.get(recordId) ?? [recordId]) : [recordId];
      const drafts = ids.flatMap((id) => {
        const old = cleaned?.byId.get(id)?.fields[field] ?? null;
        return old === reading.value ? [] : [{ kind: 'set-value' as const, recordId: id, field, old, new: reading.value, ...because }];
      });
      edit(...drafts);
    },
    [cleaned, edit, set, reason],
  );

  const showFinding = (f: RecordFinding) => setFilter({ ...noFilter, flag: `finding:${f.id}` });
  const merge = (f: RecordFinding) => {
    if (!f.merge) return;
    edit({ kind: 'merge-name', field: f.merge.field, from: f.merge.from, into: f.merge.into, reason: reason.trim() || `Name variant found at ${describePlace(f, true)}` });
  };
  const leaveOutCopy = (f: RecordFinding) =>
    setAsk({
      kind: 'leave-out',
      ids: f.recordIds,
      title: `Leave out row ${f.row}${f.file ? ` of ${f.file}` : ''}?`,
      detail: `Its ${f.recordIds.length} records stay in the grid, marked as left out, and are not used in the analysis.`,
      initial: `Repeats row ${f.repeats ?? '?'} (the same visit entered twice)`,
    });

  if (!project || !cleaned || !log) {
    return (
      <section className="records-empty" aria-labelledby="records-heading">
        <h1 id="records-heading">Records</h1>
        <p className="lede">Import a season's tally workbook to check and clean its counts. The workbook itself is never changed: every correction is kept in a change log you can undo, revert and read back.</p>
        <div className="empty-actions">
          <button type="button" className="button is-primary" onClick={() => void controls.importWorkbook()}>
            Import a season workbook…
          </button>
          <button type="button" className="button" onClick={() => void controls.openProject()}>
            Open a project…
          </button>
          <button type="button" className="button" onClick={() => void controls.openDemo()}>
            Try the demo project
          </button>
          <button type="button" className="button" onClick={() => void controls.openDemo(true)} title="The demo with the cleaning an analyst recorded for its planted problems, and a model chosen per species">
            Demo, already cleaned
          </button>
        </div>
        <p className="hint">You can also drop an .xlsx or .csv file onto this window.</p>
      </section>
    );
  }

  const selectedRecords = selected.map((id) => cleaned.byId.get(id)).filter((r) => r !== undefined);
  const includedSel = selectedRecords.filter((r) => r.excluded === undefined).map((r) => r.id);
  const excludedSel = selectedRecords.filter((r) => r.excluded !== undefined).map((r) => r.id);
  // Effort belongs to the visit: converting one record's effort converts its whole visit row.
  const withEffort = [...new Set(selectedRecords.flatMap((r) => set.visitOf.get(r.id) ?? [r.id]))].filter((id) => typeof cleaned.byId.get(id)?.fields['effort'] === 'number');
  const open = findingRows.filter((r) => !r.settled).length;
  const excludedCount = cleaned.records.filter((r) => r.excluded !== undefined).length;
  const inEffect = log.cursor;
  const setF = (k: keyof RecordFilter) => (e: React.ChangeEvent<HTMLSelectElement>) => setFilter((f) => ({ ...f, [k]: e.target.value }));
  const findingFilter = filter.flag.startsWith('finding:') ? set.findings.find((f) => `finding:${f.id}` === filter.flag) : undefined;

  return (
    <section className="records" aria-labelledby="records-heading">
      <header className="records-head">
        <div>
          <h1 id="records-heading">Records</h1>
          <p className="records-summary" data-testid="records-summary">
            {fmt.format(cleaned.records.length)} records from {project.sources.length} workbook{project.sources.length === 1 ? '' : 's'} · {open} finding{open === 1 ? '' : 's'} still open · {excludedCount} left out · {inEffect} change{inEffect === 1 ? '' : 's'} in effect
          </p>
        </div>
        <div className="records-head-actions">
          <button type="button" className="button" onClick={undo} disabled={!canUndo(log)} title="Undo the last change (Ctrl+Z)">
            Undo
          </button>
          <button type="button" className="button" onClick={redo} disabled={!canRedo(log)} title="Redo the change undone last (Ctrl+Y)">
            Redo
          </button>
          <span className="toolbar-sep" />
          <button type="button" className="button" onClick={() => void controls.importWorkbook()}>
            Import another workbook…
          </button>
          {siteList.button}
          {cleanedExport.button}
        </div>
      </header>
      <div className="toolbar" role="toolbar" aria-label="Filters and actions">
        <label className="tool">
          <span>Flags</span>
          <select aria-label="Filter by flag" value={filter.flag} onChange={setF('flag')}>
            <option value="">All records</option>
            <option value="open">With an open finding</option>
            <option value="flagged">With any finding</option>
            <option value="none">Without findings</option>
            <option value="edited">Changed</option>
            <option value="excluded">Left out</option>
            {lists.codes.map((c) => (
              <option key={c} value={`code:${c}`}>
                Flag: {flagLabels[c] ?? c}
              </option>
            ))}
            {findingFilter && <option value={filter.flag}>One finding: {describePlace(findingFilter)}</option>}
            {outliers && <option value="model-outliers">Model outliers: {outliers.result.flags.length} {outliers.species} totals</option>}
            {modelOutliers && !outliers && (
              <option value="model-outliers" disabled>
                Model outliers: out of date (fit the model again)
              </option>
            )}
            {filter.link && <option value="linked">From a chart: {filter.link.label}</option>}
          </select>
        </label>
        <label className="tool">
          <span>Site</span>
          <select aria-label="Filter by site" value={filter.site} onChange={setF('site')}>
            <option value="">All sites ({lists.site.length})</option>
            {lists.site.map((s) => (
              <option key={s} value={s}>
                {s}
              </option>
            ))}
          </select>
        </label>
        <label className="tool">
          <span>Species</span>
          <select aria-label="Filter by species" value={filter.species} onChange={setF('species')}>
            <option value="">All species ({lists.species.length})</option>
            {lists.species.map((s) => (
              <option key={s}>{s}</option>
            ))}
          </select>
        </label>
        <label className="tool">
          <span>Season</span>
          <select aria-label="Filter by season" value={filter.season} onChange={setF('season')}>
            <option value="">All seasons</option>
            {lists.season.map((s) => (
              <option key={s}>{s}</option>
            ))}
          </select>
        </label>
        <button type="button" className="button is-quiet" onClick={() => setFilter(noFilter)} disabled={filter === noFilter}>
          Clear filters
        </button>
        <span className="toolbar-gap" />
        <span className="tool-count" aria-live="polite">
          {selected.length ? `${selected.length} ticked:` : 'Tick rows, then:'}
        </span>
        <button type="button" className="button" disabled={!includedSel.length} onClick={() => setAsk({ kind: 'leave-out', ids: includedSel, title: `Leave out ${includedSel.length} record${includedSel.length === 1 ? '' : 's'}?`, detail: 'They stay in the grid, marked as left out, and are not used in the analysis.', initial: '' })}>
          Leave out…
        </button>
        <button type="button" className="button" disabled={!excludedSel.length} onClick={() => edit({ kind: 'include', recordIds: excludedSel })}>
          Take back
        </button>
        <button type="button" className="button" disabled={!withEffort.length} onClick={() => setAsk({ kind: 'convert', ids: withEffort })}>
          Effort unit…
        </button>
      </div>
      {siteList.banner}
      {cleanedExport.banner}
      <LinkedRecordsNote link={filter.flag === 'linked' ? filter.link : undefined} outliers={outliers} showingOutliers={filter.flag === 'model-outliers'} onClear={() => setFilter(noFilter)} />
      {note && (
        <div className="problem" role="alert">
          {note}{' '}
          <button type="button" className="button is-quiet is-small" onClick={() => setNote(null)}>
            Dismiss
          </button>
        </div>
      )}
      {cleaned.conflicts.length > 0 && (
        <div className="problem" role="status">
          {cleaned.conflicts.length} change{cleaned.conflicts.length === 1 ? '' : 's'} no longer fit the records as they are now: {cleaned.conflicts[0].message}
        </div>
      )}
      <div className="records-body">
        <div className="records-main">
          <RecordsGrid records={cleaned.records} set={set} filter={filter} outliers={outliers} effortUnit={set.effortUnit} onEdit={onEdit} onSelection={setSelected} onShown={setShown} />
          <div className="grid-foot">
            <p data-testid="records-shown">
              Showing {fmt.format(shown)} of {fmt.format(cleaned.records.length)} records. Double-click a cell, or press Enter on it, to correct it; a site, date or effort applies to its whole visit row.
            </p>
            <label className="reason-field">
              <span>Reason for next changes</span>
              <input value={reason} onChange={(e) => setReason(e.target.value)} placeholder="e.g. field card checked" aria-label="Reason for the next changes" />
            </label>
          </div>
        </div>
        <aside className="records-side" aria-label="Findings and changes">
          <div className="tabs" role="tablist" aria-label="Findings and changes" onKeyDown={tablistKeys}>
            <button type="button" role="tab" aria-selected={tab === 'findings'} className={tab === 'findings' ? 'tab is-current' : 'tab'} onClick={() => setTab('findings')}>
              Findings <span className="tab-count">{open}</span>
            </button>
            <button type="button" role="tab" aria-selected={tab === 'log'} className={tab === 'log' ? 'tab is-current' : 'tab'} onClick={() => setTab('log')}>
              Changes <span className="tab-count">{log.entries.length}</span>
            </button>
          </div>
          <div className="side-body" ref={sideRef}>
            {tab === 'findings' ? (
              <FindingsPanel rows={findingRows} height={Math.max(200, sideHeight - 48)} showFile={project.sources.length > 1} onMerge={merge} onLeaveOut={leaveOutCopy} onShow={showFinding} outliers={outliers} onShowLink={(l) => setFilter(linkedFilter(l))} />
            ) : (
              <AuditLog log={log} set={set} height={Math.max(200, sideHeight - 48)} onRevert={revert} />
            )}
          </div>
        </aside>
      </div>
      {ask?.kind === 'leave-out' && (
        <ReasonDialog
          title={ask.title}
          detail={ask.detail}
          initial={ask.initial}
          confirm="Leave out"
          onDone={(reason) => {
            const ids = ask.ids;
            setAsk(null);
            if (reason) edit({ kind: 'exclude', recordIds: ids, reason });
          }}
        />
      )}
      {siteList.dialog}
      {ask?.kind === 'convert' && (
        <ConvertEffortDialog
          count={ask.ids.length}
          unit={set.effortUnit}
          onDone={(r) => {
            const ids = ask.ids;
            setAsk(null);
            if (r) edit({ kind: 'convert-unit', field: 'effort', recordIds: ids, factor: r.factor, fromUnit: r.fromUnit, toUnit: r.toUnit, ...(r.reason ? { reason: r.reason } : because) });
          }}
        />
      )}
    </section>
  );
}
