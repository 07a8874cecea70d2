// @vitest-environment happy-dom
import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ModeChart } from '../../../src/features/editor/results/mode-chart';
import { pointAtMode, stemXPx } from './point-at-mode';
import { syntheticResult, TENSION_ISSUE } from './synthetic-result';

afterEach(cleanup);

function marks(container: HTMLElement): Element[] {
  return [...container.querySelectorAll('[data-mode]')];
}

describe('mode chart', () => {
  it('draws one mark per mode, with its title, axis titles in units, a legend and a summary', () => {
    const { container } = render(<ModeChart result={syntheticResult()} issues={[]} />);
    expect(marks(container)).toHaveLength(20);
    expect(marks(container).map((mark) => mark.getAttribute('data-mode'))).toEqual(Array.from({ length: 20 }, (_, m) => String(m + 1)));
    const figure = screen.getByRole('figure', { name: 'Modes' });
    expect(within(figure).getByText('frequency (Hz, log)')).toBeTruthy();
    expect(within(figure).getByText('level (dB re loudest)')).toBeTruthy();
    expect(within(figure).getByText('Colour: decay time T60')).toBeTruthy();
    expect(within(figure).getByRole('img', { name: /Colour scale of decay time/ })).toBeTruthy();
    const summaryId = figure.getAttribute('aria-describedby') ?? '';
    expect(document.getElementById(summaryId)?.textContent).toBe(
      '20 modes from 220.0 Hz to 4400.0 Hz; the loudest is mode 1. T60 from 337 ms to 12.6 s.',
    );
  });

  it('stems rise to each mode’s level: 1/n² amplitudes put mode 2 at −6 dB on the −80…0 dB axis', () => {
    const { container } = render(<ModeChart result={syntheticResult()} issues={[]} />);
    const stem = (n: number) => container.querySelector(`[data-mode="${n}"] line`) as SVGLineElement;
    const bottom = Number(stem(1).getAttribute('y1'));
    const top = Number(stem(1).getAttribute('y2'));
    const height = bottom - top;
    expect(height).toBeGreaterThan(100);
    // Mode 2 is −6.02 dB: its stem is (80 − 6.02)/80 of the full height.
    expect((bottom - Number(stem(2).getAttribute('y2'))) / height).toBeCloseTo((80 - 20 * Math.log10(2)) / 80, 3);
    // Colour by T60: mode 1 rings longest (12.6 s), mode 20 shortest (σ20 = 20.5/s, 337 ms).
    expect(stem(1).getAttribute('stroke')).not.toBe(stem(20).getAttribute('stroke'));
  });

  it('hovering a mode reports its number and shows its frequency, level and T60; leaving clears it', () => {
    const onHoverMode = vi.fn();
    const { container } = render(<ModeChart result={syntheticResult()} issues={[]} onHoverMode={onHoverMode} />);
    pointAtMode(container, 3);
    expect(onHoverMode).toHaveBeenLastCalledWith(3);
    // σ3 = 0.5 + 0.05·9 = 0.95/s → T60 = 3·ln 10/0.95 = 7.27 s; level −20·log10 3 = −9.5 dB.
    expect(screen.getByRole('tooltip').textContent).toBe('Mode 3 · 660.0 Hz · −9.5 dB · T60 7.27 s');
    fireEvent.pointerLeave(container.querySelector('svg') as Element);
    expect(onHoverMode).toHaveBeenLastCalledWith(null);
    expect(screen.queryByRole('tooltip')).toBeNull();
  });

  it('inspects the stem nearest the pointer, and none when the pointer is far from every stem', () => {
    const onHoverMode = vi.fn();
    const { container } = render(<ModeChart result={syntheticResult()} issues={[]} onHoverMode={onHoverMode} />);
    pointAtMode(container, 1, 8);
    expect(onHoverMode).toHaveBeenLastCalledWith(1);
    // Modes 19 and 20 stand a few pixels apart on the log axis: a point between them, nearer 20.
    const gapPx = stemXPx(container, 20) - stemXPx(container, 19);
    expect(gapPx).toBeLessThan(12);
    pointAtMode(container, 19, 0.7 * gapPx);
    expect(onHoverMode).toHaveBeenLastCalledWith(20);
    pointAtMode(container, 1, -40);
    expect(onHoverMode).toHaveBeenLastCalledWith(null);
    expect(onHoverMode).toHaveBeenCalledTimes(3);
  });

  it('from the keyboard: focus inspects mode 1, arrows, Home and End step through modes, blur clears', () => {
    const onHoverMode = vi.fn();
    render(<ModeChart result={syntheticResult()} issues={[]} onHoverMode={onHoverMode} />);
    const inspector = screen.getByRole('slider', { name: 'Inspect a mode' });
    expect(inspector.tabIndex).toBe(0);
    fireEvent.focus(inspector);
    expect(onHoverMode).toHaveBeenLastCalledWith(1);
    expect(screen.getByRole('tooltip').textContent).toBe('Mode 1 · 220.0 Hz · 0.0 dB · T60 12.6 s');
    fireEvent.keyDown(inspector, { key: 'ArrowRight' });
    expect(onHoverMode).toHaveBeenLastCalledWith(2);
    expect(inspector.getAttribute('aria-valuenow')).toBe('2');
    expect(inspector.getAttribute('aria-valuetext')).toBe('Mode 2 · 440.0 Hz · −6.0 dB · T60 9.87 s');
    fireEvent.keyDown(inspector, { key: 'End' });
    expect(onHoverMode).toHaveBeenLastCalledWith(20);
    fireEvent.keyDown(inspector, { key: 'ArrowRight' });
    expect(inspector.getAttribute('aria-valuenow')).toBe('20');
    fireEvent.keyDown(inspector, { key: 'PageDown' });
    expect(onHoverMode).toHaveBeenLastCalledWith(10);
    fireEvent.keyDown(inspector, { key: 'Home' });
    expect(onHoverMode).toHaveBeenLastCalledWith(1);
    fireEvent.keyDown(inspector, { key: 'Escape' });
    expect(onHoverMode).toHaveBeenLastCalledWith(null);
    fireEvent.keyDown(inspector, { key: 'ArrowRight' });
    expect(onHoverMode).toHaveBeenLastCalledWith(2);
    fireEvent.blur(inspector);
    expect(onHoverMode).toHaveBeenLastCalledWith(null);
    expect(screen.queryByRole('tooltip')).toBeNull();
  });

  it('says when no result has come yet, and when the patch has problems, at the same size', () => {
    const onHoverMode = vi.fn();
    const { container, rerender } = render(<ModeChart result={null} issues={[]} onHoverMode={onHoverMode} />);
    expect(screen.getByText('No result yet')).toBeTruthy();
    expect(marks(container)).toHaveLength(0);
    expect(screen.queryByRole('slider')).toBeNull();
    rerender(<ModeChart result={syntheticResult()} issues={[]} onHoverMode={onHoverMode} />);
    pointAtMode(container, 5);
    expect(onHoverMode).toHaveBeenLastCalledWith(5);
    // Problems win over a result that is now stale, and the hover ends with it.
    rerender(<ModeChart result={syntheticResult()} issues={[TENSION_ISSUE]} onHoverMode={onHoverMode} />);
    expect(screen.getByText('The patch has problems')).toBeTruthy();
    expect(screen.getByText('The mode chart returns once they are fixed.')).toBeTruthy();
    expect(marks(container)).toHaveLength(0);
    expect(onHoverMode).toHaveBeenLastCalledWith(null);
  });

  it('draws at most one mark per pixel column for 4,096 modes, and still steps through every mode by keyboard', () => {
    const onHoverMode = vi.fn();
    const { container } = render(<ModeChart result={syntheticResult({ modeCount: 4096 })} issues={[]} onHoverMode={onHoverMode} />);
    const drawn = marks(container).length;
    expect(drawn).toBeLessThanOrEqual(640);
    expect(drawn).toBeGreaterThan(50);
    expect(screen.getByText(`${drawn.toLocaleString('en')} of 4,096 drawn: the loudest in each pixel`)).toBeTruthy();
    const inspector = screen.getByRole('slider');
    fireEvent.focus(inspector);
    fireEvent.keyDown(inspector, { key: 'End' });
    expect(onHoverMode).toHaveBeenLastCalledWith(4096);
    expect(screen.getByRole('tooltip').textContent).toMatch(/^Mode 4096 · 901120\.0 Hz · −72\.2 dB · T60 /);
  });

  it('handles a result that keeps no modes', () => {
    render(<ModeChart result={syntheticResult({ modeCount: 0 })} issues={[]} />);
    expect(screen.getByText('No modes are kept')).toBeTruthy();
    expect(screen.getByRole('figure', { name: 'Modes' })).toBeTruthy();
  });
});

