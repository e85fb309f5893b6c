import type { CleaningRecord, FieldValue } from '@shared/cleaning/record';
import type { EditLog } from '@shared/cleaning/edit-entry';
import { aggregateRecords, type AnalysisTable } from '@shared/import/aggregate';
import { countStatuses, type CountStatus } from '@shared/import/field-codes';
import type { CountRecord } from '@shared/import/records';
import { effortUnitInfo, isEffortUnit, toCanonicalEffort } from '@shared/import/units';
import type { SiteAttributes } from './site-attributes';

/**
 * From the cleaned records (raw + change log) to the analysis table the
 * models are fitted to: records left out in cleaning are dropped, effort is
 * put in its canonical unit (hours, km ...), counts are summed over a
 * season's visits, and site attributes (area, habitat) are joined by site
 * name when the programme lists them.
 */
function text(v: FieldValue | undefined): string {
  return v === null || v === undefined ? '' : String(v).trim();
}

function numberOrNull(v: FieldValue | undefined): number | null {
  if (v === null || v === undefined || v === '') return null;
  const n = typeof v === 'number' ? v : Number(v);
  return Number.isFinite(n) ? n : null;
}

function statusOf(v: FieldValue | undefined): CountStatus {
  const s = text(v);
  return (countStatuses as readonly string[]).includes(s) ? (s as CountStatus) : 'counted';
}

export function countRecordsOf(records: readonly CleaningRecord[], effortUnit: string | undefined, sites: SiteAttributes | null): CountRecord[] {
  const out: CountRecord[] = [];
  for (const r of records) {
    if (r.excluded) continue;
    const f = r.fields;
    const raw = numberOrNull(f.effort);
    const site = text(f.site);
    const attrs = sites?.get(site);
    out.push({
      sheet: '',
      row: 0,
      column: '',
      site,
      date: text(f.date) || null,
      dateText: text(f.date),
      season: text(f.season),
      visit: text(f.visit),
      species: text(f.species),
      code: text(f.code),
      status: statusOf(f.status),
      count: numberOrNull(f.count),
      rule: '',
      effort: raw === null ? null : isEffortUnit(effortUnit) ? toCanonicalEffort(raw, effortUnit) : raw,
      effortText: text(f.effort),
      area: attrs ? attrs.areaHa : null,
      observer: text(f.observer),
      covariates: attrs ? attrs.covariates : {},
      columns: {},
      formulaError: false,
    });
  }
  return out;
}

/** The analysis table of the cleaned records: one row per site x season x species, counts summed over visits. */
export function analysisTableOf(records: readonly CleaningRecord[], effortUnit: string | undefined, sites: SiteAttributes | null): AnalysisTable {
  const counts = countRecordsOf(records, effortUnit, sites);
  const hasEffort = counts.some((r) => r.effort !== null);
  return aggregateRecords(counts, {
    rule: 'sum',
    effortUnit: hasEffort ? (isEffortUnit(effortUnit) ? effortUnitInfo(effortUnit).canonical : 'effort') : undefined,
    hasArea: counts.some((r) => r.area !== null),
  });
}

/**
 * A short key of the data the models see: the sources and every entry of the
 * change log. Results fitted under another key are out of date.
 */
export function dataKey(sourceIds: readonly string[], log: EditLog): string {
  const s = `${sourceIds.join(',')}|${JSON.stringify(log)}`;
  let h = 0x811c9dc5;
  for (let i = 0; i < s.length; i++) {
    h ^= s.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return `${sourceIds.length}-${s.length}-${h.toString(16)}`;
}
