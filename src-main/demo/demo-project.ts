import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { appendEdit } from '@shared/cleaning/edit-log';
import type { EditDraft, EditLog } from '@shared/cleaning/edit-entry';
import { emptyLog } from '@shared/cleaning/edit-log';
import { createProjectDocument, type ProjectDocument } from '@shared/project/document';
import type { ProjectModel } from '@shared/project/schema';
import type { SiteSheetLink } from '@shared/project/site-sheet-link';
import type { LoadedSource } from '@shared/host/contract';
import type { PlantedProblem } from '@shared/demo/mess';
import { PROGRAMME_NAME } from '@shared/demo/programme';
import { DEMO_TRUTH } from '@shared/demo/truth';
import { recordsOfSource } from '@shared/analysis/loaded-records';
import { cleanedAnalysisOf } from '@shared/analysis/cleaned-analysis';
import { findColumn, levelsOf, sortLevels } from '@shared/data/table';
import { parseModelSpec, type ModelSpec } from '@shared/model/spec';
import demoSpecJson from '../../resources/demo/trend-spec.json';
import { writeDemoWorkbooks } from './write-workbooks';
import { readWorkbook, type ImportedSourceData } from '../services/record-import';
import { mappingsMember } from '../project/stored-mappings';

/**
 * The demo programme as a project: the season workbooks imported as the
 * app's "open demo" imports them, the `Ponds` sheet of the last season linked
 * as the site list (area in m², habitat), and, with `recorded`, the cleaning
 * an analyst would record for the planted problems (resources/demo/README.md)
 * and the model chosen per species.
 *
 * The recorded cleaning, one action per planted problem that needs one, in
 * the entries the cleaning grid makes:
 *   pond-name-variant   merge-name of the variant into the pond's name
 *   duplicated-row      exclude every record of the repeated visit row
 *   missing-minutes     set-value of the visit's effort on each of its records
 *                       (the listening minutes from the field card)
 * Left as the import reads them, as the findings advise: "NS" (not
 * surveyed: kept missing, not zero), "x" (present, not counted), ">50" (used
 * as at least 50), counts and dates typed as text (read correctly).
 *
 * Models: the demo trend spec (resources/demo/trend-spec.json) in the app's
 * table columns, per species: negative binomial, fixed pond effect, annual
 * season trend from 2012, offsets log effort (hours) and log area (ha). The
 * spec's water temperature is left out of these models (the records carry it
 * as the visit covariate water_temp_c, which the analyst may add in the
 * builder). For the species simulated with extra zeros
 * (natterjack toad), the zero-inflated negative binomial with the same terms
 * is added and chosen (test/analysis/demo-project.test.ts checks that the
 * engine's AIC supports it).
 */
export interface DemoProjectOptions {
  seed?: number;
  /** Add the recorded cleaning and the chosen models (default true). */
  recorded?: boolean;
  /** Where the workbooks are written (kept); by default a temporary folder, removed afterwards. */
  dir?: string;
}

export interface DemoProjectResult {
  document: ProjectDocument;
  /** The imports, for a session that keeps their cells. */
  imports: ImportedSourceData[];
  planted: PlantedProblem[];
}

const SITE_SHEET = 'Ponds';
/** The recorded edits' times: after the last season's counts came in (fixed, so the demo project is the same every time). */
const RECORDED_FROM = Date.UTC(2026, 6, 1, 9, 0, 0);

/** The demo spec's columns (the clean CSV's names) as the app's analysis table names them. */
function appColumn(column: string, effortColumn: string | null): string | null {
  const names: Record<string, string | null> = { pond: 'site', season: 'season', count: 'count', minutes: effortColumn, area_m2: 'area_ha', temp_c: null };
  return column in names ? names[column] : column;
}

export function demoSpecInAppColumns(effortColumn: string | null): ModelSpec {
  const spec = parseModelSpec(demoSpecJson, 'resources/demo/trend-spec.json');
  const col = (c: string) => appColumn(c, effortColumn);
  return parseModelSpec({
    ...spec,
    response: col(spec.response) ?? spec.response,
    predictors: spec.predictors.filter((t) => t.type === 'interaction' ? t.columns.every((c) => col(c)) : col(t.column)).map((t) => (t.type === 'interaction' ? t : { ...t, column: col(t.column)! })),
    offsets: spec.offsets.filter((o) => col(o.column)).map((o) => ({ ...o, column: col(o.column)! })),
    ...(spec.site ? { site: { ...spec.site, column: col(spec.site.column) ?? spec.site.column } } : {}),
    ...(spec.time ? { time: { ...spec.time, column: col(spec.time.column) ?? spec.time.column } } : {}),
  });
}

interface RowRecords {
  ids: string[];
  values: Map<string, string | number | null>;
}

/** The records of one spreadsheet row of one source: their ids and (for reading old values) the value of a field. */
function rowRecords(source: LoadedSource, sheet: string, row: number, field: string): RowRecords {
  const u = recordsOfSource(source);
  const ids: string[] = [];
  const values = new Map<string, string | number | null>();
  u.raw.forEach((r, i) => {
    if (String(u.sheet[i]) === sheet && Number(u.row[i]) === row) {
      ids.push(r.id);
      values.set(r.id, r.fields[field] ?? null);
    }
  });
  return { ids, values };
}

