import { fireEvent } from '@testing-library/react';
import { expect } from 'vitest';

/** The x, in the chart's pixels, of mode n's stem. */
export function stemXPx(container: HTMLElement, n: number): number {
  const stem = container.querySelector(`[data-mode="${n}"] line`);
  if (!stem) throw new Error(`mode ${n} has no stem`);
  return Number(stem.getAttribute('x1'));
}

/**
 * Moves the pointer over the mode chart to `offsetPx` right of mode n's stem. happy-dom lays nothing
 * out, so the chart's SVG sits at left 0 and clientX is the chart's own x.
 */
export function pointAtMode(container: HTMLElement, n: number, offsetPx = 0): void {
  const svg = container.querySelector('[role="slider"] svg');
  if (!svg) throw new Error('no mode chart');
  expect(svg.getBoundingClientRect().left).toBe(0);
  fireEvent.pointerMove(svg, { clientX: stemXPx(container, n) + offsetPx });
}
