import { useCallback, useEffect, useMemo, useRef } from 'react';
import { AgGridReact, type CustomCellRendererProps } from 'ag-grid-react';
import {
  AllCommunityModule,
  ModuleRegistry,
  type CellClassParams,
  type CellEditRequestEvent,
  type ColDef,
  type GridApi,
  type IRowNode,
  type ValueFormatterParams,
} from 'ag-grid-community';
import type { CleaningRecord } from '@shared/cleaning/record';
import { recordsGridTheme } from './grid-theme';
import { isEdited } from './cleaned';
import { flagLabel, settledFor } from '@shared/cleaning/finding-flags';
import { isFiltering, recordPredicate, type RecordFilter } from './record-filter';
import type { RecordSet } from './record-set';
import { outlierOf, outlierText, probabilityText, type ModelOutliers } from '../models/diagnostics/model-outliers';

ModuleRegistry.registerModules([AllCommunityModule]);

/**
 * The cleaning grid: every record of the project in its cleaned form (raw +
 * log), virtualised by the grid. Edits do not change the row data; they are
 * handed to `onEdit` and come back as a log entry.
 */
interface GridContext {
  set: RecordSet;
  /** Model-based outlier flags (from the Models stage), null when none or out of date. */
  outliers: ModelOutliers | null;
}

const statusWords: Record<string, string> = {
  counted: 'counted',
  'not-surveyed': 'not surveyed',
  present: 'present, no count',
  'at-least': 'at least',
  approximate: 'about',
  invalid: 'unreadable',
};

function FlagsCell(props: CustomCellRendererProps<CleaningRecord, unknown, GridContext>) {
  const rec = props.data;
  if (!rec) return null;
  const { set, outliers } = props.context;
  const mine = set.findingsOf.get(rec.id) ?? [];
  const outlier = outlierOf(outliers, rec);
  if (mine.length === 0 && !outlier) return null;
  const raw = set.rawById.get(rec.id);
  return (
    <span className="chips">
      {outlier && outliers && (
        <span className="chip chip-model" data-probability={outlier.probability} title={outlierText(outliers, outlier)}>
          model {probabilityText(outlier.probability)}
        </span>
      )}
      {mine.map((k) => {
        const f = set.findings[k];
        const settled = settledFor(f, rec, raw);
        return (
          <span key={k} className={`chip chip-${f.severity}${settled ? ' is-settled' : ''}`} title={`${f.message}${settled ? ' (dealt with)' : ''}`}>
            {flagLabel(f.code)}
          </span>
        );
      })}
    </span>
  );
}

function editedRule(name: string) {
  return {
    'is-edited': (p: CellClassParams<CleaningRecord, unknown, GridContext>) => !!p.data && isEdited(p.data, p.context.set.rawById.get(p.data.id), name),
  };
}

function numberText(p: ValueFormatterParams<CleaningRecord>): string {
  const v = p.value;
  if (v === null || v === undefined || v === '') return '';
  return typeof v === 'number' ? String(Number(v.toFixed(3))) : String(v);
}

// Grid options that never change, kept outside the component so that a
// re-render does not hand the grid new objects (which makes it redo work).
const defaultColDef: ColDef<CleaningRecord> = { resizable: true, sortable: true };
const rowSelection = { mode: 'multiRow', checkboxes: true, headerCheckbox: true, selectAll: 'filtered', enableClickSelection: false } as const;
const rowClassRules = { 'is-excluded': (p: { data?: CleaningRecord }) => p.data?.excluded !== undefined };
const getRowId = (p: { data: CleaningRecord }) => p.data.id;

export interface RecordsGridProps {
  records: CleaningRecord[];
  set: RecordSet;
  filter: RecordFilter;
  /** Model-based outlier flags to show (null: none, or out of date). */
  outliers?: ModelOutliers | null;
  effortUnit?: string;
  onEdit(recordId: string, field: string, typed: unknown): void;
  onSelection(ids: string[]): void;
  onShown(count: number): void;
}

