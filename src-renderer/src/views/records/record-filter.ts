import type { CleaningRecord } from '@shared/cleaning/record';
import type { RecordSet } from './record-set';
import { settledFor } from '@shared/cleaning/finding-flags';
import type { RecordLink } from '../models/diagnostics/record-link';
import { recordMatches } from '../models/diagnostics/record-key';
import { outlierOf, type ModelOutliers } from '../models/diagnostics/model-outliers';

/**
 * What the grid shows: by flag (any, still open, none, one finding code, one
 * finding, edited, left out, model outlier), site, species and season, and
 * the records a chart point links to. '' means all.
 */
export interface RecordFilter {
  flag: string;
  site: string;
  species: string;
  season: string;
  /** Records behind a chart point or a set of flagged totals (flag 'linked'). */
  link?: RecordLink;
}

export const noFilter: RecordFilter = { flag: '', site: '', species: '', season: '' };

/** The filter that shows the records a chart asked for. */
export function linkedFilter(link: RecordLink): RecordFilter {
  return link.asOutliers ? { ...noFilter, flag: 'model-outliers' } : { ...noFilter, flag: 'linked', link };
}

export function isFiltering(f: RecordFilter): boolean {
  return f.flag !== '' || f.site !== '' || f.species !== '' || f.season !== '';
}

/** A predicate for one filter state over the current cleaned records. */
export function recordPredicate(f: RecordFilter, set: RecordSet, outliers: ModelOutliers | null = null): (r: CleaningRecord) => boolean {
  const flag = f.flag;
  const findingId = flag.startsWith('finding:') ? flag.slice('finding:'.length) : null;
  const finding = findingId ? set.findings.find((x) => x.id === findingId) : undefined;
  const inFinding = finding ? new Set(finding.recordIds) : null;
  const code = flag.startsWith('code:') ? flag.slice('code:'.length) : null;
  return (r) => {
    if (f.site && r.fields['site'] !== f.site) return false;
    if (f.species && r.fields['species'] !== f.species) return false;
    if (f.season && r.fields['season'] !== f.season) return false;
    if (!flag) return true;
    const mine = set.findingsOf.get(r.id) ?? [];
    const raw = set.rawById.get(r.id);
    switch (flag) {
      case 'flagged':
        return mine.length > 0;
      case 'open':
        return mine.some((k) => !settledFor(set.findings[k], r, raw));
      case 'none':
        return mine.length === 0;
      case 'excluded':
        return r.excluded !== undefined;
      case 'edited':
        return raw !== undefined && r !== raw && Object.keys(r.fields).some((k) => r.fields[k] !== raw.fields[k]);
      case 'model-outliers':
        return outlierOf(outliers, r) !== undefined;
      case 'linked':
        return !!f.link && f.link.keys.some((k) => recordMatches(k, r));
    }
    if (inFinding) return inFinding.has(r.id);
    if (code) return mine.some((k) => set.findings[k].code === code);
    return true;
  };
}

/** Sorted distinct texts of a field, for the filter lists. */
export function distinctValues(records: readonly CleaningRecord[], field: string): string[] {
  const s = new Set<string>();
  for (const r of records) {
    const v = r.fields[field];
    if (v !== null && v !== undefined && v !== '') s.add(String(v));
  }
  return [...s].sort((a, b) => a.localeCompare(b));
}
