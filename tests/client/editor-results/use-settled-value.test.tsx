// @vitest-environment happy-dom
import { act, renderHook } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { useSettledValue } from '../../../src/features/editor/results/use-settled-value';

describe('useSettledValue: heavy charts follow a stream of results a few times a second', () => {
  beforeEach(() => vi.useFakeTimers());
  afterEach(() => vi.useRealTimers());

  it('passes a value on once it has been quiet for the quiet time', () => {
    const { result, rerender } = renderHook(({ value }) => useSettledValue(value, 250, 1000), { initialProps: { value: 1 } });
    rerender({ value: 2 });
    expect(result.current).toBe(1);
    act(() => vi.advanceTimersByTime(249));
    expect(result.current).toBe(1);
    act(() => vi.advanceTimersByTime(2));
    expect(result.current).toBe(2);
  });

  it('still passes one on within the longest wait while values keep coming every 60 ms', () => {
    const { result, rerender } = renderHook(({ value }) => useSettledValue(value, 250, 1000), { initialProps: { value: 0 } });
    const seen = new Set<number>();
    for (let i = 1; i <= 40; i++) {
      rerender({ value: i });
      act(() => vi.advanceTimersByTime(60));
      seen.add(result.current);
    }
    // 2.4 s of values: at least two updates got through, far fewer than the 40 values sent.
    expect(seen.size).toBeGreaterThanOrEqual(3);
    expect(seen.size).toBeLessThan(10);
  });
});
