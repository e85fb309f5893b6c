/** The section of the multi-species composite index. */
import type { CompositeResult } from '../trend/composite';
import { indexChartBlock, seasonSpan } from './group-section';
import type { Section } from './model';
import { formatNumber } from './number-format';
import { indexTable } from './tables';

const one = { kind: 'fixed', decimals: 1 } as const;

/** What the composite's last index says against the base, without saying more than its limits allow. */
export function compositeSentence(c: CompositeResult['composite'], groups: number, members = 'species'): string {
  const { first, last } = seasonSpan(c.indices);
  const end = c.indices[c.indices.length - 1];
  const value = `${formatNumber(end.index, one)} (95% limits ${formatNumber(end.lower, one)} to ${formatNumber(end.upper, one)})`;
  const head = `The composite index of ${groups} ${members} stood at ${value} in ${last}, against 100 in ${first}`;
  if (end.upper < 100) return `${head}: lower than at the start.`;
  if (end.lower > 100) return `${head}: higher than at the start.`;
  return `${head}: the data cannot tell whether it is lower or higher than at the start.`;
}

/** `members` names what the composite combines ("species", or 'values of "site"'). */
export function compositeSection(c: CompositeResult['composite'], timeName: string, members = 'species', id = 'composite'): Section {
  const groups = Object.keys(c.weights).length;
  const equal = Object.values(c.weights).every((w) => w === 1);
  const weights = equal ? `All ${members} weigh the same.` : `Weights: ${Object.entries(c.weights).map(([k, w]) => `${k} ${w}`).join(', ')}.`;
  return {
    id,
    heading: `Composite of ${groups} ${members}`,
    blocks: [
      { kind: 'paragraph', emphasis: true, text: compositeSentence(c, groups, members) },
      indexChartBlock(`${id}-index-chart`, c.indices, `the composite of ${groups} ${members}`, timeName, 'Shaded: 95% site-block bootstrap limits.'),
      indexTable(`${id}-indices`, `Composite index of ${groups} ${members} with 95% limits`, timeName, c.indices),
      {
        kind: 'paragraph',
        text: `Method: ${c.method}. ${c.replicates - c.failedReplicates} of ${c.replicates} bootstrap replicates were used (seed ${c.seed}). ${weights}`,
        cites: ['composite', 'indicators', 'bootstrap'],
      },
    ],
  };
}
