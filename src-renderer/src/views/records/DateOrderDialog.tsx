import { useRef } from 'react';
import type { DateQuestion } from './use-project';
import { dialogKeys, useDialogFocus } from '../../components/dialog-focus';

/** Asks how a workbook's dates are written when the dates themselves cannot tell. */
export function DateOrderDialog({ question, onAnswer }: { question: DateQuestion; onAnswer(order: 'dmy' | 'mdy' | null): void }) {
  const box = useRef<HTMLDivElement>(null);
  useDialogFocus(box);
  return (
    <div className="dialog-backdrop">
      <div ref={box} className="dialog" role="dialog" aria-modal="true" aria-labelledby="date-order-title" onKeyDown={(e) => dialogKeys(e, () => onAnswer(null))}>
        <h2 id="date-order-title">How are the dates written?</h2>
        <p>{question.message}</p>
        <div className="dialog-actions">
          <button type="button" className="button" onClick={() => onAnswer(null)}>
            Cancel the import
          </button>
          <button type="button" className="button is-primary" onClick={() => onAnswer('dmy')}>
            Day first (31/12/2019)
          </button>
          <button type="button" className="button is-primary" onClick={() => onAnswer('mdy')}>
            Month first (12/31/2019)
          </button>
        </div>
      </div>
    </div>
  );
}
