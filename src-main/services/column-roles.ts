import type { ColumnRoles } from '@shared/host/contract';
import { REMARKS_HEADER, VISIT_COLUMNS } from '@shared/demo/season-sheet';
import { ImportError } from '@shared/import/import-error';
import type { ImportedTable } from '@shared/import/imported-table';
import { guessTemplate } from '@shared/import/mapping-guess';
import { templateToRoles } from '@shared/import/roles-template';
import type { DateOrder } from '@shared/import/text-dates';

/**
 * Which column is site, date, effort, species ...: the roles the user chose,
 * else the built-in roles of the demo programme's tally sheets, else the
 * shared guess from the headers and cells (the one `tallywise check` makes).
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
    roles: { site: 'Pond', date: 'Date', visit: 'Visit', observer: 'Observer', effort: 'Minutes', effortUnit: 'minutes', speciesColumns: species, covariates: ['Water temp (°C)'] },
    mappedBy: 'demo-template',
    dateOrder: 'dmy',
  };
}

function listHeaders(headers: readonly string[]): string {
  return headers.map((h) => `"${h}"`).join(', ');
}

/** Roles from the shared guess; an ImportError ('bad-template') says what the headers did not tell. */
export function guessRoles(table: ImportedTable, file: string): RolePlan {
  const headers = table.columns.map((c) => c.name);
  const guess = templateToRoles(guessTemplate(table));
  if ('roles' in guess) return { roles: guess.roles, mappedBy: 'guessed' };
  if (guess.gap === 'no-site') {
    throw new ImportError('bad-template', `${file}: no column was recognised as the site (a header such as "Site" or "Pond"). The headers are: ${listHeaders(headers)}. Rename the site column's header to "Site", or choose the column roles by hand.`, { file });
  }
  throw new ImportError('bad-template', `${file}: no count columns were found (a "Species" and a "Count" column, or one column per species). Add them, or choose the column roles by hand.`, { file });
}

/** The roles to use: given ones first, then the demo template, then a guess. */
export function planRoles(table: ImportedTable, file: string, given?: ColumnRoles): RolePlan {
  const headers = table.columns.map((c) => c.name);
  if (given) {
    const missing = [given.site, given.date, given.season, given.visit, given.observer, given.effort, given.species, given.count, ...(given.speciesColumns ?? []), ...(given.covariates ?? [])]
      .filter((h): h is string => h !== undefined)
      .filter((h) => !headers.includes(h));
    if (missing.length) {
      throw new ImportError('bad-template', `${file}: the column roles name ${missing.map((m) => `"${m}"`).join(', ')}, which the sheet does not have. Its headers are: ${listHeaders(headers)}.`, { file });
    }
    if (!given.speciesColumns?.length && !(given.species && given.count)) {
      throw new ImportError('bad-template', `${file}: say which columns hold the counts: one column per species, or a species column and a count column.`, { file });
    }
    return { roles: given, mappedBy: 'roles' };
  }
  return demoTemplate(headers) ?? guessRoles(table, file);
}
