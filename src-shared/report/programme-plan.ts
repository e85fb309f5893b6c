/**
 * From the analysis table and the model chosen for each species to the
 * groups of a programme report. The app's Report stage and
 * `tallywise report --project` both go through here, so the same project
 * gives the same rows, in the same order, to the same fits.
 */
import { rowsWithOffsets } from '../data/fit-rows';
import { findColumn, levelsOf, selectRows, sortLevels, type DataTable } from '../data/table';
import type { EditLog } from '../cleaning/edit-entry';
import type { LoadedSource } from '../host/contract';
import type { ModelSpec } from '../model/spec';
import type { ReportHistoryEntry } from '../project/report-history';
import type { Provenance } from './appendix';
import { cleaningRecordsOf, type CleaningRecords } from './cleaning-summary';
import type { PlannedGroup, ProgrammePlan } from './programme-report';

export const SPECIES_COLUMN = 'species';

/** The model chosen for the report for one species. */
export interface ChosenModel {
  readonly species: string;
  readonly name: string;
  readonly spec: ModelSpec;
  /** Rows whose offsets cannot be logged are left out, as when it was fitted. */
  readonly dropBadOffsetRows: boolean;
}

/** A species of the table: the model it would be reported with, or why it cannot be. */
export interface SpeciesChoice {
  readonly species: string;
  readonly model: ChosenModel | null;
  /** Why the species cannot be reported; null when it can. */
  readonly problem: string | null;
}

/** The species values of the analysis table, in sorted order. */
export function tableSpecies(table: DataTable): string[] {
  const col = findColumn(table, SPECIES_COLUMN);
  return col ? sortLevels(levelsOf(col)).filter((s) => s !== '') : [];
}

/** Each species of the table with its chosen model, or the reason it has none that gives a trend. */
export function speciesChoices(table: DataTable, chosen: readonly ChosenModel[]): SpeciesChoice[] {
  return tableSpecies(table).map((species) => {
    const model = chosen.find((m) => m.species === species) ?? null;
    if (!model) return { species, model: null, problem: 'no model is chosen for the report' };
    if (!model.spec.time) return { species, model: null, problem: `the chosen model "${model.name}" has no time term, so it gives no trend` };
    return { species, model, problem: null };
  });
}

/** The rows of `species` that its model is fitted to, as indices into the full table (in table order). */
function rowsFor(table: DataTable, model: ChosenModel): number[] {
  const col = findColumn(table, SPECIES_COLUMN);
  if (!col) return [];
  const usable = model.dropBadOffsetRows && model.spec.offsets.length ? new Set(rowsWithOffsets(table, model.spec)) : null;
  const rows: number[] = [];
  col.texts.forEach((t, i) => {
    if (t === model.species && (!usable || usable.has(i))) rows.push(i);
  });
  return rows;
}

const sameModel = (a: ChosenModel, b: ChosenModel) => a.name === b.name && JSON.stringify(a.spec) === JSON.stringify(b.spec);

/**
 * The report groups of the chosen models (in the table's species order,
 * whatever order they are given in) and the rows of all of them together,
 * for the composite.
 */
export function programmeGroups(table: DataTable, models: readonly ChosenModel[], labels: Readonly<Record<string, string>> = {}, candidates: readonly ChosenModel[] = []): { groups: PlannedGroup[]; compositeTable: DataTable } {
  const order = tableSpecies(table);
  const sorted = [...models].sort((a, b) => order.indexOf(a.species) - order.indexOf(b.species));
  const all: number[] = [];
  const groups = sorted.map((m): PlannedGroup => {
    const rows = rowsFor(table, m);
    all.push(...rows);
    const others = candidates.filter((c) => c.species === m.species && !sameModel(c, m)).map((c) => ({ label: c.name, spec: c.spec }));
    return { group: m.species, ...(labels[m.species] ? { label: labels[m.species] } : {}), table: selectRows(table, rows), spec: m.spec, model: m.name, others, dropBadOffsetRows: m.dropBadOffsetRows };
  });
  return { groups, compositeTable: selectRows(table, all.sort((a, b) => a - b)) };
}

/** The sources as the report's appendix names them: file (and sheet), SHA-256, records read. */
export function sourceInputs(sources: readonly LoadedSource[]): { name: string; sha256: string; rows: number }[] {
  return sources.map((s) => ({ name: s.summary.sheet ? `${s.summary.fileName}, sheet "${s.summary.sheet}"` : s.summary.fileName, sha256: s.summary.sha256, rows: s.summary.records }));
}

type StoredModel = { species: string; name: string; spec: ModelSpec; chosen: boolean; dropBadOffsetRows: boolean };

/** The models of a project (all, or only those chosen for the report), as the plan takes them. */
export function modelsOf(models: readonly StoredModel[], only: 'chosen' | 'all' = 'chosen'): ChosenModel[] {
  return models.filter((m) => only === 'all' || m.chosen).map((m) => ({ species: m.species, name: m.name, spec: m.spec, dropBadOffsetRows: m.dropBadOffsetRows }));
}

