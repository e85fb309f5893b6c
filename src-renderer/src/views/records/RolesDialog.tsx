import { useState } from 'react';
import { DialogForm } from '../../components/DialogForm';
import type { ColumnRoles } from '@shared/host/contract';
import { effortUnits, isEffortUnit, unitFromHeader, type EffortUnit } from '@shared/import/units';
import type { RolesQuestion } from './use-project';

/**
 * Which column is which, chosen by hand when the headers do not tell: one
 * part per column; count columns are either one per species (wide sheets)
 * or a species column plus a count column (long sheets); any number of
 * columns can be visit covariates (water temperature, wind ...).
 */
const parts = [
  ['', 'not used'],
  ['site', 'site'],
  ['date', 'date'],
  ['season', 'season'],
  ['visit', 'visit'],
  ['observer', 'observer'],
  ['effort', 'effort'],
  ['speciesColumn', 'counts of one species'],
  ['species', 'species name (long sheet)'],
  ['count', 'count (long sheet)'],
  ['covariate', 'recorded per visit (covariate)'],
] as const;
type Part = (typeof parts)[number][0];

function rolesFrom(choice: Record<string, Part>, unit: EffortUnit | ''): { roles?: ColumnRoles; problem?: string } {
  const of = (p: Part) => Object.keys(choice).filter((h) => choice[h] === p);
  const single = ['site', 'date', 'season', 'visit', 'observer', 'effort', 'species', 'count'] as const;
  for (const p of single) if (of(p).length > 1) return { problem: `Only one column can be the ${p}.` };
  const [site] = of('site');
  if (!site) return { problem: 'Choose the column that names the site.' };
  const speciesColumns = of('speciesColumn');
  const [species] = of('species');
  const [count] = of('count');
  if (!speciesColumns.length && !(species && count)) return { problem: 'Choose the count columns: one per species, or a species name column and a count column.' };
  if (speciesColumns.length && (species || count)) return { problem: 'Use either one count column per species or a species and a count column, not both.' };
  const roles: ColumnRoles = { site };
  for (const p of ['date', 'season', 'visit', 'observer', 'effort'] as const) {
    const [h] = of(p);
    if (h) roles[p] = h;
  }
  if (roles.effort && unit) roles.effortUnit = unit;
  const covariates = of('covariate');
  if (covariates.length) roles.covariates = covariates;
  if (speciesColumns.length) roles.speciesColumns = speciesColumns;
  else Object.assign(roles, { species, count });
  return { roles };
}

export function RolesDialog({ question, onDone }: { question: RolesQuestion; onDone(roles: ColumnRoles | null): void }) {
  const [choice, setChoice] = useState<Record<string, Part>>(() => Object.fromEntries(question.headers.map((h) => [h, ''])));
  const effortHeader = Object.keys(choice).find((h) => choice[h] === 'effort');
  const guessedUnit = effortHeader ? unitFromHeader(effortHeader) : undefined;
  const [unit, setUnit] = useState<EffortUnit | ''>('');
  const effectiveUnit = unit || (isEffortUnit(guessedUnit) ? guessedUnit : '');
  const result = rolesFrom(choice, effectiveUnit);
  const fileName = question.path.replace(/^.*[\\/]/, '');
  return (
    <DialogForm id="roles-title" wide title={`Which column is which in ${fileName}?`} onSubmit={() => result.roles && onDone(result.roles)} onCancel={() => onDone(null)}>
        <p>{question.message}</p>
        <div className="roles-grid">
          {question.headers.map((h) => (
            <label key={h} className="field">
              <span>{h}</span>
              <select aria-label={`Part of column ${h}`} value={choice[h]} onChange={(e) => setChoice((c) => ({ ...c, [h]: e.target.value as Part }))}>
                {parts.map(([value, label]) => (
                  <option key={value} value={value}>
                    {label}
                  </option>
                ))}
              </select>
            </label>
          ))}
        </div>
        {effortHeader && (
          <label className="field">
            <span>Unit of the effort column</span>
            <select aria-label="Effort unit" value={effectiveUnit} onChange={(e) => setUnit(e.target.value as EffortUnit | '')}>
              <option value="">not stated</option>
              {effortUnits.map((u) => (
                <option key={u}>{u}</option>
              ))}
            </select>
          </label>
        )}
        <p className="hint" role="status">
          {result.problem ?? 'Ready to import.'}
        </p>
        <div className="dialog-actions">
          <button type="button" className="button" onClick={() => onDone(null)}>
            Cancel the import
          </button>
          <button type="submit" className="button is-primary" disabled={!result.roles}>
            Import with these columns
          </button>
        </div>
    </DialogForm>
  );
}
