import { useCallback, useRef, useState } from 'react';

export interface ElementSizePx {
  widthPx: number;
  heightPx: number;
}

/**
 * The content-box size in CSS pixels of the element the returned ref is put on, followed with a
 * ResizeObserver; `fallback` until it has been measured (or where nothing lays out, as in tests).
 */
export function useElementSize<T extends HTMLElement>(fallback: ElementSizePx): [(element: T | null) => void, ElementSizePx] {
  const [size, setSize] = useState(fallback);
  const observer = useRef<ResizeObserver | null>(null);
  const { widthPx: fallbackWidthPx, heightPx: fallbackHeightPx } = fallback;
  const ref = useCallback(
    (element: T | null) => {
      observer.current?.disconnect();
      observer.current = null;
      if (!element) return;
      const measure = (widthPx: number, heightPx: number) => {
        const next = { widthPx: Math.floor(widthPx) > 0 ? Math.floor(widthPx) : fallbackWidthPx, heightPx: Math.floor(heightPx) > 0 ? Math.floor(heightPx) : fallbackHeightPx };
        setSize((current) => (current.widthPx === next.widthPx && current.heightPx === next.heightPx ? current : next));
      };
      const box = element.getBoundingClientRect();
      measure(box.width, box.height);
      if (typeof ResizeObserver === 'undefined') return;
      observer.current = new ResizeObserver((entries) => {
        const entry = entries[entries.length - 1];
        if (entry) measure(entry.contentRect.width, entry.contentRect.height);
      });
      observer.current.observe(element);
    },
    [fallbackWidthPx, fallbackHeightPx],
  );
  return [ref, size];
}
