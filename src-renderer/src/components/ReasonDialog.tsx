import { useEffect, useRef, useState } from 'react';
import { DialogForm } from './DialogForm';

/** Asks for a short reason before an action that needs one (leaving records out). */
export function ReasonDialog({ title, detail, initial, confirm, onDone }: { title: string; detail: string; initial: string; confirm: string; onDone(reason: string | null): void }) {
  const [reason, setReason] = useState(initial);
  const input = useRef<HTMLInputElement>(null);
  useEffect(() => input.current?.select(), []);
  const ok = reason.trim() !== '';
  return (
    <DialogForm id="reason-title" title={title} onSubmit={() => ok && onDone(reason.trim())} onCancel={() => onDone(null)}>
        <p>{detail}</p>
        <label className="field">
          <span>Reason (kept in the change log)</span>
          <input ref={input} value={reason} onChange={(e) => setReason(e.target.value)} aria-label="Reason" />
        </label>
        {!ok && <p className="hint">Say why, so a reader of the report can follow the decision.</p>}
        <div className="dialog-actions">
          <button type="button" className="button" onClick={() => onDone(null)}>
            Cancel
          </button>
          <button type="submit" className="button is-primary" disabled={!ok}>
            {confirm}
          </button>
        </div>
    </DialogForm>
  );
}
