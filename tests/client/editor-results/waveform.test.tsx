// @vitest-environment happy-dom
import { cleanup, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { envelopeAmplitude, Waveform } from '../../../src/features/editor/results/waveform';
import { syntheticResult, syntheticSound, TENSION_ISSUE } from './synthetic-result';

afterEach(cleanup);

function pathPoints(d: string): Array<[number, number]> {
  return [...d.matchAll(/[ML]([\d.-]+) ([\d.-]+)/g)].map((match) => [Number(match[1]), Number(match[2])]);
}

describe('waveform', () => {
  it('draws the preview as min/max per pixel column on a time axis in seconds, with a summary', () => {
    // The worker computed the columns for this plot: 640 − 52 − 50 = 538 px wide.
    const { container } = render(<Waveform result={syntheticResult()} sound={syntheticSound({ columns: 538 })} issues={[]} />);
    const figure = screen.getByRole('figure', { name: 'Waveform' });
    expect(within(figure).getByText('time (s)')).toBeTruthy();
    expect(within(figure).getByText('amplitude (normalised)')).toBeTruthy();
    expect(within(figure).getByText('envelope (dB)')).toBeTruthy();
    expect(within(figure).getByText('0.4')).toBeTruthy();
    const summary = document.getElementById(figure.getAttribute('aria-describedby') ?? '')?.textContent ?? '';
    expect(summary).toMatch(/^0\.50 s of the preview at 48 kHz, normalised to its peak\. The envelope falls from −\d+\.\d dB to −\d+\.\d dB\.$/);
    // One upper and one lower point per column: 640 − 52 − 50 = 538 columns.
    const points = pathPoints(container.querySelector('[data-waveform]')?.getAttribute('d') ?? '');
    expect(points.length).toBe(2 * 538);
    // The preview is peak-normalised: its top reaches the +1 line.
    const topPx = Math.min(...points.map(([, y]) => y));
    expect(topPx).toBeCloseTo(10, 0);
  });

  it('draws the decay envelope on top: a falling line on the dB axis', () => {
    const { container } = render(<Waveform result={syntheticResult()} sound={syntheticSound({ columns: 538 })} issues={[]} />);
    const envelope = pathPoints(container.querySelector('[data-envelope]')?.getAttribute('d') ?? '');
    // 0.5 s in blocks of two periods of 220 Hz (436 samples at 48 kHz): 55 whole blocks; the last 20
    // samples are too few for a steady RMS and are left out.
    expect(envelope.length).toBe(55);
    const first = envelope[1][1];
    const last = envelope[envelope.length - 1][1];
    expect(last).toBeGreaterThan(first); // lower on screen: quieter
  });

  it('stretches the columns it has across the plot until the worker sends this width’s, and draws nothing before any', () => {
    const { container, rerender } = render(<Waveform result={syntheticResult()} sound={syntheticSound({ columns: null })} issues={[]} />);
    expect(container.querySelector('[data-waveform]')?.getAttribute('d')).toBe('');
    // 269 columns over 538 px: two pixels each, the first centred at 52 + 1, the last at 52 + 537.
    rerender(<Waveform result={syntheticResult()} sound={syntheticSound({ columns: 269 })} issues={[]} />);
    const points = pathPoints(container.querySelector('[data-waveform]')?.getAttribute('d') ?? '');
    expect(points.length).toBe(2 * 269);
    expect(points[0][0]).toBeCloseTo(53, 5);
    expect(points[268][0]).toBeCloseTo(52 + 537, 5);
  });

  it('maps 0 dB to the top and −60 dB to the centre line', () => {
    expect(envelopeAmplitude(0)).toBe(1);
    expect(envelopeAmplitude(-30)).toBe(0.5);
    expect(envelopeAmplitude(-60)).toBe(0);
    expect(envelopeAmplitude(-90)).toBe(0);
  });

  it('says when no result has come yet, and when the patch has problems', () => {
    const { container, rerender } = render(<Waveform result={null} sound={null} issues={[]} />);
    expect(screen.getByText('No result yet')).toBeTruthy();
    rerender(<Waveform result={null} sound={null} issues={[TENSION_ISSUE]} />);
    expect(screen.getByText('The patch has problems')).toBeTruthy();
    expect(screen.getByText('The waveform returns once they are fixed.')).toBeTruthy();
    expect(container.querySelector('svg')).toBeNull();
  });
});