/** The log entries an analyst records for one planted problem (none where the import's reading stands). */
function editsFor(p: PlantedProblem, source: LoadedSource): EditDraft[] {
  const where = `${p.file}, ${p.sheet} row ${p.row}`;
  if (p.kind === 'pond-name-variant') {
    const { values } = rowRecords(source, p.sheet, p.row, 'site');
    const from = String([...values.values()][0] ?? p.found.trim());
    return [{ kind: 'merge-name', field: 'site', from, into: String(p.cleanValue), reason: `Pond name typed another way at ${where}; the same pond as "${p.cleanValue}" on the Ponds sheet.` }];
  }
  if (p.kind === 'duplicated-row') {
    const { ids } = rowRecords(source, p.sheet, p.row, 'site');
    return [{ kind: 'exclude', recordIds: ids, reason: `Visit entered twice: ${where} repeats row ${p.row - 1}.` }];
  }
  if (p.kind === 'missing-minutes') {
    const { ids, values } = rowRecords(source, p.sheet, p.row, 'effort');
    return ids.map((recordId) => ({ kind: 'set-value', recordId, field: 'effort', old: values.get(recordId) ?? null, new: Number(p.cleanValue), reason: `Listening minutes left blank at ${where}; ${p.cleanValue} minutes from the field card.` }));
  }
  return [];
}

export function recordedCleaning(planted: readonly PlantedProblem[], sources: readonly LoadedSource[]): EditLog {
  let log = emptyLog();
  planted.forEach((p, k) => {
    const source = sources.find((s) => s.summary.fileName === p.file);
    if (!source) return;
    const time = new Date(RECORDED_FROM + k * 60_000).toISOString();
    for (const d of editsFor(p, source)) log = appendEdit(log, { ...d, author: 'Demo analyst', time } as EditDraft);
  });
  return log;
}

function demoModels(species: readonly string[], effortColumn: string | null): ProjectModel[] {
  const nb = demoSpecInAppColumns(effortColumn);
  const zinb = parseModelSpec({ ...nb, distribution: 'zinb', zeroPredictors: [] });
  const models: ProjectModel[] = [];
  species.forEach((sp) => {
    const zeroInflated = DEMO_TRUTH.species.some((t) => t.label === sp && t.zeroInflation > 0);
    models.push({ id: `m${models.length + 1}`, name: 'Negative binomial, site fixed, season annual', species: sp, spec: nb, chosen: !zeroInflated, dropBadOffsetRows: false });
    if (zeroInflated) models.push({ id: `m${models.length + 1}`, name: 'Zero-inflated negative binomial, site fixed, season annual', species: sp, spec: zinb, chosen: true, dropBadOffsetRows: false });
  });
  return models;
}

export async function demoProjectWithImports(opts: DemoProjectOptions = {}): Promise<DemoProjectResult> {
  const dir = opts.dir ?? (await mkdtemp(join(tmpdir(), 'tallywise-demo-')));
  try {
    const { files, planted } = await writeDemoWorkbooks(dir, { seed: opts.seed });
    const imports: ImportedSourceData[] = [];
    for (const [k, file] of files.entries()) {
      const reading = await readWorkbook(file, { keepSheets: k === files.length - 1 ? [SITE_SHEET] : [] });
      if (!reading.data) throw new Error(`The demo workbook ${file} asks a question on import; this should not happen.`);
      imports.push(reading.data);
    }
    const last = imports[imports.length - 1];
    const sites: SiteSheetLink = { sourceId: last.stored.id, sheet: SITE_SHEET, headerRow: 1, siteColumn: 'Pond', area: { column: 'Area (m²)', unit: 'm2' }, covariates: ['Habitat'] };
    const doc: ProjectDocument = {
      ...createProjectDocument(PROGRAMME_NAME),
      sources: imports.map((i) => i.stored),
      mapping: mappingsMember(imports.map((i) => i.mapping)),
      sites,
    };
    if (opts.recorded === false) return { document: doc, imports, planted };
    const loaded = imports.map((i) => i.loaded);
    doc.cleaning = recordedCleaning(planted, loaded);
    const grid = last.stored.sheets.find((g) => g.name === SITE_SHEET) ?? null;
    const { analysis, roles } = cleanedAnalysisOf(loaded, doc.cleaning, { link: sites, grid, fileName: last.stored.fileName });
    const speciesCol = findColumn(analysis.table, 'species');
    const species = speciesCol ? sortLevels(levelsOf(speciesCol)) : [];
    doc.models = demoModels(species, roles.effort);
    doc.report = { outputFolder: null, species };
    return { document: doc, imports, planted };
  } finally {
    if (!opts.dir) await rm(dir, { recursive: true, force: true });
  }
}

/** The demo project with its recorded cleaning and chosen models. */
export async function demoProject(opts?: { seed?: number }): Promise<ProjectDocument> {
  return (await demoProjectWithImports({ seed: opts?.seed })).document;
}
