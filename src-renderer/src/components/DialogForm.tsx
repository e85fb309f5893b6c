import type { ReactNode } from 'react';

/**
 * The frame every form dialog shares: a modal backdrop, a labelled form that
 * submits on Enter and cancels on Escape, and the title.
 */
export function DialogForm({ id, title, wide, onSubmit, onCancel, children }: { id: string; title: ReactNode; wide?: boolean; onSubmit(): void; onCancel(): void; children: ReactNode }) {
  return (
    <div className="dialog-backdrop">
      <form
        className={wide ? 'dialog is-wide' : 'dialog'}
        role="dialog"
        aria-modal="true"
        aria-labelledby={id}
        onSubmit={(e) => {
          e.preventDefault();
          onSubmit();
        }}
        onKeyDown={(e) => {
          if (e.key === 'Escape') onCancel();
        }}
      >
        <h2 id={id}>{title}</h2>
        {children}
      </form>
    </div>
  );
}
