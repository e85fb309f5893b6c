import type { ProgrammeOverview } from '@shared/host/contract';
import { toHectares } from '@shared/import/units';

/**
 * What the programme knows about each site (its area and habitat), joined to
 * the records by site name. Only sites the programme lists get attributes;
 * when no record's site is listed there are none at all.
 */
export interface SiteInfo {
  readonly areaHa: number;
  readonly covariates: Readonly<Record<string, string>>;
}

export type SiteAttributes = ReadonlyMap<string, SiteInfo>;

export function siteAttributesOf(overview: ProgrammeOverview | null, siteNames: ReadonlySet<string>): SiteAttributes | null {
  if (!overview) return null;
  const map = new Map<string, SiteInfo>();
  for (const s of overview.sites) {
    if (siteNames.has(s.name)) map.set(s.name, { areaHa: toHectares(s.areaM2, 'm2'), covariates: { habitat: s.habitat } });
  }
  return map.size ? map : null;
}
