import type { CleaningRecord, FieldValue } from '../cleaning/record';
import { aggregateRecords, type AnalysisTable } from '../import/aggregate';
import { countStatuses, type CountStatus } from '../import/field-codes';
import type { CountRecord } from '../import/records';
import { effortUnitInfo, isEffortUnit, toCanonicalEffort } from '../import/units';
import type { SiteAttributes } from './site-attributes';
import { covariateField, type CovariateValue } from '../import/visit-covariates';
import { visitCovariateColumns } from './visit-covariate-columns';

/**
 * From the cleaned records (raw + change log) to the analysis table the
 * models are fitted to: records left out in cleaning are dropped, effort is
 * put in its canonical unit (hours, km ...), counts are summed over a
 * season's visits, and site attributes (area, covariates) are joined by site
 * name from the project's site list. Visit covariates (the counts sheet's own
 * covariate columns, fields `cov:<name>`) are combined over each row's visits
 * (numbers: the mean; texts: kept where the visits agree; see
 * visit-covariate-rule.ts).
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

function covariateValue(v: FieldValue | undefined): CovariateValue {
  if (v === null || v === undefined) return null;
  if (typeof v === 'number') return Number.isFinite(v) ? v : null;
  return v.trim() === '' ? null : v.trim();
}

/** The cleaned records still in the analysis, as count records with effort in its canonical unit, the site's attributes and the named visit covariates. */
export function countRecordsOf(records: readonly CleaningRecord[], effortUnit: string | undefined, sites: SiteAttributes | null, visitCovariates: readonly string[] = []): CountRecord[] {
  const out: CountRecord[] = [];
  const covFields = visitCovariates.map((name) => [name, covariateField(name)] as const);
  for (const r of records) {
    if (r.excluded) continue;
    const f = r.fields;
    const raw = numberOrNull(f.effort);
    const site = text(f.site);
    const attrs = sites?.get(site);
    const visitValues: Record<string, CovariateValue> = {};
    for (const [name, field] of covFields) visitValues[name] = covariateValue(f[field]);
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
      area: attrs?.areaHa ?? null,
      observer: text(f.observer),
      covariates: attrs ? attrs.covariates : {},
      ...(covFields.length ? { visitCovariates: visitValues } : {}),
      columns: {},
      formulaError: false,
    });
  }
  return out;
}

/**
 * The analysis table of the cleaned records: one row per site x season x
 * species, counts and effort summed over visits, `area_ha` and the site
 * covariates where the site list gives them, then one column per visit
 * covariate (see aggregateRecords for every column).
 */
export function analysisTableOf(
  records: readonly CleaningRecord[],
  effortUnit: string | undefined,
  sites: SiteAttributes | null,
  covariates?: readonly string[],
  visitCovariates: readonly string[] = [],
): AnalysisTable {
  const counts = countRecordsOf(records, effortUnit, sites, visitCovariates);
  const hasEffort = counts.some((r) => r.effort !== null);
  return aggregateRecords(counts, {
    rule: 'sum',
    effortUnit: hasEffort ? (isEffortUnit(effortUnit) ? effortUnitInfo(effortUnit).canonical : 'effort') : undefined,
    hasArea: counts.some((r) => r.area !== null),
    ...(covariates ? { covariates } : {}),
    visitCovariates: visitCovariateColumns(visitCovariates, covariates ?? [...new Set(counts.flatMap((r) => Object.keys(r.covariates)))]),
  });
}
