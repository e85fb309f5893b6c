import type { ColumnRoles } from '../host/contract';
import type { ColumnMap, MappingTemplate } from './mapping-template';
import type { DateOrder } from './text-dates';
import { isEffortUnit, unitFromHeader } from './units';

/**
 * The desktop app's column roles (which column is the site, the date, the
 * species columns ...) as a mapping template and back, so the app reads its
 * sheets with the same mapping and checks as the command line. Columns the
 * roles do not name are ignored (not reported as new); visit covariates are
 * columns with the role "covariate".
 */
export function rolesToTemplate(roles: ColumnRoles, headers: readonly string[], dateOrder?: DateOrder): MappingTemplate {
  const named = new Map<string, ColumnMap>();
  const put = (header: string | undefined, map: Omit<ColumnMap, 'header'>) => {
    if (header !== undefined && !named.has(header)) named.set(header, { header, ...map });
  };
  put(roles.site, { role: 'site' });
  put(roles.date, { role: 'date' });
  put(roles.season, { role: 'season' });
  put(roles.visit, { role: 'visit' });
  put(roles.observer, { role: 'observer' });
  if (roles.effort !== undefined) {
    const unit = roles.effortUnit ?? unitFromHeader(roles.effort);
    put(roles.effort, isEffortUnit(unit) ? { role: 'effort', unit } : { role: 'effort' });
  }
  const wide = (roles.speciesColumns?.length ?? 0) > 0;
  if (wide) for (const h of roles.speciesColumns!) put(h, { role: 'count', species: h });
  else {
    put(roles.species, { role: 'species' });
    put(roles.count, { role: 'count' });
  }
  for (const h of roles.covariates ?? []) put(h, { role: 'covariate' });
  const columns = headers.map((h) => named.get(h) ?? { header: h, role: 'ignore' as const });
  return { kind: 'tallywise-mapping', version: 1, layout: wide ? 'wide-species' : 'long', columns, ...(dateOrder ? { dateOrder } : {}) };
}

/** What a template cannot say as column roles. */
export type RolesGap = 'no-site' | 'no-counts';

/** The column roles a template gives (wide by species, or long with a species and a count column), or what is missing. */
export function templateToRoles(template: MappingTemplate): { roles: ColumnRoles } | { gap: RolesGap } {
  const first = (role: ColumnMap['role']) => template.columns.find((c) => c.role === role);
  const site = first('site');
  if (!site) return { gap: 'no-site' };
  const counts = template.columns.filter((c) => c.role === 'count');
  const roles: ColumnRoles = { site: site.header };
  for (const role of ['date', 'season', 'visit', 'observer'] as const) {
    const c = first(role);
    if (c) roles[role] = c.header;
  }
  const effort = first('effort');
  if (effort) {
    roles.effort = effort.header;
    const unit = effort.unit ?? unitFromHeader(effort.header);
    if (isEffortUnit(unit)) roles.effortUnit = unit;
  }
  if (template.layout === 'wide-species' && counts.length) roles.speciesColumns = counts.map((c) => c.header);
  else if (template.layout === 'long' && counts.length === 1 && first('species')) {
    roles.species = first('species')!.header;
    roles.count = counts[0].header;
  } else return { gap: 'no-counts' };
  const covariates = template.columns.filter((c) => c.role === 'covariate').map((c) => c.header);
  if (covariates.length) roles.covariates = covariates;
  return { roles };
}
