import { findColumn, type DataTable } from '@shared/data/table';
import type { CleaningRecord } from '@shared/cleaning/record';

/**
 * Which cleaning records lie behind an analysis row: the analysis table has
 * one row per site x season x species (counts summed over the visits), so a
 * row is found again in the grid by those three names. A key may leave out
 * season (a whole site) or species.
 */
export interface RecordKey {
  readonly site?: string;
  readonly season?: string;
  readonly species?: string;
}

const parts = ['site', 'season', 'species'] as const;

function text(v: unknown): string {
  return v === null || v === undefined ? '' : String(v).trim();
}

/** The key of one analysis-table row (its site, season and species). */
export function keyOfRow(table: DataTable, row: number, columns: { site: string; season: string }): RecordKey {
  const at = (name: string) => findColumn(table, name)?.texts[row];
  const site = at(columns.site);
  const season = at(columns.season);
  const species = at('species');
  return { ...(site !== undefined ? { site } : {}), ...(season !== undefined ? { season } : {}), ...(species !== undefined ? { species } : {}) };
}

/** One string for a full key, for look-ups. */
export function keyText(k: RecordKey): string {
  return `${k.site ?? ''}\u0000${k.season ?? ''}\u0000${k.species ?? ''}`;
}

/** The full key of a record (its site, season and species as the analysis table reads them). */
export function keyOfRecord(r: CleaningRecord): string {
  return keyText({ site: text(r.fields.site), season: text(r.fields.season), species: text(r.fields.species) });
}

/** Whether a record used in the analysis is one of those the key names. */
export function recordMatches(key: RecordKey, r: CleaningRecord): boolean {
  if (r.excluded !== undefined) return false;
  return parts.every((p) => key[p] === undefined || key[p] === text(r.fields[p]));
}
