import { useState, type ReactNode } from 'react';

/**
 * A long list that renders only the rows in view (fixed row height), so a
 * list of thousands of findings or log entries stays quick.
 */
export function VirtualList<T>({ items, rowHeight, height, render, label, testId }: { items: readonly T[]; rowHeight: number; height: number; render(item: T, index: number): ReactNode; label: string; testId?: string }) {
  const [top, setTop] = useState(0);
  const first = Math.max(0, Math.floor(top / rowHeight) - 4);
  const last = Math.min(items.length, Math.ceil((top + height) / rowHeight) + 4);
  return (
    <div className="vlist" style={{ height }} role="list" aria-label={label} data-testid={testId} onScroll={(e) => setTop(e.currentTarget.scrollTop)}>
      <div style={{ height: items.length * rowHeight, position: 'relative' }}>
        {items.slice(first, last).map((item, i) => (
          <div key={first + i} role="listitem" className="vlist-row" style={{ position: 'absolute', top: (first + i) * rowHeight, height: rowHeight, left: 0, right: 0 }}>
            {render(item, first + i)}
          </div>
        ))}
      </div>
    </div>
  );
}
