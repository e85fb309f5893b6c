import type { Comparison } from '@shared/model/comparison';
import { fmt, fmtP } from './format';

/**
 * The models of one species side by side, the tests between them, a short
 * reading with its numbers, and the analyst's choice of the model for the
 * report (never made for them).
 */
interface Props {
  comparison: Comparison;
  chosen: string | null;
  shown: string | null;
  stale: (id: string) => boolean;
  onChoose: (id: string | null) => void;
  onShow: (id: string) => void;
  onRemove: (id: string) => void;
}

export function ComparisonPanel({ comparison, chosen, shown, stale, onChoose, onShow, onRemove }: Props) {
  const { rows, overdispersion, vuong, reading } = comparison;
  return (
    <section className="comparison" aria-labelledby="comparison-heading">
      <h2 id="comparison-heading">Model comparison</h2>
      <div className="table-scroll">
        <table className="plain compare" data-testid="comparison">
          <thead>
            <tr>
              <th>Model</th>
              <th className="num">Log-lik.</th>
              <th className="num">Param.</th>
              <th className="num">AIC</th>
              <th className="num">ΔAIC</th>
              <th className="num">BIC</th>
              <th className="num">Pearson χ²/df</th>
              <th className="num">Zeros seen / expected</th>
              <th>For the report</th>
              <th />
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => {
              const id = r.model.id;
              const isChosen = chosen === id;
              return (
                <tr key={id} className={[shown === id ? 'is-shown' : '', stale(id) ? 'is-stale' : ''].join(' ')} data-distribution={r.model.spec.distribution} data-delta-aic={r.deltaAic ?? ''}>
                  <th scope="row">
                    <button type="button" className="button is-quiet is-small" onClick={() => onShow(id)} aria-pressed={shown === id}>
                      {r.model.label}
                    </button>
                    {stale(id) && <span className="chip chip-warning">out of date</span>}
                  </th>
                  <td className="num">{fmt(r.logLik)}</td>
                  <td className="num">{r.df}</td>
                  <td className="num">{fmt(r.aic)}</td>
                  <td className="num">{r.deltaAic === 0 ? <strong>0 (lowest)</strong> : fmt(r.deltaAic)}</td>
                  <td className="num">{fmt(r.bic)}</td>
                  <td className="num">{fmt(r.dispersion)}</td>
                  <td className="num">
                    {r.observedZeros} / {fmt(r.expectedZeros)}
                  </td>
                  <td>
                    <label className="check">
                      <input type="radio" name="for-report" checked={isChosen} onChange={() => onChoose(id)} aria-label={`Use "${r.model.label}" for the report`} /> {isChosen ? 'chosen' : 'use'}
                    </label>
                  </td>
                  <td>
                    <button type="button" className="button is-quiet is-small" onClick={() => onRemove(id)} aria-label={`Remove "${r.model.label}"`}>
                      Remove
                    </button>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {chosen === null ? (
        <p className="hint" data-testid="report-choice">No model is chosen for the report yet: pick one in the table above (the app never picks it for you).</p>
      ) : (
        <p className="hint" data-testid="report-choice">
          Chosen for the report: <strong>{rows.find((r) => r.model.id === chosen)?.model.label}</strong>.{' '}
          <button type="button" className="button is-quiet is-small" onClick={() => onChoose(null)}>
            Clear the choice
          </button>
        </p>
      )}
      {overdispersion.map((t) => (
        <p key={`${t.first.id}|${t.second.id}`} className="test-line" data-testid="lr-test">
          <strong>Overdispersion (LR test, negative binomial against Poisson):</strong> statistic {fmt(t.result.statistic)} on 1 df, boundary-corrected p {fmtP(t.result.p, true)}.
        </p>
      ))}
      {vuong.map((t) => (
        <div key={`${t.first.id}|${t.second.id}`} className="test-line" data-testid="vuong-test">
          <strong>Vuong test, {t.first.label} against {t.second.label}:</strong> raw z = {fmt(t.result.raw.statistic, 3)} (p {fmtP(t.result.raw.p, true)}), AIC-corrected z = {fmt(t.result.aicCorrected.statistic, 3)}, BIC-corrected z ={' '}
          {fmt(t.result.bicCorrected.statistic, 3)}; positive favours the first.
          <p className="caution-line">Caution: {t.result.caution}</p>
        </div>
      ))}
      {reading.length > 0 && (
        <div className="reading" data-testid="reading">
          <h3>Reading</h3>
          <ul>
            {reading.map((r) => (
              <li key={r}>{r}</li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}
