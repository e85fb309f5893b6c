import { CellKind } from './cells';
import { compileFieldCodes } from './field-codes';
import type { ImportedColumn, ImportedTable } from './imported-table';
import type { ColumnMap, MappingTemplate, Role } from './mapping-template';
import { isAreaUnit, isEffortUnit, unitFromHeader } from './units';

/**
 * A first guess at the mapping from header names and cell contents, for a
 * sheet without a template. The user confirms it; the check command uses it
 * as is and says so.
 */
const namePatterns: [Role, RegExp][] = [
  ['site', /^(site|pond|plot|transect|location|station|sector|field|farm|route|square|site\s*(name|id|code)|pond\s*name)\b/i],
  ['date', /^(date|survey\s*date|visit\s*date|day)\b/i],
  ['season', /^(season|year|yr)\b/i],
  ['visit', /^(visit|round|visit\s*(no|number|#))\b/i],
  ['species', /^(species|taxon|spp)\b/i],
  ['count', /^(count|counts|number|n|total|abundance|tally|individuals)\b/i],
  ['effort', /^(effort|minutes|mins|hours|duration|time\s*spent|length|distance|trap.?nights|survey\s*time)\b/i],
  ['area', /^(area|size)\b/i],
  ['observer', /^(observer|recorder|surveyor|counter|volunteer|initials)\b/i],
  ['ignore', /^(remarks?|notes?|comments?)\b/i],
  ['covariate', /temp|depth|cover|habitat|wind|cloud|weather|\bph\b|conductiv|altitude|elevation|moon|rain/i],
];

function guessRole(name: string): Role | undefined {
  for (const [role, re] of namePatterns) if (re.test(name.trim())) return role;
  return undefined;
}

const classify = compileFieldCodes();

/** Whether a column reads as counts: whole numbers and known field codes, at least one number. */
function countLike(col: ImportedColumn): boolean {
  let numbers = 0;
  let filled = 0;
  let readable = 0;
  let fractional = 0;
  for (let i = 0; i < col.kinds.length && i < 2000; i++) {
    const k = col.kinds[i];
    if (k === CellKind.blank) continue;
    filled++;
    const r = classify(col.texts[i], k, col.numbers[i]);
    if (r.status !== 'invalid') readable++;
    if (k === CellKind.number) {
      numbers++;
      if (!Number.isInteger(col.numbers[i])) fractional++;
    }
  }
  return numbers > 0 && readable / filled >= 0.9 && fractional / numbers < 0.05;
}

export function guessTemplate(table: ImportedTable): MappingTemplate {
  const columns: ColumnMap[] = [];
  const taken = new Set<Role>();
  const unassigned: ImportedColumn[] = [];
  for (const col of table.columns) {
    const role = guessRole(col.name);
    if (role && (role === 'ignore' || role === 'covariate' || !taken.has(role))) {
      const unit = unitFromHeader(col.name);
      const map: ColumnMap = { header: col.name, role };
      if (role === 'effort' && isEffortUnit(unit)) map.unit = unit;
      if (role === 'area' && isAreaUnit(unit)) map.unit = unit;
      columns.push(map);
      if (role !== 'ignore' && role !== 'covariate') taken.add(role);
    } else unassigned.push(col);
  }
  let layout: MappingTemplate['layout'] = 'long';
  if (!taken.has('count')) {
    // Wide by species: the count-like columns left over are one species each.
    const wide = unassigned.filter(countLike);
    for (const col of wide) columns.push({ header: col.name, role: 'count', species: col.name });
    if (wide.length) layout = 'wide-species';
    for (const col of unassigned) if (!wide.includes(col)) columns.push({ header: col.name, role: 'covariate' });
  } else {
    for (const col of unassigned) columns.push({ header: col.name, role: 'covariate' });
  }
  return { kind: 'tallywise-mapping', version: 1, sheet: table.sheets[0] || undefined, layout, columns };
}
