import { z } from 'zod';
import { channelNames, type ChannelName, type HostCommand } from './channels';
import { projectDocumentSchema } from '../project/schema';
import { importedSourceSchema } from '../project/imported-source';
import { sheetGridSchema } from '../project/sheet-grid';
import { effortUnits } from '../import/units';
import type { ReportDocument } from '../report/model';
import { exportTableKeys, type CleanedDataExport } from '../export/export-model';

export { bridgeGlobal, commandChannel, hostCommands, importCancelledName, progressChannel, type HostCommand } from './channels';

/**
 * The host contract: every call the renderer can make of the main process,
 * as one map from channel name (`domain:verb`) to the schema of its argument
 * and the type of its result. Main registers one handler per channel from
 * service objects, preload exposes one function per channel and nothing
 * else, and the renderer calls them through a typed client.
 */

export const programmeOverviewSchema = z.object({
  programme: z.string(),
  description: z.string(),
  sites: z.array(z.object({ name: z.string(), habitat: z.string(), areaM2: z.number(), seasonsSurveyed: z.number() })),
  seasons: z.array(z.object({ season: z.number(), visits: z.number(), sites: z.number() })),
  species: z.array(z.object({ name: z.string(), total: z.number(), sitesPresent: z.number() })),
  sourceFiles: z.array(z.string()),
  records: z.number(),
});
export type ProgrammeOverview = z.infer<typeof programmeOverviewSchema>;

export const appInfoSchema = z.object({ name: z.string(), version: z.string(), platform: z.string() });
export type AppInfo = z.infer<typeof appInfoSchema>;

const empty = z.object({}).strict();
const filePath = z.string().min(1, 'a file path is needed');

// ---- Records: import, checks and the project around them ----------------

/**
 * Which column of a sheet plays which part. Wide sheets list their species
 * columns (one count column per species); long sheets name one species
 * column and one count column.
 */
export const columnRolesSchema = z
  .object({
    site: z.string().min(1),
    date: z.string().optional(),
    season: z.string().optional(),
    visit: z.string().optional(),
    observer: z.string().optional(),
    effort: z.string().optional(),
    effortUnit: z.enum(effortUnits).optional(),
    speciesColumns: z.array(z.string().min(1)).optional(),
    species: z.string().optional(),
    count: z.string().optional(),
    /** Visit covariates: further columns recorded on each visit (water temperature, wind ...), offered as predictors. */
    covariates: z.array(z.string().min(1)).optional(),
  })
  .strict();
export type ColumnRoles = z.infer<typeof columnRolesSchema>;

/** The fields every record carries, in the order the grid shows them. */
export const recordFields = ['site', 'date', 'season', 'visit', 'observer', 'species', 'count', 'effort', 'status', 'code'] as const;
export type RecordField = (typeof recordFields)[number];
/** Fields the analyst may edit in the cleaning grid. */
export const editableFields = ['site', 'species', 'date', 'count', 'effort'] as const satisfies readonly RecordField[];

/**
 * One column of values packed into a few strings, so that 200k records cross
 * the bridge as a dozen values rather than millions (a structured clone or a
 * test bridge pays per value). Texts: the distinct texts and, comma-joined,
 * each record's index into them (-1 for none). Numbers: comma-joined, an
 * empty place for none.
 */
export const packedColumnSchema = z.union([
  z.object({ levels: z.array(z.string()), codes: z.string() }).strict(),
  z.object({ numbers: z.string() }).strict(),
]);
export type PackedColumn = z.infer<typeof packedColumnSchema>;

/** Records as packed columns, all of length `n`; a record's id follows from its source and cell (see recordId). */
export const recordColumnsSchema = z.object({
  n: z.number().int().min(0),
  sourceId: z.string(),
  sheet: packedColumnSchema,
  row: packedColumnSchema,
  /** Letter of the count cell. */
  column: packedColumnSchema,
  /** Letters of the visit columns, for pointing at a site, date or effort cell. */
  fieldColumns: z.record(z.string(), z.string()),
  values: z.record(z.string(), packedColumnSchema),
  /** Names of the visit covariates; each one's values are in `values` under its field (`cov:<name>`, see visit-covariates.ts). */
  covariates: z.array(z.string()).optional(),
});
export type RecordColumns = z.infer<typeof recordColumnsSchema>;

