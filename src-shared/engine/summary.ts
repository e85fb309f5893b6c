/**
 * Assembly of the published FitSummary and a guard that no NaN or Infinity
 * reaches it (JSON cannot carry them, and a person should never see them).
 */
import type { CoefficientRow, FitSummary } from '../model/fit-result';
import type { Warning } from './types';

/** A finite number, or null. */
export function finiteOrNull(v: number | null | undefined): number | null {
  return v !== null && v !== undefined && Number.isFinite(v) ? v : null;
}

/**
 * Replaces every non-finite number in a summary: nullable fields become
 * null; numbers in coefficient rows (which the contract types as numbers)
 * become null too and a warning says which terms were affected. Returns a new
 * object; the input is not changed. Without `inference` (a fit asked for
 * estimates only) empty SEs and limits are expected and not warned about.
 */
export function sanitizeSummary(summary: FitSummary, inference = true): FitSummary {
  const bad: string[] = [];
  const fixRows = (rows: CoefficientRow[]): CoefficientRow[] =>
    rows.map((r) => {
      const out = { ...r };
      let broken = false;
      for (const key of ['estimate', 'se', 'z', 'p', 'lower', 'upper'] as const) {
        if (!Number.isFinite(out[key])) {
          (out as Record<string, unknown>)[key] = null;
          broken ||= inference || key === 'estimate';
        }
      }
      if (broken) bad.push(r.term);
      return out;
    });
  const s: FitSummary = {
    ...summary,
    logLikelihood: finiteOrNull(summary.logLikelihood),
    aic: finiteOrNull(summary.aic),
    bic: finiteOrNull(summary.bic),
    deviance: finiteOrNull(summary.deviance),
    nullDeviance: finiteOrNull(summary.nullDeviance),
    pearsonChi2: Number.isFinite(summary.pearsonChi2) ? summary.pearsonChi2 : (null as unknown as number),
    theta: finiteOrNull(summary.theta),
    alpha: finiteOrNull(summary.alpha),
    coefficients: fixRows(summary.coefficients),
    zeroCoefficients: fixRows(summary.zeroCoefficients),
    random: summary.random && Number.isFinite(summary.random.sd) ? summary.random : null,
    warnings: [...summary.warnings],
  };
  if (summary.dispersion !== undefined) s.dispersion = finiteOrNull(summary.dispersion);
  if (bad.length) {
    s.warnings.push(`Some numbers for ${bad.map((t) => `"${t}"`).join(', ')} could not be computed and are left empty; the model is probably too complex for the data.`);
  }
  return s;
}

/** The sentences of typed warnings, duplicates removed. */
export function warningSentences(warnings: readonly Warning[]): string[] {
  return [...new Set(warnings.map((w) => w.message))];
}
