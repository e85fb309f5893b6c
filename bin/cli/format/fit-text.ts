import type { CoefficientRow, FitSummary } from '@shared/model/fit-result';
import { fmt, fmtP, layoutColumns } from './number';

const distributionNames: Record<FitSummary['distribution'], string> = {
  poisson: 'Poisson',
  quasipoisson: 'quasi-Poisson (Poisson mean, dispersion estimated)',
  negbin: 'negative binomial (variance mu + mu²/theta)',
  zip: 'zero-inflated Poisson',
  zinb: 'zero-inflated negative binomial',
  'hurdle-poisson': 'hurdle Poisson (zeros, then a zero-truncated Poisson)',
  'hurdle-negbin': 'hurdle negative binomial (zeros, then a zero-truncated negative binomial)',
};

function coefficientBlock(title: string, rows: readonly CoefficientRow[], ratioLabel: string): string[] {
  const header = ['term', 'estimate', 'std. error', 'z', 'p', `${ratioLabel} (95% limits)`];
  const body = rows.map((r) => [
    r.term,
    fmt(r.estimate, 4),
    fmt(r.se, 4),
    fmt(r.z, 2),
    fmtP(r.p),
    `${fmt(Math.exp(r.estimate), 3)} (${fmt(Math.exp(r.lower), 3)} to ${fmt(Math.exp(r.upper), 3)})`,
  ]);
  return [title, ...layoutColumns([header, ...body], [false, true, true, true, true, false]).map((l) => `  ${l}`)];
}

/** The readable form of a fit for the terminal. */
export function fitAsText(s: FitSummary, label?: string): string {
  const lines: string[] = [];
  const head = `${label ? `${label}: ` : ''}${distributionNames[s.distribution]}, ${s.nobs} records`;
  lines.push(head, '='.repeat(Math.min(head.length, 78)));
  lines.push(s.converged ? `Converged after ${s.iterations} iterations.` : `DID NOT CONVERGE after ${s.iterations} iterations: do not use these numbers.`);
  if (s.seType === 'site-robust') lines.push('Standard errors: site-clustered sandwich (robust to correlation within sites).');
  lines.push('');
  lines.push(...coefficientBlock('Count part, log of the expected count:', s.coefficients, 'rate ratio'));
  if (s.zeroCoefficients.length) {
    const zeroTitle = s.distribution.startsWith('hurdle') ? 'Zero part, log-odds of a non-zero count:' : 'Zero part, log-odds of an extra zero:';
    lines.push('', ...coefficientBlock(zeroTitle, s.zeroCoefficients, 'odds ratio'));
  }
  lines.push('');
  if (s.theta !== null) lines.push(`Overdispersion: theta ${fmt(s.theta, 4)} (alpha = 1/theta = ${fmt(s.alpha, 4)})`);
  if (s.random) lines.push(`Random site intercept (${s.random.column}): SD ${fmt(s.random.sd, 4)} on the log scale`);
  if (s.logLikelihood !== null) {
    lines.push(`Log-likelihood ${fmt(s.logLikelihood, 3)} with ${s.df} parameters; AIC ${fmt(s.aic, 2)}, BIC ${fmt(s.bic, 2)}`);
  } else {
    lines.push(`No likelihood for a quasi-Poisson fit; dispersion ${fmt(s.dispersion ?? null, 4)} (Pearson chi-square / residual df).`);
  }
  if (s.deviance !== null) lines.push(`Deviance ${fmt(s.deviance, 3)} on ${s.dfResidual} residual df (null deviance ${fmt(s.nullDeviance, 3)})`);
  lines.push(`Pearson chi-square ${fmt(s.pearsonChi2, 3)}; ratio to residual df ${fmt(s.pearsonChi2 / Math.max(1, s.dfResidual), 3)}`);
  if (s.warnings.length) {
    lines.push('', 'Warnings:');
    for (const w of s.warnings) lines.push(`  - ${w}`);
  }
  return lines.join('\n');
}
