/**
 * The section of one species (or the one table): summary, index chart and
 * table, flags, the model chosen and its comparison, the main diagnostics,
 * the data behind the trend, methods, coefficients.
 */
import { indexChart } from '../charts/index-chart';
import type { ModelSpec } from '../model/spec';
import type { DecisionFlags } from '../trend/flags';
import type { IndexRow } from '../trend/interval';
import type { TrendResult } from '../trend/trend-analysis';
import type { ModelComparisonDigest } from './comparison-digest';
import { comparisonBlocks } from './comparison-section';
import { dataSummaryBlocks, type DataSummary } from './data-summary';
import { diagnosticsBlocks, type GroupDiagnostics } from './diagnostics-section';
import type { Block, ChartBlock, Section } from './model';
import { limitsParagraph, modelParagraph } from './methods';
import { formatNumber } from './number-format';
import { summarySentence } from './summary-sentence';
import { coefficientTable, indexTable } from './tables';

export interface GroupTrend {
  /** The value of the grouping column ("common_toad"), or '' for a single table. */
  readonly group: string;
  /** The name to print ("Common toad"); the group value when absent. */
  readonly label?: string;
  readonly result?: TrendResult;
  readonly flags?: DecisionFlags;
  /** Why the group could not be fitted. */
  readonly error?: string;
  /** The model spec this group's trend was fitted with; `ReportInput.spec` when absent. */
  readonly spec?: ModelSpec;
  /** The models compared for this group and the one chosen (comparisonDigest). */
  readonly comparison?: ModelComparisonDigest;
  /** Rootogram and quantile residuals of the chosen model (groupDiagnostics). */
  readonly diagnostics?: GroupDiagnostics;
  /** Sites, visits, counts and effort per season of the group's table (dataSummary). */
  readonly data?: DataSummary;
}

export const CHART_SIZE = { width: 760, height: 420 } as const;

/** Seasons between the first and last index rows (numeric seasons: their difference; otherwise the count less one). */
export function seasonSpan(rows: readonly IndexRow[]): { first: number | string; last: number | string; span: number } {
  const first = rows[0].time;
  const last = rows[rows.length - 1].time;
  const span = typeof first === 'number' && typeof last === 'number' ? last - first : rows.length - 1;
  return { first, last, span };
}

/** A line chart of an index with its band, and a plain description of it. */
export function indexChartBlock(id: string, rows: readonly IndexRow[], subject: string, timeName: string, note: string): ChartBlock {
  const { first, last } = seasonSpan(rows);
  const finite = rows.map((r) => r.index).filter(Number.isFinite);
  const lo = Math.min(...finite);
  const hi = Math.max(...finite);
  const base = rows.find((r) => r.index === 100 && r.lower === 100 && r.upper === 100)?.time;
  const alt = `Line chart of the annual index of ${subject} for each ${timeName} from ${first} to ${last}${base !== undefined ? ` (${base} = 100)` : ''}, with its 95% limits as a shaded band; the index runs between ${formatNumber(lo, { kind: 'fixed', decimals: 1 })} and ${formatNumber(hi, { kind: 'fixed', decimals: 1 })}.`;
  return { kind: 'chart', id, option: indexChart(rows, { subject, timeName, note }), alt, ...CHART_SIZE };
}

export function groupSection(g: GroupTrend, defaultSpec: ModelSpec, id: string): Section {
  const spec = g.spec ?? defaultSpec;
  const subject = g.label ?? (g.group || 'the counts');
  const heading = g.label ?? (g.group || 'Trend');
  if (!g.result) {
    return { id, heading, blocks: [{ kind: 'caution', title: 'Not fitted', items: [g.error ?? 'The trend could not be fitted.'] }] };
  }
  const r = g.result;
  const timeName = spec.time?.column ?? 'season';
  const { first, last, span } = seasonSpan(r.indices);
  const blocks: Block[] = [{ kind: 'paragraph', emphasis: true, text: summarySentence({ subject, slope: r.slope, first, last, span }) }];
  const problems = [...r.fit.warnings];
  if (!r.fit.converged) problems.unshift('The model fit did not converge: treat every number in this section as unreliable until the model is simplified or the data checked.');
  if (problems.length) blocks.push({ kind: 'caution', title: 'Warnings from the fit', items: problems });
  blocks.push(indexChartBlock(`${id}-index-chart`, r.indices, subject, timeName, `Shaded: 95% limits. ${r.method?.indices ?? ''}`.trim()));
  blocks.push(indexTable(`${id}-indices`, `Annual index of ${subject} (${r.method?.base ?? first} = 100) with 95% limits`, timeName, r.indices, r.method ? [`Limits: ${r.method.indices}.`] : undefined));
  if (g.flags) {
    blocks.push({ kind: 'paragraph', text: `Projection of the fitted rate over ${g.flags.horizon} seasons. ${g.flags.summary}`, cites: ['redList'] });
    blocks.push({ kind: 'list', title: 'Threshold flags', items: g.flags.thresholds.map((t) => t.sentence) });
    blocks.push({ kind: 'caution', title: 'About these flags', items: [g.flags.caution] });
  }
  if (g.comparison) blocks.push(...comparisonBlocks(`${id}-comparison`, subject, g.comparison));
  if (g.diagnostics) blocks.push(...diagnosticsBlocks(id, subject, g.diagnostics));
  if (g.data) blocks.push(...dataSummaryBlocks(`${id}-data`, subject, g.data));
  blocks.push(modelParagraph(spec), limitsParagraph(r));
  blocks.push(coefficientTable(`${id}-coefficients`, `Coefficients of the model for ${subject}`, r.fit, [fitLine(r)]));
  return { id, heading, blocks };
}

function fitLine(r: TrendResult): string {
  const f = r.fit;
  const parts = [`${f.nobs} rows`, `${f.iterations} iterations${f.converged ? '' : ' (not converged)'}`];
  if (f.aic !== null) parts.push(`AIC ${formatNumber(f.aic, { kind: 'fixed', decimals: 1 })}`);
  if (f.theta !== null) parts.push(`theta ${formatNumber(f.theta, { kind: 'fixed', decimals: 3 })}`);
  if (f.dispersion != null) parts.push(`dispersion ${formatNumber(f.dispersion, { kind: 'fixed', decimals: 3 })}`);
  if (f.random) parts.push(`random-effect SD ${formatNumber(f.random.sd, { kind: 'fixed', decimals: 3 })}`);
  return `Fit: ${parts.join('; ')}.`;
}