/** The stable id of the record of one count cell: `<source>:<sheet>!<column><row>`. */
export function recordId(sourceId: string, sheet: string, column: string, row: number): string {
  return `${sourceId}:${sheet}!${column}${row}`;
}

/** Something a check found in the records: where, what, the fix, and the records it concerns. */
export const recordFindingSchema = z.object({
  id: z.string(),
  code: z.string(),
  severity: z.enum(['error', 'warning', 'info']),
  file: z.string().optional(),
  sheet: z.string().optional(),
  row: z.number().optional(),
  column: z.string().optional(),
  /** The record field the finding is about; none for a whole-visit finding such as a repeated row. */
  field: z.string().optional(),
  message: z.string(),
  fix: z.string(),
  recordIds: z.array(z.string()),
  /** A name variant's suggested merge. */
  merge: z.object({ field: z.string(), from: z.string(), into: z.string() }).optional(),
  /** Spreadsheet row this one repeats (repeated visit). */
  repeats: z.number().optional(),
});
export type RecordFinding = z.infer<typeof recordFindingSchema>;

export const sourceSummarySchema = z.object({
  id: z.string(),
  fileName: z.string(),
  sheet: z.string(),
  size: z.number(),
  sha256: z.string(),
  importedAt: z.string(),
  records: z.number(),
  /** Unit of the effort column as written (minutes, hours, km ...), when it is known. */
  effortUnit: z.string().optional(),
  /** How the columns were mapped: the built-in demo template or the roles given. */
  mappedBy: z.enum(['demo-template', 'roles', 'guessed']),
  /** Notes on the layout (titles above the header, notes below), not about single records. */
  notes: z.array(z.object({ code: z.string(), severity: z.string(), message: z.string(), fix: z.string(), sheet: z.string().optional(), row: z.number().optional() })),
});
export type SourceSummary = z.infer<typeof sourceSummarySchema>;

export const importQuestionSchema = z.object({
  code: z.literal('ambiguous-date-order'),
  sheet: z.string(),
  column: z.string(),
  columnName: z.string(),
  examples: z.array(z.string()),
  message: z.string(),
});

export const loadedSourceSchema = z.object({ summary: sourceSummarySchema, records: recordColumnsSchema, findings: z.array(recordFindingSchema) });
export type LoadedSource = z.infer<typeof loadedSourceSchema>;

/**
 * The project document as it crosses the bridge: the stored cells of each
 * source stay in the main process (which keeps them since the import or the
 * opening), so only the sources' identities travel.
 */
export const sourceRefSchema = importedSourceSchema.omit({ sheets: true });
export const wireDocumentSchema = projectDocumentSchema.extend({ sources: z.array(sourceRefSchema) });
export type WireDocument = z.infer<typeof wireDocumentSchema>;

export const openedProjectSchema = z.object({
  document: wireDocumentSchema,
  /** Null for a project not yet saved. */
  path: z.string().nullable(),
  name: z.string(),
  sources: z.array(loadedSourceSchema),
  /** Conversion steps when an older file was opened. */
  migrationSteps: z.array(z.string()),
});
export type OpenedProject = z.infer<typeof openedProjectSchema>;

export const recoveryOfferSchema = z.object({
  recoveryPath: z.string(),
  /** The project file the work belongs to; null for a project never saved. */
  projectPath: z.string().nullable(),
  savedAt: z.string(),
  programme: z.string().nullable(),
  edits: z.number(),
  problem: z.string().optional(),
});
export type RecoveryOffer = z.infer<typeof recoveryOfferSchema>;

/** A long job's name, chosen by the page, so that its progress events and its cancel find it. */
const jobId = z.string().regex(/^[\w.:-]{1,64}$/, 'a job id of 1 to 64 letters, digits, dots, colons or dashes');

/** The stages of an import, in the order they come. */
export const importStages = ['reading-file', 'reading-sheet', 'checking', 'building', 'done'] as const;
export type ImportStage = (typeof importStages)[number];

/**
 * How far a job has come, as main sends it on `progressChannel`: the stage,
 * the fraction of the whole job done (0 to 1), and for a sheet being read
 * which one of how many and the rows read so far.
 */
