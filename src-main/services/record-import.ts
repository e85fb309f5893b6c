import { createHash } from 'node:crypto';
import { basename } from 'node:path';
import { listSheets, readBytes, readGrids } from '../import/import-file';
import type { SheetGrid as ReadGrid } from '@shared/import/cells';
import type { ImportedTable, SourceInfo } from '@shared/import/imported-table';
import { tableFromGrids } from '@shared/import/table-from-grids';
import type { DateOrder } from '@shared/import/text-dates';
import { ImportError } from '@shared/import/import-error';
import type { ImportedSource } from '@shared/project/imported-source';
import { recordId, type ColumnRoles, type LoadedSource } from '@shared/host/contract';
import { checkMappedTable } from '@shared/import/check-table';
import { applyMapping } from '@shared/import/mapping';
import { rolesToTemplate } from '@shared/import/roles-template';
import { fromCanonicalEffort, isEffortUnit } from '@shared/import/units';
import { planRoles, type RolePlan } from './column-roles';
import { toPageFindings } from './record-checks';
import { recordsToColumns } from './record-wire';
import { readStoredGrid, storeGrid } from './source-cells';
import { importReporter, type ImportProgress } from './import-progress';
import { stopIfCancelled } from '../import/import-cancelled';
import { nextTurn } from '../import/next-turn';

/**
 * The import service behind `import:read-workbook`: a workbook in, its
 * records, findings and (when a date style is in doubt) questions out.
 * It also gives the cells and the mapping the project keeps, from which
 * `rebuildSource` redoes the same import when a project is opened.
 */
export interface SourceMapping {
  sourceId: string;
  roles: ColumnRoles;
  mappedBy: RolePlan['mappedBy'];
  dateOrder: DateOrder;
  source: SourceInfo;
  /** The sheets the records were read from; other stored sheets (a site list) are kept, not read as records. Absent: every stored sheet. */
  recordSheets?: string[];
}

export interface ImportedSourceData {
  loaded: LoadedSource;
  stored: ImportedSource;
  mapping: SourceMapping;
}

export interface WorkbookReading {
  data: ImportedSourceData | null;
  questions: ImportedTable['questions'];
  headers: string[];
  /** Why the column roles must be chosen by hand (the headers did not tell), or null. */
  rolesNeeded: string | null;
}

/**
 * The records and findings of one table: its roles as a mapping template,
 * applied and checked by the shared code `tallywise check` uses. The page
 * shows effort in the unit of its column, so it is given back in that unit.
 */
function loadedFrom(table: ImportedTable, plan: RolePlan, dateOrder: DateOrder, meta: Omit<ImportedSource, 'sheets'>): LoadedSource {
  const template = rolesToTemplate(plan.roles, table.columns.map((c) => c.name), dateOrder);
  const mapped = applyMapping(table, template, { dateOrder });
  const { records } = mapped;
  const unit = template.columns.find((c) => c.role === 'effort')?.unit;
  const effortUnit = isEffortUnit(unit) ? unit : undefined;
  const ids = records.map((r) => recordId(meta.id, r.sheet, r.column, r.row));
  const { findings, notes } = toPageFindings(checkMappedTable(table, template, mapped, meta.fileName), ids);
  const layout = table.findings.map((f) => ({ code: f.code, severity: f.severity, message: f.message, fix: f.fix, sheet: f.sheet, row: f.row }));
  return {
    summary: {
      id: meta.id,
      fileName: meta.fileName,
      sheet: table.sheets.join(', '),
      size: meta.size,
      sha256: meta.sha256,
      importedAt: meta.importedAt,
      records: records.length,
      effortUnit,
      mappedBy: plan.mappedBy,
      notes: [...layout, ...notes],
    },
    records: recordsToColumns(records, meta.id, (r) => (r.effort === null || !effortUnit ? r.effort : fromCanonicalEffort(r.effort, effortUnit))),
    findings,
  };
}

/** The workbook's sheets other than the records' one (the named sheet, else the first visible), so a site list can be linked later. */
async function otherSheets(path: string, recordSheet: string | undefined): Promise<string[]> {
  const sheets = await listSheets(path);
  const records = recordSheet ?? (sheets.find((s) => !s.hidden) ?? sheets[0])?.name;
  return sheets.map((s) => s.name).filter((n) => n !== '' && n !== records);
}

