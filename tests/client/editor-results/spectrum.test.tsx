// @vitest-environment happy-dom
import { cleanup, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { Spectrum } from '../../../src/features/editor/results/spectrum';
import { syntheticResult, syntheticSound, TENSION_ISSUE } from './synthetic-result';

afterEach(cleanup);

/** The x of every point of an SVG path made of M/L commands. */
function pathPoints(d: string): Array<[number, number]> {
  return [...d.matchAll(/[ML]([\d.-]+) ([\d.-]+)/g)].map((match) => [Number(match[1]), Number(match[2])]);
}

describe('spectrum', () => {
  it('draws the preview’s spectrum with titled axes and a summary naming its strongest frequency (220 Hz)', () => {
    const { container } = render(<Spectrum result={syntheticResult()} sound={syntheticSound()} issues={[]} />);
    const figure = screen.getByRole('figure', { name: 'Spectrum' });
    expect(within(figure).getByText('frequency (Hz, log)')).toBeTruthy();
    expect(within(figure).getByText('level (dB re max)')).toBeTruthy();
    const summary = document.getElementById(figure.getAttribute('aria-describedby') ?? '')?.textContent ?? '';
    expect(summary).toMatch(/^Spectrum of the whole 0\.50 s preview \(32,768-point transform, Hann window, 1\.46 Hz bins\); strongest at \d+\.\d Hz\.$/);
    const strongestHz = Number(/strongest at ([\d.]+) Hz/.exec(summary)?.[1]);
    expect(Math.abs(strongestHz - 220)).toBeLessThanOrEqual(48000 / 32768);
    // The axis runs 20 Hz … 24 kHz (Nyquist of 48 kHz).
    expect(within(figure).getByText('20')).toBeTruthy();
    expect(within(figure).getByText('20k')).toBeTruthy();
    expect(container.querySelector('[data-spectrum-curve]')).toBeTruthy();
  });

  it('draws one point per pixel column, not one per bin, with its peak column at 220 Hz', () => {
    const { container } = render(<Spectrum result={syntheticResult()} sound={syntheticSound()} issues={[]} />);
    const points = pathPoints(container.querySelector('[data-spectrum-curve]')?.getAttribute('d') ?? '');
    // 640 px wide (the fallback where nothing lays out) less the margins.
    expect(points.length).toBe(640 - 52 - 14);
    const highest = points.reduce((best, point) => (point[1] < best[1] ? point : best));
    // x = 52 + 574·log(f/20)/log(24000/20) on the log axis.
    const peakHz = 20 * Math.exp(((highest[0] - 52) / 574) * Math.log(24000 / 20));
    expect(peakHz).toBeGreaterThan(218);
    expect(peakHz).toBeLessThan(222);
  });

  it('marks each mode frequency up to Nyquist as a faint tick', () => {
    const { container } = render(<Spectrum result={syntheticResult()} sound={syntheticSound()} issues={[]} />);
    const ticks = container.querySelector('[data-mode-ticks]');
    expect(ticks?.getAttribute('data-mode-ticks')).toBe('20');
    expect(Number(ticks?.getAttribute('opacity'))).toBeLessThan(0.5);
    // Modes above the preview's Nyquist frequency (24 kHz) are not marked.
    cleanup();
    const dense = render(<Spectrum result={syntheticResult({ modeCount: 200 })} sound={syntheticSound()} issues={[]} />);
    expect(Number(dense.container.querySelector('[data-mode-ticks]')?.getAttribute('data-mode-ticks'))).toBeLessThanOrEqual(109);
  });

  it('says when no result has come yet, and when the patch has problems', () => {
    const { container, rerender } = render(<Spectrum result={null} sound={null} issues={[]} />);
    expect(screen.getByText('No result yet')).toBeTruthy();
    expect(screen.getByText('The spectrum appears when the first result arrives.')).toBeTruthy();
    rerender(<Spectrum result={syntheticResult()} sound={syntheticSound()} issues={[TENSION_ISSUE]} />);
    expect(screen.getByText('The patch has problems')).toBeTruthy();
    expect(container.querySelector('svg')).toBeNull();
  });

  it('draws nothing until the worker’s analysis of the complete preview has come', () => {
    const sound = syntheticSound();
    const { container, rerender } = render(<Spectrum result={syntheticResult()} sound={{ ...sound, complete: false, readySamples: 12_000, analysis: null }} issues={[]} />);
    expect(container.querySelector('[data-spectrum-curve]')).toBeNull();
    rerender(<Spectrum result={syntheticResult()} sound={{ ...sound, analysis: null }} issues={[]} />);
    expect(container.querySelector('[data-spectrum-curve]')).toBeNull();
    rerender(<Spectrum result={syntheticResult()} sound={sound} issues={[]} />);
    expect(container.querySelector('[data-spectrum-curve]')).toBeTruthy();
  });

  it('says so when the preview is silent', () => {
    render(<Spectrum result={syntheticResult()} sound={syntheticSound({ samples: new Float32Array(4800) })} issues={[]} />);
    expect(screen.getByText('The preview is silent.')).toBeTruthy();
  });
});

describe('spectrum of a long preview', () => {
  it('analyses the first 2^16 samples of a 2 s preview and says so', () => {
    render(<Spectrum result={syntheticResult({ durationS: 2 })} sound={syntheticSound({ durationS: 2 })} issues={[]} />);
    const figure = screen.getByRole('figure', { name: 'Spectrum' });
    const summary = document.getElementById(figure.getAttribute('aria-describedby') ?? '')?.textContent ?? '';
    expect(summary).toMatch(/^Spectrum of the first 1\.37 s of the preview \(65,536-point transform, Hann window, 0\.732 Hz bins\)/);
  });
});
