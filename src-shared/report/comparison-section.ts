/** The blocks "the model chosen and the comparison that supports it" of a group, from its digest. */
import type { ComparisonDigestRow, ModelComparisonDigest } from './comparison-digest';
import type { Block, Cell, TableBlock, TableColumnSpec } from './model';

const ONE = { kind: 'fixed', decimals: 1 } as const;
const TWO = { kind: 'fixed', decimals: 2 } as const;

/** Columns of the comparison table; the spreadsheet's has a leading group column and the distribution. */
export function comparisonColumns(groupHeader?: string): TableColumnSpec[] {
  return [
    ...(groupHeader ? [{ header: groupHeader }] : []),
    { header: 'Model' },
    ...(groupHeader ? [{ header: 'Distribution' }] : []),
    { header: 'Log-likelihood', format: ONE },
    { header: 'Params', format: { kind: 'integer' } },
    { header: 'AIC', format: ONE },
    { header: 'Delta AIC', format: ONE },
    { header: 'BIC', format: ONE },
    { header: 'Dispersion', format: TWO },
    { header: 'Zeros seen', format: { kind: 'integer' } },
    { header: 'Zeros expected', format: ONE },
    { header: 'Chosen' },
  ];
}

export function comparisonCells(d: ModelComparisonDigest, group?: string): Cell[][] {
  return d.rows.map((r: ComparisonDigestRow) => [
    ...(group !== undefined ? [group] : []),
    r.converged ? r.label : `${r.label} (not converged)`,
    ...(group !== undefined ? [r.distribution] : []),
    r.logLik,
    r.df,
    r.aic,
    r.deltaAic,
    r.bic,
    r.dispersion,
    r.observedZeros,
    r.expectedZeros,
    r.label === d.chosen ? 'yes' : '',
  ]);
}

export function comparisonTable(id: string, subject: string, d: ModelComparisonDigest): TableBlock {
  return {
    kind: 'table',
    id,
    caption: `Models compared for ${subject}`,
    columns: comparisonColumns(),
    rows: comparisonCells(d),
    notes: [
      'Params: estimated parameters. Delta AIC: AIC less the smallest AIC of the models compared; below about 2 two models are about as good (common practice). Dispersion: Pearson chi-square over residual df (about 1 when the variance is right).',
      'A dash: the number does not apply (quasi-Poisson has no likelihood).',
    ],
  };
}

/** A lead sentence naming the chosen model and who chose it, the table, the tests and the reading. */
export function comparisonBlocks(id: string, subject: string, d: ModelComparisonDigest): Block[] {
  const chosen = d.rows.find((r) => r.label === d.chosen);
  const rank = chosen?.deltaAic;
  const aicWords = rank === null || rank === undefined ? '' : rank === 0 ? ' It has the lowest AIC of the models compared.' : ` Its AIC is ${rank.toFixed(1)} above the lowest.`;
  const blocks: Block[] = [
    {
      kind: 'paragraph',
      text: `The trend of ${subject} comes from the model "${d.chosen}", chosen by the analyst from the ${d.rows.length} model${d.rows.length === 1 ? '' : 's'} below.${aicWords}${d.reason ? ` The analyst's reason: ${d.reason}` : ''}`,
      cites: ['aic', ...(d.tests.some((t) => t.test === 'likelihood ratio') ? ['boundaryLr'] : []), ...(d.tests.some((t) => t.test === 'Vuong') ? ['vuong', 'vuongZeros'] : [])],
    },
    comparisonTable(id, subject, d),
  ];
  // The reading already words the likelihood-ratio test; list it only when it does not.
  const worded = d.reading.some((r) => r.includes('LR statistic'));
  const tests = d.tests.filter((t) => t.test === 'Vuong' || !worded);
  if (tests.length) blocks.push({ kind: 'list', title: 'Tests between the models', items: tests.map((t) => t.text) });
  if (d.reading.length) blocks.push({ kind: 'list', title: 'Reading the comparison', items: [...d.reading] });
  return blocks;
}
