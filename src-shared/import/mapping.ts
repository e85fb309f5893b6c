import { CellKind } from './cells';
import { cellNumber } from './cell-number';
import { serialToIso } from './excel-dates';
import { compileFieldCodes, defaultFieldCodes } from './field-codes';
import type { Finding } from './findings';
import type { ImportedColumn, ImportedTable, ImportQuestion } from './imported-table';
import { placeOf } from './imported-table';
import type { ColumnMap, MappingTemplate } from './mapping-template';
import type { CountRecord } from './records';
import { foldName } from './similarity';
import { readCovariateColumn, type CovariateValue } from './visit-covariates';
import { matchTemplate, templateFindings, type TemplateMatch } from './template-match';
import { parseClearTextDate, parseTextDate, readDateColumn, type DateOrder } from './text-dates';
import { isAreaUnit, isEffortUnit, toCanonicalEffort, toHectares, effortUnitInfo, unitFromHeader } from './units';

/**
 * Applies a mapping template to an imported table: one CountRecord per
 * count cell (wide layouts reshaped: one record per species column or per
 * visit column), dates read (a plain number in the date column as a day
 * serial), field codes classified, effort converted to its
 * canonical unit, area to hectares (from the row, or joined from a site
 * sheet by site name).
 */
export interface MappingOptions {
  readonly dateOrder?: DateOrder;
  /** The site sheet named in the template, already imported. */
  readonly siteTable?: ImportedTable;
}

export interface MappingResult {
  readonly records: CountRecord[];
  readonly findings: Finding[];
  readonly questions: ImportQuestion[];
  readonly match: TemplateMatch;
  /** Canonical effort unit ('hours', 'km', ...) or undefined without an effort column. */
  readonly effortUnit?: string;
  /** Whether an area was mapped (in the counts sheet or the site sheet). */
  readonly hasArea: boolean;
  readonly hasDate: boolean;
}

interface Bound {
  readonly map: ColumnMap;
  readonly col: ImportedColumn;
  readonly index: number;
}

/** Site attributes from the site sheet: area (ha) and covariates, by folded site name. */
function siteAttributes(template: MappingTemplate, siteTable: ImportedTable | undefined, findings: Finding[]) {
  const out = new Map<string, { area: number | null; covariates: Record<string, string> }>();
  if (!template.sites || !siteTable) return { attrs: out, hasArea: false };
  const m = matchTemplate(template.sites.columns, siteTable.columns.map((c) => c.name));
  findings.push(...templateFindings(m, template.sites.columns, { file: siteTable.file, sheet: siteTable.sheets[0], headerRow: siteTable.headerRows[0], letterOf: (h) => siteTable.columns.find((c) => c.name === h)?.letters[0] ?? '' }).filter((f) => f.code !== 'template-new-column'));
  const bound = template.sites.columns.map((map, i) => ({ map, col: m.indexOf[i] >= 0 ? siteTable.columns[m.indexOf[i]] : undefined }));
  const site = bound.find((b) => b.map.role === 'site')?.col;
  const area = bound.find((b) => b.map.role === 'area' && b.col);
  if (!site) return { attrs: out, hasArea: false };
  const areaUnit = area && (isAreaUnit(area.map.unit) ? area.map.unit : unitFromHeader(area.map.header));
  for (let i = 0; i < siteTable.nrows; i++) {
    const name = foldName(site.texts[i]);
    if (!name) continue;
    const covariates: Record<string, string> = {};
    for (const b of bound) if (b.map.role === 'covariate' && b.col) covariates[b.map.name ?? b.map.header] = b.col.texts[i].trim();
    let a: number | null = null;
    if (area?.col) {
      const v = cellNumber(area.col, i, siteTable.source.decimalMark ?? '.');
      a = Number.isFinite(v) ? toHectares(v, isAreaUnit(areaUnit) ? areaUnit : 'ha') : null;
    }
    out.set(name, { area: a, covariates });
  }
  return { attrs: out, hasArea: !!area?.col };
}

