/** The methods paragraphs of a species section, written from the model spec and the trend's method notes. */
import { hasZeroPart, type ModelSpec, type Term } from '../model/spec';
import type { TrendResult } from '../trend/trend-analysis';
import type { ParagraphBlock } from './model';
import type { ReferenceKey } from './references';

const MODEL_WORDS: Record<ModelSpec['distribution'], { text: string; cites: ReferenceKey[] }> = {
  poisson: { text: 'a Poisson generalised linear model with a log link', cites: ['glm'] },
  quasipoisson: { text: 'a quasi-Poisson generalised linear model with a log link (the dispersion estimated from the Pearson chi-square over the residual degrees of freedom)', cites: ['glm'] },
  negbin: { text: 'a negative binomial generalised linear model with a log link (variance mu + mu^2/theta, theta estimated by maximum likelihood)', cites: ['negbin'] },
  zip: { text: 'a zero-inflated Poisson model (a logit model for the chance of an extra zero)', cites: ['zeroInflated', 'zeroModels'] },
  zinb: { text: 'a zero-inflated negative binomial model (a logit model for the chance of an extra zero)', cites: ['zeroInflated', 'zeroModels'] },
  'hurdle-poisson': { text: 'a Poisson hurdle model (a logit model for a non-zero count, a truncated Poisson for the positive counts)', cites: ['hurdle', 'zeroModels'] },
  'hurdle-negbin': { text: 'a negative binomial hurdle model (a logit model for a non-zero count, a truncated negative binomial for the positive counts)', cites: ['hurdle', 'zeroModels'] },
};

function termWords(t: Term): string {
  switch (t.type) {
    case 'numeric':
      return `"${t.column}" (numeric)`;
    case 'factor':
      return `"${t.column}" (factor${t.reference ? `, against "${t.reference}"` : ''})`;
    case 'interaction':
      return `the interaction of "${t.columns[0]}" and "${t.columns[1]}"`;
    case 'spline':
      return `a natural spline in "${t.column}" with ${t.df} df`;
  }
}

/** "a", "a and b", "a, b and c". */
export const andList = (xs: readonly string[]): string => (xs.length <= 1 ? xs.join('') : `${xs.slice(0, -1).join(', ')} and ${xs[xs.length - 1]}`);

/** "Counts were modelled with ..." — the model, its terms, offsets and site effect. */
export function modelParagraph(spec: ModelSpec): ParagraphBlock {
  const m = MODEL_WORDS[spec.distribution];
  const cites: ReferenceKey[] = [...m.cites];
  const parts = [`The counts in "${spec.response}" were modelled with ${m.text}.`];
  if (spec.time) {
    parts.push(spec.time.trend === 'annual'
      ? `Time entered as one effect per value of "${spec.time.column}"${spec.time.base !== undefined ? ` against ${spec.time.base}` : ''}.`
      : `Time entered as one log-linear slope on "${spec.time.column}".`);
  }
  parts.push(spec.predictors.length ? `Further terms: ${andList(spec.predictors.map(termWords))}.` : 'There were no further terms.');
  if (spec.offsets.length) {
    parts.push(`${andList(spec.offsets.map((o) => (o.log ? `log("${o.column}")` : `"${o.column}"`)))} entered as ${spec.offsets.length > 1 ? 'offsets' : 'an offset'} (coefficient fixed at 1), so the model describes counts per unit of ${andList(spec.offsets.map((o) => `"${o.column}"`))}.`);
  }
  if (spec.zeroPredictors.length) parts.push(`The zero part had the terms ${andList(spec.zeroPredictors.map(termWords))}.`);
  else if (hasZeroPart(spec.distribution)) parts.push('The zero part had an intercept only (one chance of an extra zero for every record).');
  if (spec.site?.effect === 'fixed') parts.push(`Each value of "${spec.site.column}" had its own fixed effect.`);
  if (spec.site?.effect === 'random') {
    const q = spec.site.quadraturePoints;
    parts.push(`Each value of "${spec.site.column}" had a normal random intercept; the marginal likelihood was integrated by ${q === 1 ? 'the Laplace approximation' : `adaptive Gauss-Hermite quadrature with ${q} nodes`}.`);
    cites.push('quadrature');
  }
  if (spec.robust === 'site') {
    parts.push(`Standard errors are site-clustered sandwich estimates${spec.site ? ` by "${spec.site.column}"` : ''}.`);
    cites.push('sandwich');
  }
  return { kind: 'paragraph', text: parts.join(' '), cites };
}

/** How the indices and the slope and their limits were computed, from the trend's own method notes. */
export function limitsParagraph(result: TrendResult): ParagraphBlock {
  const m = result.method;
  const cites: ReferenceKey[] = [];
  const notes = m ? [m.indices, m.slope].join(' ') : '';
  if (/delta method|Wald/.test(notes)) cites.push('delta');
  if (/sandwich/.test(notes)) cites.push('sandwich');
  if (/bootstrap/.test(notes)) cites.push('bootstrap');
  const text = m
    ? `Indices: ${m.indices}. Trend: ${m.slope}.${m.replicates ? ` ${m.replicates - (m.failedReplicates ?? 0)} of ${m.replicates} bootstrap replicates were used (seed ${m.seed}).` : ''}`
    : 'Indices and trend with Wald 95% limits.';
  return { kind: 'paragraph', text, cites };
}
