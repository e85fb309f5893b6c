import { useState } from 'react';
import type { InteractionChoice } from '../spec-draft';

/**
 * Two-way interactions between the predictors already chosen (each part
 * stays in the model as a main effect, so every interaction reads as a
 * change of one effect across the other).
 */
interface Props {
  /** The chosen count-part predictors. */
  candidates: readonly string[];
  chosen: readonly InteractionChoice[];
  onChange: (next: InteractionChoice[]) => void;
}

const same = (a: InteractionChoice, b: InteractionChoice) => (a[0] === b[0] && a[1] === b[1]) || (a[0] === b[1] && a[1] === b[0]);

function ColumnSelect({ label, columns, value, onChange }: { label: string; columns: readonly string[]; value: string; onChange: (v: string) => void }) {
  return (
    <select aria-label={label} value={value} onChange={(e) => onChange(e.target.value)}>
      {columns.map((c) => (
        <option key={c} value={c}>
          {c}
        </option>
      ))}
    </select>
  );
}

export function InteractionPicker({ candidates, chosen, onChange }: Props) {
  const [first, setFirst] = useState('');
  const [second, setSecond] = useState('');
  const a = candidates.includes(first) ? first : (candidates[0] ?? '');
  const b = candidates.includes(second) ? second : (candidates.find((c) => c !== a) ?? '');
  const pair: InteractionChoice = [a, b];
  const taken = chosen.some((c) => same(c, pair));
  const why = a === b ? 'Pick two different predictors.' : taken ? `${a} × ${b} is in the model; pick another pair to add one more.` : '';
  return (
    <div className="interactions" role="group" aria-label="Interactions">
      <span className="field-label">Interactions (two-way)</span>
      {candidates.length < 2 ? (
        <p className="hint">Use two or more predictors above to let the effect of one depend on another.</p>
      ) : (
        <div className="interaction-add">
          <ColumnSelect label="Interaction: first predictor" columns={candidates} value={a} onChange={setFirst} />
          <span aria-hidden="true">×</span>
          <ColumnSelect label="Interaction: second predictor" columns={candidates} value={b} onChange={setSecond} />
          <button type="button" className="button is-small" disabled={!!why} onClick={() => onChange([...chosen, pair])}>
            Add interaction
          </button>
          {why && <span className="hint">{why}</span>}
        </div>
      )}
      {chosen.length > 0 && (
        <ul className="interaction-list">
          {chosen.map((c) => (
            <li key={c.join('×')}>
              <span>
                {c[0]} × {c[1]}
              </span>
              <button type="button" className="button is-quiet is-small" aria-label={`Remove the interaction ${c[0]} × ${c[1]}`} onClick={() => onChange(chosen.filter((x) => x !== c))}>
                Remove
              </button>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
