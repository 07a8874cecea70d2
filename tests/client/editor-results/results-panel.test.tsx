// @vitest-environment happy-dom
import { cleanup, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ResultsPanel } from '../../../src/features/editor/results/results-panel';
import { pointAtMode } from './point-at-mode';
import { syntheticResult, TENSION_ISSUE } from './synthetic-result';

afterEach(cleanup);

function figure(label: string): string {
  const line = screen.getByRole('group', { name: 'Result figures' });
  const term = within(line).getByText(label);
  return term.nextElementSibling?.textContent ?? '';
}

describe('results panel', () => {
  it('shows the figures line (f0, modes kept, total energy with an SI prefix, T60 of mode 1) and the three charts', () => {
    const { container } = render(<ResultsPanel result={syntheticResult()} issues={[]} />);
    expect(figure('f0')).toBe('220.0 Hz');
    expect(figure('Modes kept')).toBe('20');
    // Σ ¼·μ·L·ω_n²·a_n² over 20 modes = 2.97·10⁻⁴ J.
    expect(figure('Total energy')).toBe('297 µJ');
    // σ1 = 0.55/s → 3·ln 10/0.55 = 12.56 s.
    expect(figure('T60 of mode 1')).toBe('12.6 s');
    const panel = screen.getByRole('region', { name: 'Results' });
    expect(within(panel).getAllByRole('figure').map((chart) => chart.querySelector('h3')?.textContent)).toEqual(['Modes', 'Spectrum', 'Waveform']);
    expect(container.querySelectorAll('[data-mode]')).toHaveLength(20);
  });

  it('passes the hovered mode on', () => {
    const onHoverMode = vi.fn();
    const { container } = render(<ResultsPanel result={syntheticResult()} issues={[]} onHoverMode={onHoverMode} />);
    pointAtMode(container, 2);
    expect(onHoverMode).toHaveBeenLastCalledWith(2);
    expect(screen.getByRole('tooltip').textContent).toBe('Mode 2 · 440.0 Hz · −6.0 dB · T60 9.87 s');
  });

  it('says no result has come yet, in the figures line and in each chart', () => {
    render(<ResultsPanel result={null} issues={[]} />);
    expect(screen.getByText('No result yet: the figures appear when the server sends the first one.')).toBeTruthy();
    expect(screen.getAllByText('No result yet')).toHaveLength(3);
    expect(screen.queryByRole('group', { name: 'Result figures' })).toBeNull();
  });

  it('lists the patch’s problems in place of the figures, and no chart shows the stale result', () => {
    const issues = Array.from({ length: 7 }, (_, i) => ({ ...TENSION_ISSUE, field: `field${i}`, message: `field${i} must be > 0, got -5` }));
    const { container } = render(<ResultsPanel result={syntheticResult()} issues={issues} />);
    const notice = screen.getByText('The patch has problems', { selector: '[role="status"] p' }).closest('[role="status"]') as HTMLElement;
    expect(within(notice).getByText('The patch has problems')).toBeTruthy();
    expect(within(notice).getAllByRole('listitem').map((item) => item.textContent)).toEqual(issues.slice(0, 5).map((issue) => issue.message));
    expect(within(notice).getByText('…and 2 more.')).toBeTruthy();
    expect(screen.queryByRole('group', { name: 'Result figures' })).toBeNull();
    expect(container.querySelectorAll('svg')).toHaveLength(0);
    expect(screen.getAllByText('The patch has problems')).toHaveLength(4);
  });
});
