import { useCallback, useRef, useState } from 'react';

/**
 * The width in CSS pixels of the element the returned ref is put on, followed with a
 * ResizeObserver. Until the element has been measured (or where nothing lays out, as in tests) it
 * is `fallbackPx`.
 */
export function useContainerWidth<T extends HTMLElement>(fallbackPx = 640): [(element: T | null) => void, number] {
  const [widthPx, setWidthPx] = useState(fallbackPx);
  const observer = useRef<ResizeObserver | null>(null);
  const ref = useCallback(
    (element: T | null) => {
      observer.current?.disconnect();
      observer.current = null;
      if (!element) return;
      const measure = (measuredPx: number) => {
        const rounded = Math.floor(measuredPx);
        setWidthPx(rounded > 0 ? rounded : fallbackPx);
      };
      measure(element.getBoundingClientRect().width);
      if (typeof ResizeObserver === 'undefined') return;
      observer.current = new ResizeObserver((entries) => {
        const entry = entries[entries.length - 1];
        if (entry) measure(entry.contentRect.width);
      });
      observer.current.observe(element);
    },
    [fallbackPx],
  );
  return [ref, widthPx];
}
