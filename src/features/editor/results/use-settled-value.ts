import { useEffect, useRef, useState } from 'react';

/**
 * The value once it has stopped changing for `quietMs`, and at least every `maxWaitMs` while it
 * keeps changing. The heavy charts (a 65,536-point spectrum, the waveform envelope, the slow-motion
 * model) follow results through this, so a stream of results while people drag costs the page a
 * few redraws a second instead of one per result, and the canvas keeps its frame rate.
 */
export function useSettledValue<T>(value: T, quietMs = 250, maxWaitMs = 1000): T {
  const [settled, setSettled] = useState(value);
  const firstPending = useRef<number | null>(null);
  useEffect(() => {
    if (Object.is(value, settled)) {
      firstPending.current = null;
      return;
    }
    const now = performance.now();
    firstPending.current ??= now;
    const wait = Math.max(0, Math.min(quietMs, firstPending.current + maxWaitMs - now));
    const timer = setTimeout(() => {
      firstPending.current = null;
      setSettled(value);
    }, wait);
    return () => clearTimeout(timer);
  }, [value, settled, quietMs, maxWaitMs]);
  return settled;
}