/**
 * `keepSheets` names further sheets whose cells the project keeps beside the
 * records' sheet (a list of sites with their areas), not read as records;
 * by default every other sheet of the workbook is kept.
 */
export async function readWorkbook(
  path: string,
  opts: { sheet?: string; dateOrder?: DateOrder; roles?: ColumnRoles; keepSheets?: readonly string[]; onProgress?: (progress: ImportProgress) => void; signal?: AbortSignal } = {},
): Promise<WorkbookReading> {
  const fileName = basename(path);
  const { signal } = opts;
  const keepSheets = opts.keepSheets ?? (await otherSheets(path, opts.sheet));
  const report = importReporter(opts.onProgress, keepSheets.length);
  /** Between stages: say the next stage has begun, let a cancel arrive, and stop if it did. */
  const checkpoint = async (stage: ImportProgress['stage']) => {
    report.stage(stage);
    await nextTurn();
    stopIfCancelled(signal, fileName);
  };
  report.stage('reading-file');
  const bytes = await readBytes(path);
  const { grids, source } = await readGrids(path, { sheet: opts.sheet, signal, onProgress: report.records });
  const kept = keepSheets.length ? (await readGrids(path, { sheets: keepSheets, signal, onProgress: report.kept })).grids.filter((g) => !grids.some((r) => r.sheet === g.sheet)) : [];
  const named: ReadGrid[] = grids.map((g) => ({ ...g, file: fileName }));
  await checkpoint('checking');
  const first = tableFromGrids(named, source, { dateOrder: opts.dateOrder ?? 'dmy' });
  const headers = first.columns.map((c) => c.name);
  let plan: RolePlan;
  try {
    plan = planRoles(first, fileName, opts.roles);
  } catch (err) {
    if (!opts.roles && err instanceof ImportError && err.code === 'bad-template') return { data: null, questions: [], headers, rolesNeeded: err.message };
    throw err;
  }
  const dateOrder = opts.dateOrder ?? plan.dateOrder;
  // Ask about the date style only for the column that holds the dates.
  const asked = dateOrder ? [] : tableFromGrids(named, source).questions.filter((q) => q.columnName === plan.roles.date);
  if (asked.length) return { data: null, questions: asked, headers, rolesNeeded: null };
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  const meta = { id: sha256.slice(0, 12), fileName, size: bytes.length, sha256, importedAt: new Date().toISOString() };
  const order = dateOrder ?? 'dmy';
  const table = order === 'dmy' ? first : tableFromGrids(named, source, { dateOrder: order });
  await checkpoint('building');
  const loaded = loadedFrom(table, plan, order, meta);
  const stored = { ...meta, sheets: [...grids, ...kept].map(storeGrid) };
  // The last chance to stop: after this the records are handed over whole.
  await checkpoint('done');
  return {
    data: {
      loaded,
      stored,
      mapping: { sourceId: meta.id, roles: plan.roles, mappedBy: plan.mappedBy, dateOrder: order, source, ...(kept.length ? { recordSheets: grids.map((g) => g.sheet) } : {}) },
    },
    questions: [],
    headers,
    rolesNeeded: null,
  };

}

/** Redoes a source's import from the cells the project kept. */
export function rebuildSource(stored: ImportedSource, mapping: SourceMapping | undefined): LoadedSource {
  if (!mapping) {
    throw new ImportError('bad-template', `The project keeps the cells of ${stored.fileName} but not how its columns were mapped; import the workbook again.`, { file: stored.fileName });
  }
  const sheets = mapping.recordSheets ? stored.sheets.filter((g) => mapping.recordSheets!.includes(g.name)) : stored.sheets;
  const grids = sheets.map((g) => readStoredGrid(g, stored.fileName));
  const table = tableFromGrids(grids, mapping.source, { dateOrder: mapping.dateOrder });
  const { sheets: _cells, ...meta } = stored;
  void _cells;
  return loadedFrom(table, { roles: mapping.roles, mappedBy: mapping.mappedBy }, mapping.dateOrder, meta);
}
