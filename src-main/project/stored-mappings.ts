import type { ProjectDocument } from '@shared/project/document';
import type { SourceMapping } from '../services/record-import';

/**
 * What the project's `mapping` member holds for the desktop import: one
 * column mapping per source, `{ sources: [SourceMapping...] }` (the format
 * leaves the shape to the import step).
 */
export interface StoredMappings {
  sources: SourceMapping[];
}

/** The mapping of each source, by source id; empty when the member holds something else. */
export function storedMappings(mapping: unknown): Map<string, SourceMapping> {
  const list = (mapping as StoredMappings | null)?.sources;
  return new Map(Array.isArray(list) ? list.map((m) => [m.sourceId, m]) : []);
}

/** The mappings as the document stores them (a plain JSON copy). */
export function mappingsMember(mappings: readonly SourceMapping[]): ProjectDocument['mapping'] {
  return JSON.parse(JSON.stringify({ sources: mappings })) as ProjectDocument['mapping'];
}
