import { useEffect, useRef, useState } from 'react';

/** The current height of an element (follows window and layout resizes). */
export function useElementHeight<E extends HTMLElement>(fallback = 400) {
  const ref = useRef<E | null>(null);
  const [height, setHeight] = useState(fallback);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const observer = new ResizeObserver(() => setHeight(el.clientHeight || fallback));
    observer.observe(el);
    setHeight(el.clientHeight || fallback);
    return () => observer.disconnect();
  }, [fallback]);
  return [ref, height] as const;
}
