/**
 * Builds the annual trend report document from the trend results of each
 * group (or of the one table), the optional composite and the provenance.
 * buildTrendReport(input) is the one entry point.
 *
 * Optional fields, each filled from engine outputs by the builder named
 * (all in src-shared/report unless said); absent fields leave their part out:
 *   GroupTrend.spec         the group's own ModelSpec (the chosen model; the
 *                           methods paragraph and appendix use it; default
 *                           ReportInput.spec)
 *   GroupTrend.comparison   comparisonDigest(candidates, chosenLabel, reason?)
 *                           in comparison-digest.ts, from { label, spec,
 *                           outcome: fitModel(table, spec) } per candidate
 *   GroupTrend.diagnostics  groupDiagnostics(fitModel(table, spec), label,
 *                           seed?) in diagnostics-section.ts (rootogram and
 *                           quantile residuals of the chosen model)
 *   GroupTrend.data         dataSummary(groupTable, spec) in data-summary.ts
 *   ReportInput.cleaning    the project's EditLog as is (cleaning-summary.ts
 *                           groups it by change and reason; the whole log
 *                           goes to the "Audit log" sheet)
 *   ReportInput.cleaningRecords  { raw, cleaned, conflicts } of
 *                           cleanedAnalysisOf: the records each change
 *                           altered are counted (without: from the log)
 *   Provenance.project      { name, sha256 } of the project file (appendix.ts);
 *                           source files go in Provenance.inputs as before
 * groupReportParts(table, chosen, others, options) in group-parts.ts makes
 * spec, comparison, diagnostics and data of a group in one call (it fits
 * each model once): { ...groupTrend, ...groupReportParts(...) }.
 */
import type { EditLog } from '../cleaning/edit-entry';
import type { ModelSpec } from '../model/spec';
import type { CompositeResult } from '../trend/composite';
import { appendixSection, type Provenance } from './appendix';
import { cautionsSection } from './cautions';
import { auditLogTable, cleaningBlocks, type CleaningRecords } from './cleaning-summary';
import { comparisonCells, comparisonColumns } from './comparison-section';
import { dataSummaryCells, dataSummaryColumns } from './data-summary';
import { compositeSection } from './composite-section';
import { groupSection, seasonSpan, type GroupTrend } from './group-section';
import type { Block, Cell, ReportDocument, Section, SheetTable } from './model';
import { referenceList } from './references';
import type { SinceLast } from './since-last';
import { sinceLastSection, sinceLastSheet } from './since-last-section';
import { changeOverSpan } from './summary-sentence';
import { coefficientCells, coefficientColumns, indexCells, indexColumns, summaryTable, type SummaryRow } from './tables';

export interface ReportInput {
  readonly title: string;
  readonly subtitle?: string;
  readonly spec: ModelSpec;
  /** The column the groups are values of ("species"); absent for a single table. */
  readonly groupColumn?: string;
  readonly groups: readonly GroupTrend[];
  readonly composite?: CompositeResult['composite'];
  /** Cautions beyond the general ones (e.g. why there is no composite). */
  readonly cautions?: readonly string[];
  readonly provenance: Provenance;
  /** The cleaning audit log of the records behind the report. */
  readonly cleaning?: EditLog;
  /** The imported and cleaned records behind the log, when at hand: the cleaning part then counts the records each change altered. */
  readonly cleaningRecords?: CleaningRecords;
  /** This report against the last one in the project's history: the section "Since the last report" after the summary. */
  readonly sinceLast?: SinceLast;
}

/** A section id from a group value: letters and digits only, unique within the report. */
function sectionIds(groups: readonly GroupTrend[]): string[] {
  const seen = new Map<string, number>();
  return groups.map((g, i) => {
    const stem = `group-${g.group.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || i + 1}`;
    const n = seen.get(stem) ?? 0;
    seen.set(stem, n + 1);
    return n ? `${stem}-${n + 1}` : stem;
  });
}

function summaryRows(groups: readonly GroupTrend[]): SummaryRow[] {
  return groups.flatMap((g) => {
    if (!g.result) return [];
    const s = g.result.slope;
    const c = changeOverSpan(s, seasonSpan(g.result.indices).span);
    const direction = c.upper < 0 ? 'decline' : c.lower > 0 ? 'increase' : 'cannot tell decline from increase';
    return [{ group: g.label ?? (g.group || 'all'), perSeason: s.perYear, lower: s.lower, upper: s.upper, overSpan: c.perYear, overLower: c.lower, overUpper: c.upper, direction, converged: g.result.fit.converged }];
  });
}

