import type { ReactNode } from 'react';
import { distributions, hasZeroPart, type Distribution } from '@shared/model/spec';
import type { ModelEquationTex } from '@shared/model/equation-tex';
import { distributionNames, type PredictorChoice, type PredictorColumn, type SiteChoice, type SpecDraft, type TableRoles } from './spec-draft';
import { PredictorPicker } from './builder/PredictorPicker';
import { InteractionPicker } from './builder/InteractionPicker';
import { SeasonTerm } from './builder/SeasonTerm';
import { ModelEquation } from './builder/ModelEquation';
import { VisitCovariatesHint } from './builder/VisitCovariatesHint';
import type { VisitCovariateColumn } from '@shared/import/visit-covariate-rule';

/**
 * The model builder: species, distribution, predictors, offsets, site and
 * season terms, the zero part where it applies, the model written out, and
 * what stops it from being fitted.
 */
interface Props {
  draft: SpecDraft;
  onChange: (d: SpecDraft) => void;
  species: readonly string[];
  columns: readonly PredictorColumn[];
  roles: TableRoles;
  equation: ModelEquationTex | null;
  problems: readonly string[];
  busy: boolean;
  /** Rows left out for a missing offset (when the analyst asked for it). */
  leftOut: number;
  /** The analysis table's columns recorded per visit (how their rows were combined). */
  visitCovariates?: readonly VisitCovariateColumn[];
  /** What blank predictor cells leave out of the fit (notes, not problems). */
  notes?: readonly string[];
  /** Shown in place of the Fit button while a fit runs (progress and Cancel). */
  progress?: ReactNode;
  /** The last fit's outcome in a sentence (done, cancelled, failed). */
  note?: ReactNode;
  onFit: () => void;
}

export function SpecBuilder({ draft, onChange, species, columns, roles, equation, problems, busy, leftOut, visitCovariates = [], notes = [], progress, note, onFit }: Props) {
  const set = <K extends keyof SpecDraft>(k: K, v: SpecDraft[K]) => onChange({ ...draft, [k]: v });
  const chosen = new Set(draft.species);
  const all = species.length > 0 && species.every((s) => chosen.has(s));
  const toggle = (s: string) => set('species', species.filter((x) => (x === s ? !chosen.has(s) : chosen.has(x))));
  const n = draft.species.length;
  // An interaction keeps both its parts as main effects: dropping a predictor drops its interactions.
  const setPredictors = (p: PredictorChoice[]) => {
    const kept = new Set(p.map((x) => x.column));
    onChange({ ...draft, predictors: p, interactions: draft.interactions.filter((i) => kept.has(i[0]) && kept.has(i[1])) });
  };
  return (
    <form
      className="builder"
      aria-label="Model builder"
      onSubmit={(e) => {
        e.preventDefault();
        if (!busy && !problems.length) onFit();
      }}
    >
      <fieldset className="builder-part">
        <legend>Species</legend>
        <label className="check is-all">
          <input type="checkbox" checked={all} onChange={() => set('species', all ? [] : [...species])} /> All species ({species.length})
        </label>
        <div className="check-list">
          {species.map((s) => (
            <label key={s} className="check">
              <input type="checkbox" checked={chosen.has(s)} onChange={() => toggle(s)} /> {s}
            </label>
          ))}
        </div>
        {n > 1 && <p className="hint">A batch: the same model is fitted to each species on its own.</p>}
      </fieldset>

      <fieldset className="builder-part">
        <legend>Counts</legend>
        <label className="field">
          <span>Distribution</span>
          <select aria-label="Distribution" value={draft.distribution} onChange={(e) => set('distribution', e.target.value as Distribution)}>
            {distributions.map((d) => (
              <option key={d} value={d}>
                {distributionNames[d]}
              </option>
            ))}
          </select>
        </label>
        <div className="field-row">
          <label className="field">
            <span>Site effect</span>
            <select aria-label="Site effect" value={draft.site} onChange={(e) => set('site', e.target.value as SiteChoice)}>
              <option value="none">none</option>
              <option value="fixed">fixed (one per site)</option>
              <option value="random">random (normal)</option>
            </select>
          </label>
          {draft.site === 'random' && (
            <label className="field is-narrow">
              <span>Quadrature points</span>
              <input
                aria-label="Quadrature points"
                type="number"
                min={1}
                max={50}
                step={1}
                value={draft.quadraturePoints}
                onChange={(e) => set('quadraturePoints', Number(e.target.value))}
              />
            </label>
          )}
        </div>
        <SeasonTerm time={draft.time} df={draft.seasonDf} onTime={(t) => set('time', t)} onDf={(df) => set('seasonDf', df)} />
        <div className="offsets" role="group" aria-label="Offsets">
          <span className="field-label">Offsets (log, coefficient 1)</span>
          <label className="check">
            <input type="checkbox" disabled={!roles.effort} checked={draft.effortOffset && !!roles.effort} onChange={(e) => set('effortOffset', e.target.checked)} />
            effort {roles.effort ? `(${roles.effort.unit}, ${roles.effort.column})` : '(no effort in the records)'}
          </label>
          <label className="check">
            <input type="checkbox" disabled={!roles.area} checked={draft.areaOffset && !!roles.area} onChange={(e) => set('areaOffset', e.target.checked)} />
            area {roles.area ? `(${roles.area.unit}, ${roles.area.column})` : '(no site areas known)'}
          </label>
          <label className="check is-sub">
            <input type="checkbox" checked={draft.dropBadOffsetRows} onChange={(e) => set('dropBadOffsetRows', e.target.checked)} />
            leave out rows where an offset is missing or 0
          </label>
          {draft.dropBadOffsetRows && leftOut > 0 && <span className="hint">{leftOut} row{leftOut === 1 ? '' : 's'} left out of the fit.</span>}
        </div>
      </fieldset>

      <fieldset className="builder-part">
        <legend>Predictors</legend>
        <PredictorPicker label="Count part" columns={columns} chosen={draft.predictors} onChange={setPredictors} />
        <InteractionPicker candidates={draft.predictors.map((p) => p.column)} chosen={draft.interactions} onChange={(i) => set('interactions', i)} />
        {hasZeroPart(draft.distribution) && (
          <PredictorPicker label={draft.distribution.startsWith('hurdle') ? 'Zero part (chance of a non-zero count)' : 'Zero part (chance of an extra zero)'} columns={columns} chosen={draft.zeroPredictors} onChange={(p) => set('zeroPredictors', p)} />
        )}
        <VisitCovariatesHint covariates={visitCovariates} notes={notes} />
      </fieldset>

      {/* The model written out stays in view beside the Fit button while the choices above scroll. */}
      <div className="builder-foot">
        <section className="builder-model" aria-labelledby="builder-model-title">
          <h3 id="builder-model-title" className="builder-model-title">
            The model
          </h3>
          <ModelEquation equation={equation} />
        </section>
        {problems.length > 0 && (
          <ul className="spec-problems" data-testid="spec-problems" role="alert">
            {problems.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        )}
        {note}
        {progress ?? (
          <div className="builder-actions">
            <button type="submit" className="button is-primary" disabled={busy || problems.length > 0} data-testid="fit-button">
              {n > 1 ? `Fit for ${n} species` : 'Fit the model'}
            </button>
            {problems.length > 0 && <span className="hint">Put right what is listed above to fit.</span>}
          </div>
        )}
      </div>
    </form>
  );
}
