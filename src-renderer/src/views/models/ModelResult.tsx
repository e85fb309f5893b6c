import type { CoefficientRow } from '@shared/model/fit-result';
import type { FittedModel } from './fitted-model';
import { fmt, fmtP } from './format';

/** One fitted model: its coefficients (with rate or odds ratios), fit statistics and warnings. */
function CoefficientTable({ rows, caption, ratio, testId }: { rows: readonly CoefficientRow[]; caption: string; ratio: string; testId: string }) {
  return (
    <div className="table-scroll">
    <table className="plain coefs" data-testid={testId}>
      <caption>{caption}</caption>
      <thead>
        <tr>
          <th>Term</th>
          <th className="num">Estimate</th>
          <th className="num">SE</th>
          <th className="num">z</th>
          <th className="num">p</th>
          <th className="num">95% limits</th>
          <th className="num">{ratio}</th>
          <th className="num">95% limits</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.term}>
            <th scope="row">{r.term}</th>
            <td className="num">{fmt(r.estimate)}</td>
            <td className="num">{fmt(r.se)}</td>
            <td className="num">{fmt(r.z, 3)}</td>
            <td className="num">{fmtP(r.p)}</td>
            <td className="num">
              {fmt(r.lower)} to {fmt(r.upper)}
            </td>
            <td className="num">{fmt(Math.exp(r.estimate))}</td>
            <td className="num">
              {fmt(Math.exp(r.lower))} to {fmt(Math.exp(r.upper))}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
    </div>
  );
}

export function ModelResult({ model }: { model: FittedModel }) {
  const s = model.outcome.summary;
  const dispersion = s.dispersion ?? (s.dfResidual > 0 ? s.pearsonChi2 / s.dfResidual : null);
  const stats: [string, string][] = [
    ['Records used', String(s.nobs)],
    ['Log-likelihood', fmt(s.logLikelihood)],
    ['Parameters', String(s.df)],
    ['AIC', fmt(s.aic)],
    ['BIC', fmt(s.bic)],
    ['Deviance', `${fmt(s.deviance)} on ${s.dfResidual} df`],
    ['Pearson χ² / df', fmt(dispersion)],
    ...(s.theta !== null ? ([['θ (NB size)', `${fmt(s.theta)} (α = 1/θ = ${fmt(s.alpha)})`]] as [string, string][]) : []),
    ...(s.random ? ([[`SD of the ${s.random.column} effect`, fmt(s.random.sd)]] as [string, string][]) : []),
    ['Converged', s.converged ? `yes, ${s.iterations} iterations` : `no (${s.iterations} iterations)`],
  ];
  const zeroName = model.spec.distribution.startsWith('hurdle') ? 'Zero part: chance of a non-zero count (logit)' : 'Zero part: chance of an extra zero (logit)';
  return (
    <section className="model-result" data-testid="model-result" aria-label={`Result: ${model.label}`}>
      <h3>{model.label}</h3>
      <dl className="stats">
        {stats.map(([k, v]) => (
          <div key={k}>
            <dt>{k}</dt>
            <dd>{v}</dd>
          </div>
        ))}
      </dl>
      {(s.warnings.length > 0 || !s.converged) && (
        <ul className="fit-warnings" data-testid="fit-warnings">
          {!s.converged && !s.warnings.some((w) => /converge/i.test(w)) && <li>The fit did not converge; its numbers are not to be relied on. Simplify the model or check the data.</li>}
          {s.warnings.map((w) => (
            <li key={w}>{w}</li>
          ))}
        </ul>
      )}
      <CoefficientTable rows={s.coefficients} caption={`Count part (log scale)${s.seType === 'site-robust' ? ', site-robust SEs' : ''}`} ratio="Rate ratio" testId="coefficients" />
      {model.spec.site?.effect === 'fixed' && <p className="hint">The fixed site effects are absorbed in the fit and not listed.</p>}
      {s.zeroCoefficients.length > 0 && <CoefficientTable rows={s.zeroCoefficients} caption={zeroName} ratio="Odds ratio" testId="zero-coefficients" />}
    </section>
  );
}