export function applyMapping(table: ImportedTable, template: MappingTemplate, options: MappingOptions = {}): MappingResult {
  const findings: Finding[] = [];
  const questions: ImportQuestion[] = [];
  const headers = table.columns.map((c) => c.name);
  const match = matchTemplate(template.columns, headers);
  const letterOf = (h: string) => table.columns.find((c) => c.name === h)?.letters.find((l) => l) ?? '';
  findings.push(...templateFindings(match, template.columns, { file: table.file, sheet: table.sheets[0], headerRow: table.headerRows[0], letterOf }));
  const bound: Bound[] = [];
  template.columns.forEach((map, i) => {
    if (match.indexOf[i] >= 0) bound.push({ map, col: table.columns[match.indexOf[i]], index: match.indexOf[i] });
  });
  const one = (role: string) => bound.find((b) => b.map.role === role);
  const site = one('site');
  const dateB = one('date');
  const seasonB = one('season');
  const visitB = one('visit');
  const speciesB = one('species');
  const effortB = one('effort');
  const areaB = one('area');
  const observerB = one('observer');
  const covariates = bound.filter((b) => b.map.role === 'covariate');
  const counts = bound.filter((b) => b.map.role === 'count');
  const decimalMark = template.decimalMark ?? table.source.decimalMark ?? '.';
  const classify = compileFieldCodes(template.fieldCodes ?? defaultFieldCodes, decimalMark);
  const { attrs, hasArea: siteArea } = siteAttributes(template, options.siteTable, findings);

  const effortUnitName = effortB && (isEffortUnit(effortB.map.unit) ? effortB.map.unit : unitFromHeader(effortB.map.header));
  const effortUnit = effortB ? (isEffortUnit(effortUnitName) ? effortUnitInfo(effortUnitName).canonical : 'as given') : undefined;
  if (effortB && !isEffortUnit(effortUnitName)) {
    findings.push({ code: 'effort-unit-unknown', severity: 'warning', file: table.file, sheet: table.sheets[0], row: table.headerRows[0], column: letterOf(effortB.col.name), columnName: effortB.col.name, message: `The unit of the effort column "${effortB.col.name}" is not known, so effort is used as given.`, fix: 'Set the unit (minutes, hours, km, m, trap-nights ...) for this column in the mapping.' });
  }
  const areaUnitName = areaB && (isAreaUnit(areaB.map.unit) ? areaB.map.unit : unitFromHeader(areaB.map.header));

  // Dates: read the column as a whole to settle day/month order.
  const dateOrder = options.dateOrder ?? template.dateOrder;
  let order: DateOrder | null = dateOrder ?? null;
  if (dateB && !dateOrder) {
    const textDates = dateB.col.texts.filter((_, i) => dateB.col.kinds[i] === CellKind.text);
    const reading = readDateColumn(textDates);
    if (reading.order === 'dmy' || reading.order === 'mdy') order = reading.order;
    else if (reading.order === 'ambiguous') {
      const existing = table.questions.find((q) => q.columnName === dateB.col.name);
      const letter = letterOf(dateB.col.name);
      questions.push(existing ?? {
        code: 'ambiguous-date-order', sheet: table.sheets[0], column: letter, columnName: dateB.col.name, examples: reading.examples, options: ['dmy', 'mdy'],
        message: `The dates in column ${letter} ("${dateB.col.name}") can be read day-first or month-first (for example ${reading.examples.map((e) => `"${e}"`).join(', ')}). Say which: day/month/year or month/day/year.`,
      });
    }
  }

  const records: CountRecord[] = [];
  if (!site || counts.length === 0) return { records, findings, questions, match, effortUnit, hasArea: false, hasDate: !!dateB };
  const columnsOf = {
    site: letterOf(site.col.name), date: dateB && letterOf(dateB.col.name), season: seasonB && letterOf(seasonB.col.name), visit: visitB && letterOf(visitB.col.name),
    effort: effortB && letterOf(effortB.col.name), area: areaB && letterOf(areaB.col.name), observer: observerB && letterOf(observerB.col.name), species: speciesB && letterOf(speciesB.col.name),
  };
  const covariateValues = covariates.map((b) => ({ name: b.map.name ?? b.map.header, values: readCovariateColumn(b.col, decimalMark) }));
  const dateCache = new Map<string, string | null>();
  const date1904 = table.source.date1904 ?? false;
  for (let i = 0; i < table.nrows; i++) {
    const siteName = site.col.texts[i].trim();
    let date: string | null = null;
    let dateText = '';
    let dateKind: CountRecord['dateKind'];
    if (dateB) {
      const k = dateB.col.kinds[i];
      dateText = dateB.col.texts[i].trim();
      dateKind = k === CellKind.date ? 'date' : k === CellKind.number ? 'number' : dateText === '' ? 'blank' : 'text';
      if (k === CellKind.date) date = dateText.slice(0, 10);
      else if (k === CellKind.number) date = serialToIso(dateB.col.numbers[i], date1904)?.slice(0, 10) ?? null;
      else if (k === CellKind.text) {
        let d = dateCache.get(dateText);
        if (d === undefined) {
          d = order ? parseTextDate(dateText, order) : parseClearTextDate(dateText);
          dateCache.set(dateText, d);
        }
        date = d;
      }
    }
    const season = seasonB ? seasonB.col.texts[i].trim() : date ? date.slice(0, 4) : '';
    let effort: number | null = null;
    let effortText = '';
    if (effortB) {
      effortText = effortB.col.texts[i].trim();
      const v = cellNumber(effortB.col, i, decimalMark);
      effort = Number.isFinite(v) ? (isEffortUnit(effortUnitName) ? toCanonicalEffort(v, effortUnitName) : v) : null;
    }
    const attr = attrs.get(foldName(siteName));
    let area: number | null = attr?.area ?? null;
    if (areaB) {
      const v = cellNumber(areaB.col, i, decimalMark);
      area = Number.isFinite(v) ? toHectares(v, isAreaUnit(areaUnitName) ? areaUnitName : 'ha') : null;
    }
    const cov: Record<string, string> = { ...(attr?.covariates ?? {}) };
    for (const b of covariates) cov[b.map.name ?? b.map.header] = b.col.texts[i].trim();
    const visitCovariates: Record<string, CovariateValue> = {};
    for (const c of covariateValues) visitCovariates[c.name] = c.values[i];
    const observer = observerB ? observerB.col.texts[i].trim() : '';
    const { sheet, row } = placeOf(table, site.index, i);
    for (const c of counts) {
      const kind = c.col.kinds[i];
      const reading = classify(c.col.texts[i], kind, c.col.numbers[i]);
      const rule = reading.rule === '' && kind === CellKind.text ? 'number-as-text' : reading.rule;
      const species = template.layout === 'wide-species' ? (c.map.species ?? c.map.header) : speciesB ? speciesB.col.texts[i].trim() : (template.species ?? c.map.header);
      const visit = template.layout === 'wide-visit' ? (c.map.visit ?? c.map.header) : visitB ? visitB.col.texts[i].trim() : '';
      records.push({
        sheet, row, column: c.col.letters[table.sheetIndex[i]], site: siteName, date, dateText, dateKind, season, visit, species,
        code: c.col.texts[i], status: reading.status, count: Number.isNaN(reading.number) ? null : reading.number, rule,
        effort, effortText, area, observer, covariates: cov, ...(covariateValues.length ? { visitCovariates } : {}), columns: columnsOf, formulaError: c.col.kinds[i] === CellKind.error,
      });
    }
  }
  return { records, findings, questions, match, effortUnit, hasArea: !!areaB || siteArea, hasDate: !!dateB };
}
