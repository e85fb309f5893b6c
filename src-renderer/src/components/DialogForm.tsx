import { useRef, type ReactNode } from 'react';
import { dialogKeys, useDialogFocus } from './dialog-focus';

/**
 * The frame every form dialog shares: a modal backdrop, a labelled form that
 * submits on Enter and cancels on Escape, keeps Tab inside, and the title.
 */
export function DialogForm({ id, title, wide, onSubmit, onCancel, children }: { id: string; title: ReactNode; wide?: boolean; onSubmit(): void; onCancel(): void; children: ReactNode }) {
  const box = useRef<HTMLFormElement>(null);
  useDialogFocus(box);
  return (
    <div className="dialog-backdrop">
      <form
        ref={box}
        className={wide ? 'dialog is-wide' : 'dialog'}
        role="dialog"
        aria-modal="true"
        aria-labelledby={id}
        onSubmit={(e) => {
          e.preventDefault();
          onSubmit();
        }}
        onKeyDown={(e) => dialogKeys(e, onCancel)}
      >
        <h2 id={id}>{title}</h2>
        {children}
      </form>
    </div>
  );
}
