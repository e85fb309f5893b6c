import type { ColumnRoles } from '@shared/host/contract';
import { REMARKS_HEADER, VISIT_COLUMNS } from '@shared/demo/season-sheet';
import { ImportError } from '@shared/import/import-error';
import { isEffortUnit, unitFromHeader } from '@shared/import/units';
import type { DateOrder } from '@shared/import/text-dates';

/**
 * Which column is site, date, effort, species ...: the built-in template for
 * the demo programme's tally sheets, or a guess from the header names for
 * other files (the user's own choice overrides both).
 */
export interface RolePlan {
  roles: ColumnRoles;
  mappedBy: 'demo-template' | 'roles' | 'guessed';
  /** The template knows the sheets' date style. */
  dateOrder?: DateOrder;
}

/** The demo's Counts sheet: the fixed visit columns, then one column per species, then Remarks. */
export function demoTemplate(headers: readonly string[]): RolePlan | null {
  const fixed = VISIT_COLUMNS as readonly string[];
  if (!fixed.every((h, i) => headers[i] === h) || headers[headers.length - 1] !== REMARKS_HEADER) return null;
  const species = headers.slice(fixed.length, headers.length - 1);
  if (species.length === 0) return null;
  return {
    roles: { site: 'Pond', date: 'Date', visit: 'Visit', observer: 'Observer', effort: 'Minutes', effortUnit: 'minutes', speciesColumns: species },
    mappedBy: 'demo-template',
    dateOrder: 'dmy',
  };
}

const patterns: [keyof ColumnRoles, RegExp][] = [
  ['site', /^(site|pond|station|plot|transect|location|field|wetland)( name)?$/i],
  ['date', /^(date|visit date|survey date)$/i],
  ['season', /^(season|year)$/i],
  ['visit', /^(visit|visit no\.?|round|visit number)$/i],
  ['observer', /^(observer|recorder|surveyor|counter)s?$/i],
  ['species', /^(species|taxon|species name)$/i],
  ['count', /^(count|number|total|n)$/i],
];

/** Roles from header names; species columns are the remaining columns of a wide sheet. */
export function guessRoles(headers: readonly string[], file: string): RolePlan {
  const roles: Partial<ColumnRoles> = {};
  const used = new Set<string>();
  for (const [role, re] of patterns) {
    const h = headers.find((x) => !used.has(x) && re.test(x.trim()));
    if (h) {
      (roles as Record<string, string>)[role] = h;
      used.add(h);
    }
  }
  const effort = headers.find((h) => !used.has(h) && (/effort|minutes|hours|duration/i.test(h) || isEffortUnit(unitFromHeader(h) ?? '')));
  if (effort) {
    roles.effort = effort;
    const u = unitFromHeader(effort);
    if (isEffortUnit(u)) roles.effortUnit = u;
    used.add(effort);
  }
  if (!roles.site) {
    throw new ImportError('bad-template', `${file}: no column was recognised as the site (a header such as "Site" or "Pond"). The headers are: ${headers.map((h) => `"${h}"`).join(', ')}. Rename the site column's header to "Site", or choose the column roles by hand.`, { file });
  }
  if (!(roles.species && roles.count)) {
    const rest = headers.filter((h) => !used.has(h) && !/remark|note|comment|temp|weather|wind|time/i.test(h));
    if (rest.length === 0) {
      throw new ImportError('bad-template', `${file}: no count columns were found (a "Species" and a "Count" column, or one column per species). Add them, or choose the column roles by hand.`, { file });
    }
    delete roles.species;
    delete roles.count;
    roles.speciesColumns = rest;
  }
  return { roles: roles as ColumnRoles, mappedBy: 'guessed' };
}

/** The roles to use: given ones first, then the demo template, then a guess. */
export function planRoles(headers: readonly string[], file: string, given?: ColumnRoles): RolePlan {
  if (given) {
    const missing = [given.site, given.date, given.season, given.visit, given.observer, given.effort, given.species, given.count, ...(given.speciesColumns ?? [])]
      .filter((h): h is string => h !== undefined)
      .filter((h) => !headers.includes(h));
    if (missing.length) {
      throw new ImportError('bad-template', `${file}: the column roles name ${missing.map((m) => `"${m}"`).join(', ')}, which the sheet does not have. Its headers are: ${headers.map((h) => `"${h}"`).join(', ')}.`, { file });
    }
    if (!given.speciesColumns?.length && !(given.species && given.count)) {
      throw new ImportError('bad-template', `${file}: say which columns hold the counts: one column per species, or a species column and a count column.`, { file });
    }
    return { roles: given, mappedBy: 'roles' };
  }
  return demoTemplate(headers) ?? guessRoles(headers, file);
}