export interface JobProgress {
  jobId: string;
  stage: ImportStage;
  fraction: number;
  sheet?: string;
  /** 1-based. */
  sheetIndex?: number;
  sheetCount?: number;
  rowsRead?: number;
}

const projectPathOrNone = z.object({ path: filePath.nullable() }).strict();

/** A report document as it crosses the bridge: its outline is checked here, its content by the renderers. */
const reportDocumentSchema = z.custom<ReportDocument>(
  (v) => {
    const d = v as Partial<Record<keyof ReportDocument, unknown>> | null;
    return !!d && typeof d.title === 'string' && typeof d.subtitle === 'string' && typeof d.createdAt === 'string' && Array.isArray(d.sections) && Array.isArray(d.sheets) && Array.isArray(d.references) && typeof d.appendix === 'object';
  },
  { message: 'a report with a title, sections, an appendix, references and sheets is needed' },
);
const reportStem = z.string().regex(/^[^/\\:*?"<>|\u0000-\u001f]{1,120}$/, 'a file name without a folder or any of / \\ : * ? " < > |');

/** The cleaned-data export as it crosses the bridge: its outline is checked here; the writer blanks any cell that is not finite. */
const cleanedExportSchema = z.custom<CleanedDataExport>(
  (v) => {
    const d = v as Partial<Record<keyof CleanedDataExport, unknown>> | null;
    return (
      !!d && typeof d.title === 'string' && typeof d.createdAt === 'string' && Array.isArray(d.sheets) &&
      d.sheets.every((s) => !!s && typeof s.name === 'string' && (exportTableKeys as readonly unknown[]).includes(s.key) && Array.isArray(s.table?.columns) && Array.isArray(s.table?.rows))
    );
  },
  { message: 'an export with a title, a date and its tables (records, analysis, changes, about) is needed' },
);

/** Channel name → argument schema and result type. */
export const hostContract = {
  'app:info': { input: empty, output: appInfoSchema },
  'demo:overview': { input: empty, output: programmeOverviewSchema },
  'dialog:choose-open': {
    input: z.object({ title: z.string(), extensions: z.array(z.string()) }).strict(),
    output: z.object({ path: z.string().nullable() }),
  },
  'dialog:choose-save': {
    input: z.object({ title: z.string(), defaultName: z.string(), extensions: z.array(z.string()) }).strict(),
    output: z.object({ path: z.string().nullable() }),
  },
  'dialog:choose-folder': { input: z.object({ title: z.string() }).strict(), output: z.object({ path: z.string().nullable() }) },
  'file:reveal': { input: z.object({ path: filePath }).strict(), output: z.object({ ok: z.boolean() }) },
  /** Opens a file with the program the system uses for its kind (the report's PDF). */
  'file:open': { input: z.object({ path: filePath }).strict(), output: z.object({ ok: z.boolean() }) },
  /** A file's name (no folder) and the SHA-256 of its bytes, for a report's reproducibility appendix. */
  'file:fingerprint': { input: z.object({ path: filePath }).strict(), output: z.object({ name: z.string(), sha256: z.string() }) },
  'import:list-sheets': {
    input: z.object({ path: filePath }).strict(),
    output: z.object({ sheets: z.array(z.object({ name: z.string(), hidden: z.boolean() })) }),
  },
  'import:read-workbook': {
    input: z
      .object({ path: filePath, sheet: z.string().min(1).optional(), dateOrder: z.enum(['dmy', 'mdy']).optional(), roles: columnRolesSchema.optional(), jobId: jobId.optional() })
      .strict(),
    /**
     * `source` is null when something must be answered first, then asked again
     * with the answer: a date-style question, or (`rolesNeeded`, a message) which
     * columns play which part, when the headers do not tell.
     */
    output: z.object({
      source: loadedSourceSchema.nullable(),
      questions: z.array(importQuestionSchema),
      headers: z.array(z.string()),
      rolesNeeded: z.string().nullable(),
    }),
  },
  /**
   * Stops the import running under `jobId`: its call rejects with
   * `importCancelledName` and nothing of it is kept. `cancelled` is false when
   * no such import is running (it had already ended).
   */
  'import:cancel': { input: z.object({ jobId }).strict(), output: z.object({ cancelled: z.boolean() }) },
  /** `recorded`: with the demo's recorded cleaning and chosen models (src-main/demo/demo-project.ts). */
  'project:new-from-demo': { input: z.object({ recorded: z.boolean().optional() }).strict(), output: openedProjectSchema },
  'project:open': { input: z.object({ path: filePath, fromRecovery: z.boolean().optional() }).strict(), output: openedProjectSchema },
  'project:save': {
    input: z.object({ path: filePath, document: wireDocumentSchema }).strict(),
    output: z.object({ path: z.string(), name: z.string(), savedAt: z.string() }),
  },
  'project:autosave': {
    input: z.object({ path: filePath.nullable(), document: wireDocumentSchema }).strict(),
    output: z.object({ ok: z.boolean() }),
  },
  'project:check-recovery': { input: projectPathOrNone, output: z.object({ offer: recoveryOfferSchema.nullable() }) },
  'project:discard-recovery': { input: projectPathOrNone, output: z.object({ ok: z.boolean() }) },
  /** The stored cells of one sheet of a source in the project (the site list the project links), or null when not held. */
  'project:sheet-cells': { input: z.object({ sourceId: z.string().min(1), sheet: z.string().min(1) }).strict(), output: z.object({ grid: sheetGridSchema.nullable() }) },
  /** The sheets the project keeps of a source, each with its size and whether the records were read from it (the others can be linked as the site list). */
  'project:source-sheets': {
    input: z.object({ sourceId: z.string().min(1) }).strict(),
    output: z.object({ sheets: z.array(z.object({ name: z.string(), rows: z.number().int(), columns: z.number().int(), records: z.boolean() })) }),
  },
  /** Writes a report document as one PDF, one HTML and one XLSX file named `stem` into `folder`. */
  'report:write': {
    input: z.object({ document: reportDocumentSchema, folder: filePath, stem: reportStem }).strict(),
    output: z.object({ pdf: z.string(), html: z.string(), xlsx: z.string(), files: z.array(z.object({ name: z.string(), sha256: z.string() })) }),
  },
  /** Writes the cleaned-data export to `path`: .xlsx every table, .csv one (`table`, default the analysis table). */
  'export:write': {
    input: z.object({ document: cleanedExportSchema, path: filePath, table: z.enum(exportTableKeys).optional() }).strict(),
    output: z.object({ path: z.string(), format: z.enum(['xlsx', 'csv']), sheets: z.array(z.string()), rows: z.number() }),
  },
} as const satisfies Record<ChannelName, { input: z.ZodType; output: z.ZodType }>;

// Both ways: every listed channel has a schema (above) and every schema is listed (here).
type Unlisted = Exclude<keyof typeof hostContract, ChannelName>;
const allListed: Unlisted extends never ? true : never = true;
void allListed;

export type HostContract = typeof hostContract;
export type Channel = keyof HostContract;
export type ChannelInput<C extends Channel> = z.input<HostContract[C]['input']>;
export type ChannelOutput<C extends Channel> = z.output<HostContract[C]['output']>;

export const channels: readonly Channel[] = channelNames;

/** An error as it crosses the bridge: a stable name the UI can branch on, and a plain message. */
export interface HostErrorShape {
  name: string;
  message: string;
  /** A finer stable code where the error class has one (e.g. a project file's 'damaged' or 'newer-version'). */
  code?: string;
}

/** What every handler answers: a value, or an error shape (never a thrown object across the bridge). */
export type HostReply<T> = { ok: true; value: T } | { ok: false; error: HostErrorShape };

export class HostError extends Error {
  constructor(name: string, message: string, readonly code?: string) {
    super(message);
    this.name = name;
  }
}

/** Service implementations: one async function per channel. */
export type HostServices = { [C in Channel]: (input: z.output<HostContract[C]['input']>) => Promise<ChannelOutput<C>> };

/** The object preload exposes (and the browser tests install): one function per channel. */
export type HostBridge = {
  [C in Channel]: (input: ChannelInput<C>) => Promise<HostReply<ChannelOutput<C>>>;
} & { onCommand(listener: (command: HostCommand) => void): () => void; onProgress(listener: (progress: JobProgress) => void): () => void };