describe('mode chart floor', () => {
  it('puts a mode with no energy (a pluck at its node) on the −80 dB floor and says "≤ −80.0 dB"', () => {
    const result = syntheticResult();
    result.energyJ[1] = 0;
    const { container } = render(<ModeChart result={result} issues={[]} />);
    const stem = container.querySelector('[data-mode="2"] line') as SVGLineElement;
    expect(stem.getAttribute('y2')).toBe(stem.getAttribute('y1'));
    pointAtMode(container, 2);
    expect(screen.getByRole('tooltip').textContent).toBe('Mode 2 · 440.0 Hz · ≤ −80.0 dB · T60 9.87 s');
  });

  it('keeps the inspected mode across new results while it still exists', () => {
    const onHoverMode = vi.fn();
    const { container, rerender } = render(<ModeChart result={syntheticResult()} issues={[]} onHoverMode={onHoverMode} />);
    pointAtMode(container, 15);
    rerender(<ModeChart result={syntheticResult()} issues={[]} onHoverMode={onHoverMode} />);
    expect(screen.getByRole('tooltip').textContent).toMatch(/^Mode 15 /);
    expect(onHoverMode).toHaveBeenCalledTimes(1);
    // A new result with fewer modes ends the inspection of a mode that is gone.
    rerender(<ModeChart result={syntheticResult({ modeCount: 10 })} issues={[]} onHoverMode={onHoverMode} />);
    expect(onHoverMode).toHaveBeenLastCalledWith(null);
    expect(screen.queryByRole('tooltip')).toBeNull();
  });
});
