import { findColumn, type DataTable } from '../data/table';

/**
 * The analysis table's roles: which columns are the response, site, season,
 * species and offsets, with the offsets' units, so checks and the written
 * model can name them as the analyst knows them.
 */
export interface TableRoles {
  readonly response: 'count';
  readonly site: 'site';
  readonly season: 'season';
  readonly species: 'species';
  /** Effort column (e.g. effort_h) and its unit, when the records have effort. */
  readonly effort?: { readonly column: string; readonly unit: string };
  readonly area?: { readonly column: 'area_ha'; readonly unit: 'ha' };
}

const unitOfEffortColumn: Record<string, string> = { effort_h: 'hours', effort_km: 'km', effort_trap_nights: 'trap-nights', effort_visits: 'visits', effort_points: 'points' };

export function tableRoles(table: DataTable, effortColumn: string | undefined): TableRoles {
  return {
    response: 'count',
    site: 'site',
    season: 'season',
    species: 'species',
    ...(effortColumn ? { effort: { column: effortColumn, unit: unitOfEffortColumn[effortColumn] ?? 'units' } } : {}),
    ...(findColumn(table, 'area_ha') ? { area: { column: 'area_ha' as const, unit: 'ha' as const } } : {}),
  };
}

/** How the offsets read in the written model: effort_h -> effort in hours. */
export function offsetNames(roles: TableRoles): Record<string, { name: string; unit: string }> {
  return {
    ...(roles.effort ? { [roles.effort.column]: { name: 'effort', unit: roles.effort.unit } } : {}),
    ...(roles.area ? { [roles.area.column]: { name: 'area', unit: roles.area.unit } } : {}),
  };
}
