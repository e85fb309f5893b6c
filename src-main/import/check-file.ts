import { readFile } from 'node:fs/promises';
import { needsAction, sortFindings, type Finding } from '../../src-shared/import/findings';
import { ImportError } from '../../src-shared/import/import-error';
import type { ImportedTable, ImportQuestion } from '../../src-shared/import/imported-table';
import { checkMappedTable } from '../../src-shared/import/check-table';
import { applyMapping } from '../../src-shared/import/mapping';
import { guessTemplate } from '../../src-shared/import/mapping-guess';
import { parseTemplate, type MappingTemplate } from '../../src-shared/import/mapping-template';
import type { DateOrder } from '../../src-shared/import/text-dates';
import { importFile } from './import-file';

/**
 * The check service behind `tallywise check`: reads a file, applies a
 * mapping template (or a guessed one), validates the records and returns
 * every finding. Unreadable input throws an ImportError.
 */
export interface CheckOptions {
  /** Path of a mapping template (JSON). */
  readonly template?: string;
  readonly sheet?: string;
  readonly dateOrder?: DateOrder;
  readonly decimalMark?: '.' | ',';
  readonly onProgress?: (fraction: number, stage: string) => void;
  readonly signal?: AbortSignal;
}

export interface CheckReport {
  readonly file: string;
  readonly sheet: string;
  readonly templateSource: 'file' | 'guessed';
  readonly template: MappingTemplate;
  readonly findings: readonly Finding[];
  readonly questions: readonly ImportQuestion[];
  readonly summary: { readonly rows: number; readonly records: number; readonly sites: number; readonly species: number; readonly seasons: number };
  readonly encoding?: string;
  /** True when there are errors, warnings or open questions. */
  readonly needsAction: boolean;
}

export async function loadTemplate(path: string): Promise<MappingTemplate> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch {
    throw new ImportError('bad-template', `The template ${path} cannot be read. Check the path.`, { file: path });
  }
  let json: unknown;
  try {
    json = JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch (e) {
    throw new ImportError('bad-template', `The template ${path} is not valid JSON (${(e as Error).message}). Save it again from the mapping screen.`, { file: path });
  }
  return parseTemplate(json, `The template ${path}`);
}

function describeGuess(t: MappingTemplate): string {
  const byRole = new Map<string, string[]>();
  for (const c of t.columns) if (c.role !== 'ignore') byRole.set(c.role, [...(byRole.get(c.role) ?? []), `"${c.header}"`]);
  return [...byRole].map(([role, cols]) => `${role}: ${cols.join(', ')}`).join('; ');
}

export async function checkFile(file: string, options: CheckOptions = {}): Promise<CheckReport> {
  const given = options.template ? await loadTemplate(options.template) : undefined;
  const sheet = options.sheet ?? given?.sheet;
  const dateOrder = options.dateOrder ?? given?.dateOrder;
  const table: ImportedTable = await importFile(file, { sheet, dateOrder, decimalMark: options.decimalMark ?? given?.decimalMark, onProgress: options.onProgress, signal: options.signal });
  const template = given ?? guessTemplate(table);
  const findings: Finding[] = [...table.findings];
  if (!given) {
    findings.push({
      code: 'mapping-guessed', severity: 'info', file, sheet: table.sheets[0], row: table.headerRows[0],
      message: `No template was given; the columns were read as ${describeGuess(template)} (layout ${template.layout}).`,
      fix: 'If a column was read wrongly, save a mapping template and give it with --template.',
    });
  }
  let siteTable: ImportedTable | undefined;
  if (template.sites && table.source.kind === 'xlsx') {
    siteTable = await importFile(file, { sheet: template.sites.sheet, signal: options.signal });
  } else if (template.sites) {
    findings.push({ code: 'site-sheet-unavailable', severity: 'warning', file, message: `The template joins site attributes from sheet "${template.sites.sheet}", but a text file has no sheets, so areas and site covariates were not read.`, fix: 'Check the workbook itself, or add the site columns to this file and map them.' });
  }
  const mapped = applyMapping(table, template, { dateOrder, siteTable });
  // The same record checks the desktop import runs (src-shared/import/check-table.ts).
  findings.push(...checkMappedTable(table, template, mapped, file).map((l) => l.finding));
  // Name the column of every finding that gives only its letter.
  const names = new Map<string, string>();
  for (const t of [table, siteTable]) t?.columns.forEach((c) => c.letters.forEach((l, s) => l && names.set(`${t.sheets[s]}|${l}`, c.name)));
  const named = findings.map((f) => (f.column && !f.columnName && names.has(`${f.sheet ?? ''}|${f.column}`) ? { ...f, columnName: names.get(`${f.sheet ?? ''}|${f.column}`) } : f));
  const questions = [...new Map([...table.questions, ...mapped.questions].map((q) => [`${q.sheet}|${q.column}`, q])).values()];
  const counted = mapped.records.filter((r) => r.status !== 'not-surveyed');
  return {
    file, sheet: table.sheets[0], templateSource: given ? 'file' : 'guessed', template,
    findings: sortFindings(named), questions,
    summary: {
      rows: table.nrows, records: mapped.records.length,
      sites: new Set(counted.map((r) => r.site)).size, species: new Set(counted.map((r) => r.species)).size, seasons: new Set(counted.map((r) => r.season)).size,
    },
    encoding: table.source.encoding,
    needsAction: needsAction(findings) || questions.length > 0,
  };
}