export function RecordsGrid({ records, set, filter, outliers = null, effortUnit, onEdit, onSelection, onShown }: RecordsGridProps) {
  const api = useRef<GridApi<CleaningRecord> | null>(null);
  const context = useRef<GridContext>({ set, outliers });
  context.current.set = set;
  context.current.outliers = outliers;
  const predicate = useRef<(r: CleaningRecord) => boolean>(() => true);
  const filtering = useRef(false);

  const columnDefs = useMemo<ColDef<CleaningRecord>[]>(() => {
    const text = (id: string, header: string, width: number, editable = false): ColDef<CleaningRecord> => ({
      colId: id, headerName: header, field: `fields.${id}` as ColDef<CleaningRecord>['field'], width, editable, cellClassRules: editable ? editedRule(id) : undefined,
      headerTooltip: editable ? 'Double-click a cell, or press Enter on it, to correct it; the change goes into the log.' : undefined,
    });
    return [
      { colId: 'flags', headerName: 'Flags', width: 150, cellRenderer: FlagsCell, sortable: false },
      text('site', 'Site', 160, true),
      text('date', 'Date', 100, true),
      text('species', 'Species', 130, true),
      { ...text('count', 'Count', 70, true), type: 'rightAligned', valueFormatter: numberText },
      { ...text('effort', effortUnit ? `Effort (${effortUnit})` : 'Effort', 128, true), type: 'rightAligned', valueFormatter: numberText },
      { ...text('code', 'As written', 96), headerTooltip: 'The count cell as it was in the workbook' },
      text('season', 'Season', 76),
      text('visit', 'Visit', 60),
      text('observer', 'Observer', 86),
      // The visit covariates of the counts sheet (water temperature, wind ...), one column each, edited like the fields above.
      ...set.covariates.map((c): ColDef<CleaningRecord> => ({
        colId: c.field, headerName: c.name, width: Math.max(96, Math.min(180, 16 + c.name.length * 8)), editable: true, cellClassRules: editedRule(c.field),
        valueGetter: (p) => p.data?.fields[c.field] ?? null,
        headerTooltip: `Recorded on each visit (from the counts sheet). Double-click a cell to correct it; the change goes into the log and to every record of the visit's row.`,
        ...(c.numeric ? { type: 'rightAligned', valueFormatter: numberText } : {}),
      })),
      { ...text('status', 'Reading', 120), valueFormatter: (p) => statusWords[String(p.value)] ?? String(p.value ?? '') },
      { colId: 'excluded', headerName: 'Left out because', width: 200, valueGetter: (p) => p.data?.excluded ?? '' },
      {
        colId: 'place', headerName: 'Cell', width: 150,
        valueGetter: (p) => {
          const pl = p.data ? set.places.get(p.data.id) : undefined;
          return pl ? `${pl.sheet}!${pl.column}${pl.row}` : '';
        },
        tooltipValueGetter: (p) => (p.data ? set.places.get(p.data.id)?.fileName : undefined),
      },
    ];
  }, [set, effortUnit]);

  useEffect(() => {
    predicate.current = recordPredicate(filter, set, outliers);
    filtering.current = isFiltering(filter);
    api.current?.onFilterChanged();
    // A linked set of records is brought into view from its first record.
    if (filter.link) {
      const first = api.current?.getDisplayedRowAtIndex(0);
      if (first) api.current?.ensureNodeVisible(first, 'top');
    }
  }, [filter, set, outliers]);

  useEffect(() => {
    api.current?.refreshCells({ columns: ['flags'], force: true });
  }, [outliers]);

  const isExternalFilterPresent = useCallback(() => filtering.current, []);
  const doesExternalFilterPass = useCallback((node: IRowNode<CleaningRecord>) => (node.data ? predicate.current(node.data) : false), []);
  const onSelectionChanged = useCallback((e: { api: GridApi<CleaningRecord> }) => onSelection(e.api.getSelectedRows().map((r) => r.id)), [onSelection]);
  const onModelUpdated = useCallback((e: { api: GridApi<CleaningRecord> }) => onShown(e.api.getDisplayedRowCount()), [onShown]);
  const onGridReady = useCallback((e: { api: GridApi<CleaningRecord> }) => {
    api.current = e.api;
    // A filter set before the grid was ready (records linked from a chart) is applied now.
    if (filtering.current) e.api.onFilterChanged();
  }, []);

  const onCellEditRequest = useCallback(
    (e: CellEditRequestEvent<CleaningRecord>) => {
      const id = e.column.getColId();
      if (e.data && e.newValue !== e.oldValue) onEdit(e.data.id, id, e.newValue);
    },
    [onEdit],
  );

  return (
    <div className="records-grid" data-testid="records-grid">
      <AgGridReact<CleaningRecord>
        theme={recordsGridTheme}
        rowData={records}
        columnDefs={columnDefs}
        defaultColDef={defaultColDef}
        context={context.current}
        getRowId={getRowId}
        readOnlyEdit
        onCellEditRequest={onCellEditRequest}
        rowSelection={rowSelection}
        rowClassRules={rowClassRules}
        isExternalFilterPresent={isExternalFilterPresent}
        doesExternalFilterPass={doesExternalFilterPass}
        onGridReady={onGridReady}
        onSelectionChanged={onSelectionChanged}
        onModelUpdated={onModelUpdated}
        tooltipShowDelay={400}
        stopEditingWhenCellsLoseFocus
        suppressColumnVirtualisation
        animateRows={false}
        overlayNoRowsTemplate="<span>No records match the filters.</span>"
      />
    </div>
  );
}
