import { emptyLog } from '../cleaning/edit-log';
import { projectDocumentSchema, CURRENT_FORMAT_VERSION, type ProjectDocument } from './schema';

export type { ProjectDocument } from './schema';

export class ProjectDocumentError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ProjectDocumentError';
  }
}

/** A new, empty project for a programme. */
export function createProjectDocument(programmeName: string, now: Date = new Date()): ProjectDocument {
  const t = now.toISOString();
  return {
    formatVersion: CURRENT_FORMAT_VERSION,
    programme: { name: programmeName },
    createdAt: t,
    modifiedAt: t,
    sources: [],
    mapping: null,
    fieldCodeRules: [],
    cleaning: emptyLog(),
    aggregation: null,
    sites: null,
    models: [],
    fitCache: [],
    report: { outputFolder: null, species: [] },
    reportHistory: [],
    seeds: {},
  };
}

/**
 * Checks a current-version document and fills in defaults. The message names
 * each faulty place by its path in the document (`models.0.spec.response`).
 */
export function parseProjectDocument(input: unknown, where = 'the project'): ProjectDocument {
  const result = projectDocumentSchema.safeParse(input);
  if (result.success) return result.data;
  const faults = result.error.issues.slice(0, 5).map((i) => `${i.path.length ? i.path.join('.') : '(top level)'}: ${i.message}`);
  const more = result.error.issues.length > 5 ? ` (and ${result.error.issues.length - 5} more)` : '';
  throw new ProjectDocumentError(`${where} does not have the expected content: ${faults.join('; ')}${more}.`);
}
