import { useCallback, useRef, useState } from 'react';

/**
 * Width of an element in CSS px, kept current with a ResizeObserver. Where the
 * element has no layout (jsdom, a hidden tab) it reports fallbackPx.
 */
export function useElementWidth<T extends HTMLElement>(fallbackPx: number): [(el: T | null) => void, number] {
  const [width, setWidth] = useState(fallbackPx);
  const observer = useRef<ResizeObserver | null>(null);
  const ref = useCallback((el: T | null) => {
    observer.current?.disconnect();
    observer.current = null;
    if (!el) return;
    const take = (w: number) => {
      if (w > 0) setWidth(Math.round(w));
    };
    take(el.clientWidth);
    if (typeof ResizeObserver !== 'undefined') {
      observer.current = new ResizeObserver((entries) => take(entries[0]?.contentRect.width ?? 0));
      observer.current.observe(el);
    }
  }, []);
  return [ref, width];
}
