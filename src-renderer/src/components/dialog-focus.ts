import { useEffect, type KeyboardEvent, type RefObject } from 'react';

/**
 * Keyboard behaviour every modal dialog shares: focus moves into the dialog
 * when it opens (unless something inside already took it), Tab and
 * Shift+Tab stay inside it, Escape cancels, and focus goes back to where it
 * was when the dialog closes.
 */
const focusable = 'button:not(:disabled), input:not(:disabled), select:not(:disabled), textarea:not(:disabled), a[href], [tabindex]:not([tabindex="-1"])';

export function useDialogFocus(box: RefObject<HTMLElement | null>): void {
  useEffect(() => {
    const before = document.activeElement as HTMLElement | null;
    const el = box.current;
    if (el && !el.contains(document.activeElement)) el.querySelector<HTMLElement>(focusable)?.focus();
    return () => {
      if (before && document.contains(before)) before.focus();
    };
  }, [box]);
}

export function dialogKeys(e: KeyboardEvent<HTMLElement>, onCancel: () => void): void {
  if (e.key === 'Escape') {
    e.preventDefault();
    e.stopPropagation();
    onCancel();
    return;
  }
  if (e.key !== 'Tab') return;
  const items = [...e.currentTarget.querySelectorAll<HTMLElement>(focusable)];
  const first = items[0];
  const last = items[items.length - 1];
  if (!first || !last) return;
  if (e.shiftKey && document.activeElement === first) {
    e.preventDefault();
    last.focus();
  } else if (!e.shiftKey && document.activeElement === last) {
    e.preventDefault();
    first.focus();
  }
}
