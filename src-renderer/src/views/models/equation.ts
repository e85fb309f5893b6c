import { hasZeroPart, type ModelSpec, type Term } from '@shared/model/spec';
import type { TableRoles } from './spec-draft';

/**
 * The model in ordinary notation, one line per part, e.g.
 *   count ~ negative binomial with mean μ and size θ (Var = μ + μ²/θ)
 *   log μ = b0 + b1·temperature + site effect + season effect + log(effort hours)
 * Plain text with Unicode symbols; the screen shows it as it is.
 */
function termText(t: Term, k: number, letter: string): string {
  const coef = `${letter}${k}`;
  if (t.type === 'numeric') return `${coef}·${t.column}`;
  if (t.type === 'factor') return `${coef}·[${t.column}${t.reference ? `, against ${t.reference}` : ''}]`;
  if (t.type === 'interaction') return `${coef}·${t.columns.join('×')}`;
  return `${coef}·spline(${t.column})`;
}

function linear(terms: readonly Term[], letter: string): string[] {
  return [`${letter}0`, ...terms.map((t, i) => termText(t, i + 1, letter))];
}

function distributionLine(spec: ModelSpec, response: string): string {
  switch (spec.distribution) {
    case 'poisson':
      return `${response} ~ Poisson with mean μ (Var = μ)`;
    case 'quasipoisson':
      return `${response} has mean μ and Var = φ·μ (φ, the dispersion, estimated from the Pearson χ²)`;
    case 'negbin':
      return `${response} ~ negative binomial with mean μ and size θ (Var = μ + μ²/θ)`;
    case 'zip':
      return `${response} = 0 with probability π (an extra zero), otherwise ~ Poisson with mean μ`;
    case 'zinb':
      return `${response} = 0 with probability π (an extra zero), otherwise ~ negative binomial with mean μ and size θ`;
    case 'hurdle-poisson':
      return `${response} > 0 with probability p; the non-zero counts ~ Poisson with mean μ, truncated at zero`;
    case 'hurdle-negbin':
      return `${response} > 0 with probability p; the non-zero counts ~ negative binomial with mean μ and size θ, truncated at zero`;
  }
}

export function modelEquation(spec: ModelSpec, roles: TableRoles): string[] {
  const response = spec.response;
  const plain = !hasZeroPart(spec.distribution);
  const left = plain ? `log E[${response}]` : 'log μ';
  const right = linear(spec.predictors, 'b');
  if (spec.site) right.push(spec.site.effect === 'fixed' ? 'site effect (one per site)' : 'u[site]');
  if (spec.time) right.push(spec.time.trend === 'annual' ? `season effect (one per ${spec.time.column}, first = 0)` : `c·${spec.time.column} (log-linear trend)`);
  for (const o of spec.offsets) {
    const unit = o.column === roles.effort?.column ? `effort ${roles.effort.unit}` : o.column === roles.area?.column ? `area ${roles.area.unit}` : o.column;
    right.push(o.log ? `log(${unit})` : unit);
  }
  const lines = [distributionLine(spec, response), `${left} = ${right.join(' + ')}`];
  if (spec.distribution === 'zip' || spec.distribution === 'zinb') lines.push(`logit π = ${linear(spec.zeroPredictors, 'g').join(' + ')}`);
  if (spec.distribution === 'hurdle-poisson' || spec.distribution === 'hurdle-negbin') lines.push(`logit p = ${linear(spec.zeroPredictors, 'g').join(' + ')}`);
  if (spec.site?.effect === 'random') lines.push(`u[site] ~ Normal(0, σ²), integrated out with ${spec.site.quadraturePoints === 1 ? 'the Laplace approximation' : `${spec.site.quadraturePoints}-point adaptive Gauss–Hermite quadrature`}`);
  return lines;
}
