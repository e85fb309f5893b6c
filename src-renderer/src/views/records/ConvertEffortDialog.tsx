import { useState } from 'react';
import { DialogForm } from '../../components/DialogForm';
import { effortUnitInfo, effortUnits, isEffortUnit, type EffortUnit } from '@shared/import/units';

/**
 * For records whose effort was typed in another unit than the column's:
 * "written in hours, read as minutes" multiplies the value by 60.
 */
function unitsLike(unit: string | undefined): EffortUnit[] {
  if (!isEffortUnit(unit)) return [...effortUnits];
  const kind = effortUnitInfo(unit).kind;
  return effortUnits.filter((u) => effortUnitInfo(u).kind === kind);
}

export function ConvertEffortDialog({ count, unit, onDone }: { count: number; unit?: string; onDone(result: { factor: number; fromUnit: string; toUnit: string; reason: string } | null): void }) {
  const units = unitsLike(unit);
  const column = isEffortUnit(unit) ? unit : units[0];
  const [typed, setTyped] = useState<EffortUnit>(units.find((u) => u !== column) ?? units[0]);
  const [readAs, setReadAs] = useState<EffortUnit>(column);
  const [reason, setReason] = useState('');
  const factor = effortUnitInfo(typed).factor / effortUnitInfo(readAs).factor;
  const same = typed === readAs;
  return (
    <DialogForm
      id="convert-title"
      title={`Correct the effort unit (${count} record${count === 1 ? '' : 's'})`}
      onSubmit={() => !same && onDone({ factor, fromUnit: readAs, toUnit: typed, reason: reason.trim() })}
      onCancel={() => onDone(null)}
    >
        <p>Use this when a volunteer wrote the effort in another unit than the column asks for.</p>
        <div className="field-row">
          <label className="field">
            <span>It was written in</span>
            <select value={typed} onChange={(e) => setTyped(e.target.value as EffortUnit)} aria-label="Written in">
              {units.map((u) => (
                <option key={u}>{u}</option>
              ))}
            </select>
          </label>
          <label className="field">
            <span>but was read as</span>
            <select value={readAs} onChange={(e) => setReadAs(e.target.value as EffortUnit)} aria-label="Read as">
              {units.map((u) => (
                <option key={u}>{u}</option>
              ))}
            </select>
          </label>
        </div>
        <p className="hint">{same ? 'Choose two different units.' : `The effort of the ticked visits will be multiplied by ${Number(factor.toPrecision(6))}.`}</p>
        <label className="field">
          <span>Reason (optional)</span>
          <input value={reason} onChange={(e) => setReason(e.target.value)} aria-label="Reason" />
        </label>
        <div className="dialog-actions">
          <button type="button" className="button" onClick={() => onDone(null)}>
            Cancel
          </button>
          <button type="submit" className="button is-primary" disabled={same}>
            Convert
          </button>
        </div>
    </DialogForm>
  );
}
