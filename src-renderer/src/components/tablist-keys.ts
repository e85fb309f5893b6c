import type { KeyboardEvent } from 'react';

/**
 * Left/Right (and Home/End) along a row of tabs: the focus moves to the
 * next tab and shows it, as a row of tabs does on the desktop. Tab itself
 * still moves on to the content.
 */
export function tablistKeys(e: KeyboardEvent<HTMLElement>): void {
  const tabs = [...e.currentTarget.querySelectorAll<HTMLElement>('[role="tab"]')];
  const at = tabs.indexOf(document.activeElement as HTMLElement);
  const step: Record<string, number> = { ArrowRight: at + 1, ArrowLeft: at - 1, Home: 0, End: tabs.length - 1 };
  if (at < 0 || !(e.key in step)) return;
  e.preventDefault();
  const next = tabs[(step[e.key] + tabs.length) % tabs.length];
  next?.focus();
  next?.click();
}
