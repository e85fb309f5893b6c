/**
 * The main side of a project's report: the plan from a project document
 * (its analysis table rebuilt from the stored cells, the chosen models) and
 * the file fingerprints the appendix names. The run itself is
 * src-shared/report/programme-report.ts and the plan
 * src-shared/report/programme-plan.ts, both shared with the app.
 */
import { readFile } from 'node:fs/promises';
import { basename } from 'node:path';
import type { ProjectDocument } from '@shared/project/document';
import { modelsOf, projectReportPlan, REPORT_SEED_KEY, sourceInputs, type ProjectReportInput } from '@shared/report/programme-plan';
import type { ProgrammePlan } from '@shared/report/programme-report';
import { projectAnalysis } from '../project/project-analysis';
import { sha256Hex } from '../project/file-format';
import { nodeErrorCode } from '../project/node-error-code';

export interface FileFingerprint {
  readonly name: string;
  readonly sha256: string;
}

/** A file to fingerprint could not be read; the message names it. */
export class FingerprintError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'FingerprintError';
  }
}

export function fingerprintOf(path: string, bytes: Uint8Array): FileFingerprint {
  return { name: basename(path), sha256: sha256Hex(bytes) };
}

/** The file's name (no folder) and the SHA-256 of its bytes. */
export async function fileFingerprint(path: string): Promise<FileFingerprint> {
  try {
    return fingerprintOf(path, await readFile(path));
  } catch (err) {
    throw new FingerprintError(`"${basename(path)}" could not be read to record its SHA-256 (${nodeErrorCode(err) ?? (err as Error).message}). Save the project again and make the report once more.`);
  }
}

export type ProjectPlanOptions = Pick<ProjectReportInput, 'projectFile' | 'unsavedNote' | 'software' | 'createdAt' | 'command' | 'replicates' | 'seed'> & {
  /** Species to report; absent or empty: the project's own list (doc.report.species), else every species with a chosen model. */
  readonly species?: readonly string[];
};

/** The plan of a project's report, as the app's Report stage makes it from the same project. */
export async function projectPlan(doc: ProjectDocument, options: ProjectPlanOptions): Promise<{ plan: ProgrammePlan; siteProblems: readonly string[] }> {
  const analysis = await projectAnalysis(doc);
  const plan = projectReportPlan({
    programme: doc.programme.name,
    table: analysis.table,
    chosen: modelsOf(doc.models),
    candidates: modelsOf(doc.models, 'all'),
    cleaning: doc.cleaning,
    cleaningRecords: analysis,
    species: options.species?.length ? options.species : doc.report.species,
    projectFile: options.projectFile,
    unsavedNote: options.unsavedNote,
    sources: sourceInputs(analysis.loaded),
    software: options.software,
    createdAt: options.createdAt,
    command: options.command,
    replicates: options.replicates,
    seed: options.seed ?? doc.seeds[REPORT_SEED_KEY],
    dataKey: analysis.dataKey,
    previous: doc.reportHistory.at(-1) ?? null,
  });
  return { plan, siteProblems: analysis.siteProblems };
}