/** Key of the project's seeds that the composite bootstrap uses. */
export const REPORT_SEED_KEY = 'bootstrap';

/** The report's file name (without extension) from the programme's name. */
export function reportStem(programme: string): string {
  const slug = programme.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60);
  return `${slug || 'programme'}-trend-report`;
}

/** A species asked for cannot be reported; the message names it and says how to fix it. */
export class ReportPlanError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ReportPlanError';
  }
}

export interface ProjectReportInput {
  readonly programme: string;
  /** The project's whole analysis table (one row per site x season x species). */
  readonly table: DataTable;
  /** The models chosen for the report (one per species at most). */
  readonly chosen: readonly ChosenModel[];
  /** Every model fitted (chosen or not): the others of a species are compared with its chosen one. */
  readonly candidates?: readonly ChosenModel[];
  /** The cleaning log behind the analysis table. */
  readonly cleaning?: EditLog;
  /** The imported and cleaned records (and the log's conflicts), when at hand: the report then counts the records each change altered. */
  readonly cleaningRecords?: CleaningRecords;
  /** The species to report; empty: every species with a chosen model that gives a trend. */
  readonly species: readonly string[];
  /** The saved project file; null when the report is made from work not saved to a file. */
  readonly projectFile: { readonly name: string; readonly sha256: string } | null;
  /** What to say of the project when there is no file (default: that the work was not saved). */
  readonly unsavedNote?: string;
  readonly sources: readonly { readonly name: string; readonly sha256: string; readonly rows?: number }[];
  readonly software: { readonly name: string; readonly version: string };
  readonly createdAt: string;
  /** The command or action that made the report. */
  readonly command?: string;
  readonly replicates?: number;
  readonly seed?: number;
  readonly labels?: Readonly<Record<string, string>>;
  /** The data key of the cleaned records (CleanedAnalysis.dataKey), kept in the report history. */
  readonly dataKey?: string;
  /** The last entry of the project's report history: the report says what changed since. */
  readonly previous?: ReportHistoryEntry | null;
}

const HOW_TO_CHOOSE = 'In the app, open the project, fit a model for it on the Models stage, pick it in the "For the report" column and save the project.';

/** The species to report: those asked for (each must have a chosen model with a time term), or all that can be. */
export function reportSpecies(table: DataTable, chosen: readonly ChosenModel[], asked: readonly string[]): ChosenModel[] {
  const choices = speciesChoices(table, chosen);
  if (asked.length === 0) {
    const ready = choices.filter((c) => c.model);
    if (ready.length === 0) {
      const why = choices.map((c) => `"${c.species}": ${c.problem}`).join('; ');
      throw new ReportPlanError(`No species can be reported: ${why || 'the analysis table has no species'}. ${HOW_TO_CHOOSE}`);
    }
    return ready.map((c) => c.model!);
  }
  const problems = asked.flatMap((s) => {
    const c = choices.find((x) => x.species === s);
    if (!c) return [`"${s}" is not a species of the project (its species are ${choices.map((x) => `"${x.species}"`).join(', ')})`];
    return c.problem ? [`"${s}": ${c.problem}`] : [];
  });
  if (problems.length) throw new ReportPlanError(`Cannot report ${problems.join('; ')}. ${HOW_TO_CHOOSE}`);
  return asked.map((s) => choices.find((c) => c.species === s)!.model!);
}

/** The plan of a project's report, built the same way by the app and the command line. */
export function projectReportPlan(input: ProjectReportInput): ProgrammePlan {
  const models = reportSpecies(input.table, input.chosen, input.species);
  const { groups, compositeTable } = programmeGroups(input.table, models, input.labels, input.candidates);
  const seasons = groups[0].spec.time!.column;
  const provenance: Provenance = {
    software: input.software,
    ...(input.projectFile ? { project: input.projectFile } : {}),
    inputs: input.sources,
    seeds: [],
    createdAt: input.createdAt,
    command: input.command,
    settings: [
      ...(input.projectFile ? [] : [input.unsavedNote ?? 'The report was made from work not saved to a project file; save the project to make it reproducible.']),
      ...models.map((m) => `Model of "${m.species}": ${m.name}${m.dropBadOffsetRows ? ' (rows whose offsets cannot be logged left out)' : ''}.`),
    ],
  };
  return {
    title: `${input.programme}: annual trend report`,
    subtitle: `Trend of each species, ${seasons} by ${seasons}, from the models chosen in the project`,
    groupColumn: SPECIES_COLUMN,
    groups,
    compositeTable: groups.length >= 2 ? compositeTable : undefined,
    provenance,
    replicates: input.replicates,
    seed: input.seed,
    cleaning: input.cleaning,
    ...(input.dataKey !== undefined ? { dataKey: input.dataKey } : {}),
    ...(input.previous ? { previous: input.previous } : {}),
    ...(input.cleaningRecords ? { cleaningRecords: cleaningRecordsOf(input.cleaningRecords) } : {}),
  };
}
