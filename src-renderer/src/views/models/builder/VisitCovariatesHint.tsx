import type { VisitCovariateColumn } from '@shared/import/visit-covariate-rule';

/**
 * Under the predictors: which columns were recorded per visit and how an
 * analysis row (several visits summed) got its value, and what blank
 * predictor cells cost the fit (blankPredictorNotes). The rule is said here
 * because the analyst chooses the predictors here.
 */
interface Props {
  covariates: readonly VisitCovariateColumn[];
  /** Rows a blank predictor cell leaves out of the fit, per species, in sentences. */
  notes: readonly string[];
}

function rowWord(n: number): string {
  return `${n} row${n === 1 ? '' : 's'}`;
}

/** The combining rule for the kinds present: numbers by the mean, texts only where the visits agree. */
function ruleText(covariates: readonly VisitCovariateColumn[]): string {
  const rules: string[] = [];
  if (covariates.some((c) => c.kind === 'number')) rules.push('a number is the mean over the row’s visits that have a value');
  if (covariates.some((c) => c.kind === 'text')) {
    const disagreeing = covariates.filter((c) => c.disagreeing > 0);
    rules.push(
      `a text is kept only where all the row’s visits that have one agree${disagreeing.length ? `; where they differ the cell is left blank (${disagreeing.map((c) => `${c.column}: ${rowWord(c.disagreeing)}`).join(', ')})` : ''}`,
    );
  }
  return `An analysis row sums several visits, so ${rules.join(', and ')}.`;
}

export function VisitCovariatesHint({ covariates, notes }: Props) {
  return (
    <>
      {covariates.length > 0 && (
        <p className="hint" data-testid="visit-covariates-hint">
          Recorded on each visit:{' '}
          {covariates.map((c, i) => (
            <span key={c.column}>
              {i > 0 && ', '}
              <strong>{c.column}</strong> (from “{c.name}”, {c.kind === 'number' ? 'a number' : 'text'})
            </span>
          ))}
          . {ruleText(covariates)} Rows with a blank in a chosen predictor are left out of the fit.
        </p>
      )}
      {notes.length > 0 && (
        <ul className="hint predictor-notes" data-testid="predictor-notes" role="status">
          {notes.map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      )}
    </>
  );
}