function citesOf(sections: readonly Section[]): string[] {
  return sections.flatMap((s) => s.blocks.flatMap((b: Block) => (b.kind === 'paragraph' ? (b.cites ?? []) : [])));
}

/** The sheets of the optional inputs: model comparison and data summary of every group that has one, the audit log. */
function optionalSheets(input: ReportInput, groupHeader: string, label: (g: GroupTrend) => string): SheetTable[] {
  const sheets: SheetTable[] = [];
  const compared = input.groups.filter((g) => g.comparison);
  if (compared.length) {
    sheets.push({ name: 'Model comparison', table: { kind: 'table', id: 'sheet-comparison', caption: 'Models compared for each group, with the one chosen', columns: comparisonColumns(groupHeader), rows: compared.flatMap((g) => comparisonCells(g.comparison!, label(g))) } });
  }
  const summarised = input.groups.filter((g) => g.data);
  if (summarised.length) {
    const first = summarised[0].data!;
    sheets.push({ name: 'Data summary', table: { kind: 'table', id: 'sheet-data', caption: 'Sites, visits, counts and effort per season', columns: dataSummaryColumns(first, groupHeader), rows: summarised.flatMap((g) => dataSummaryCells(g.data!, label(g))) } });
  }
  if (input.cleaning) sheets.push({ name: 'Audit log', table: auditLogTable(input.cleaning, input.cleaningRecords) });
  return sheets;
}

export function buildTrendReport(input: ReportInput): ReportDocument {
  if (input.groups.length === 0) throw new RangeError('A report needs the trend of at least one group.');
  const timeName = input.spec.time?.column ?? 'season';
  const groupHeader = input.groupColumn ?? 'Group';
  const ids = sectionIds(input.groups);
  const fitted = input.groups.filter((g) => g.result);
  const first = fitted[0]?.result ? seasonSpan(fitted[0].result.indices) : undefined;
  const spanWords = first ? `${first.first}–${first.last}` : 'over the period';
  const rows = summaryRows(input.groups);
  const overview: Section = {
    id: 'summary',
    heading: 'Summary',
    blocks: [
      summaryTable('summary-table', `Trend of each ${input.groupColumn ?? 'group'}: change a season and over the period, with 95% limits`, groupHeader, rows, spanWords),
      ...input.groups.filter((g) => !g.result).map((g): Block => ({ kind: 'caution', title: `${g.label ?? g.group}: not fitted`, items: [g.error ?? 'The trend could not be fitted.'] })),
    ],
  };
  const groupSections = input.groups.map((g, i) => groupSection(g, input.spec, ids[i]));
  const sections: Section[] = [cautionsSection(input.cautions), overview];
  if (input.sinceLast) sections.push(sinceLastSection(input.sinceLast));
  if (input.cleaning) sections.push({ id: 'cleaning', heading: 'What cleaning changed', blocks: cleaningBlocks(input.cleaning, input.cleaningRecords), continues: true });
  sections.push(...groupSections);
  if (input.composite) sections.push(compositeSection(input.composite, timeName, !input.groupColumn || input.groupColumn === 'species' ? 'species' : `values of "${input.groupColumn}"`));
  const label = (g: GroupTrend) => g.label ?? (g.group || 'all');
  const sheets: SheetTable[] = [
    { name: 'Trend summary', table: overview.blocks[0] as SheetTable['table'] },
    {
      name: 'Indices',
      table: { kind: 'table', id: 'sheet-indices', caption: 'Annual indices with 95% limits', columns: indexColumns(timeName, groupHeader), rows: fitted.flatMap((g) => indexCells(g.result!.indices, label(g))) },
    },
    {
      name: 'Coefficients',
      table: { kind: 'table', id: 'sheet-coefficients', caption: 'Model coefficients', columns: coefficientColumns(groupHeader), rows: fitted.flatMap((g): Cell[][] => coefficientCells(g.result!.fit, label(g))) },
    },
  ];
  if (input.sinceLast) sheets.push(sinceLastSheet(input.sinceLast));
  sheets.push(...optionalSheets(input, groupHeader, label));
  if (input.composite) sheets.push({ name: 'Composite', table: { kind: 'table', id: 'sheet-composite', caption: 'Composite index with 95% limits', columns: indexColumns(timeName), rows: indexCells(input.composite.indices) } });
  return {
    title: input.title,
    subtitle: input.subtitle ?? '',
    createdAt: input.provenance.createdAt,
    sections,
    appendix: appendixSection(input.provenance, input.spec, input.groups.map((g) => ({ group: label(g), spec: g.spec ?? input.spec }))),
    references: referenceList(citesOf(sections)),
    sheets,
  };
}
