import { memo, useMemo } from 'react';
import type { FieldIssue } from '../../../../shared/patch/field-issue';
import type { ComputeResult } from '../../../lib/live-session/session-connection';
import type { PreviewSound } from '../../../lib/synthesis/preview-sound';
import { BottomAxis, SideAxis, type ChartMargins } from './chart-axes';
import { ChartFrame, resultsState } from './chart-frame';
import { frequencyTickLabel, linearScale, logScale, logTicks } from './chart-scales';
import { logColumnMax } from './log-column-max';
import { spectrumPeakHz, type MagnitudeSpectrum } from '../../../lib/synthesis/magnitude-spectrum';
import { formatCount, formatHz } from './quantity-format';
import { MINUS } from './si-prefix';

export interface SpectrumProps {
  result: ComputeResult | null;
  /** The preview synthesised from the result (its spectrum, computed by the synthesis worker, is drawn once it is complete). */
  sound: PreviewSound | null;
  issues: FieldIssue[];
  /** Fill the parent's height (a workbench pane) instead of the fixed height. */
  fill?: boolean;
}

const HEIGHT_PX = 220;
const MARGINS: ChartMargins = { top: 10, right: 14, bottom: 40, left: 52 };
/** The spectrum starts at the bottom of hearing and ends at the preview's Nyquist frequency. */
export const SPECTRUM_FROM_HZ = 20;
const LEVEL_RANGE_DB: [number, number] = [-100, 0];
const LEVEL_TICKS_DB = [0, -20, -40, -60, -80, -100];
/** Length of the marks of the mode frequencies, hanging from the top of the plot. */
const MODE_TICK_PX = 8;

function levelTickLabel(levelDb: number): string {
  return levelDb < 0 ? `${MINUS}${Math.abs(levelDb)}` : String(levelDb);
}

/**
 * The magnitude spectrum of the preview, in dB relative to its strongest bin, on a log frequency
 * axis from 20 Hz to the preview's Nyquist frequency. The mode table's frequencies are marked by
 * faint ticks along the top, so one sees which partials the pickup hears. The transform is done
 * once per result, in the synthesis worker; here each pixel column draws the largest bin it covers.
 */
export const Spectrum = memo(function Spectrum({ result, sound, issues, fill = false }: SpectrumProps) {
  const state = resultsState(result, issues);
  const preview = sound?.complete ? sound : null;
  const spectrum = preview?.analysis?.spectrum ?? null;
  const summary =
    result && spectrum
      ? spectrum.silent || spectrum.analysedSampleCount === 0
        ? 'The preview is silent.'
        : `Spectrum of ${spectrum.analysedSampleCount < (preview?.samples.length ?? 0) ? `the first ${spectrum.analysedDurationS.toFixed(2)} s of the preview` : `the whole ${spectrum.analysedDurationS.toFixed(2)} s preview`} ` +
          `(${formatCount(spectrum.fftSize)}-point transform, Hann window, ` +
          `${spectrum.binHz.toPrecision(3)} Hz bins); strongest at ${formatHz(spectrumPeakHz(spectrum, SPECTRUM_FROM_HZ))}.`
      : null;

  return (
    <ChartFrame title="Spectrum" subject="the spectrum" summary={summary} state={state} heightPx={fill ? undefined : HEIGHT_PX}>
      {(widthPx, heightPx) => (result && spectrum ? <SpectrumPlot result={result} nyquistHz={(preview?.sampleRateHz ?? 0) / 2} spectrum={spectrum} widthPx={widthPx} heightPx={heightPx} /> : null)}
    </ChartFrame>
  );
});

interface SpectrumPlotProps {
  result: ComputeResult;
  nyquistHz: number;
  spectrum: MagnitudeSpectrum;
  widthPx: number;
  heightPx: number;
}

function SpectrumPlot({ result, nyquistHz, spectrum, widthPx, heightPx }: SpectrumPlotProps) {
  const plotRight = Math.max(MARGINS.left + 10, widthPx - MARGINS.right);
  const plotBottom = heightPx - MARGINS.bottom;
  const toHz = Math.max(nyquistHz, SPECTRUM_FROM_HZ * 2);
  const x = useMemo(() => logScale([SPECTRUM_FROM_HZ, toHz], [MARGINS.left, plotRight]), [toHz, plotRight]);
  const y = useMemo(() => linearScale(LEVEL_RANGE_DB, [plotBottom, MARGINS.top]), [plotBottom]);

  const curve = useMemo(() => {
    const columns = Math.max(1, Math.round(plotRight - MARGINS.left));
    const levels = logColumnMax(spectrum.levelDb, spectrum.binHz, SPECTRUM_FROM_HZ, toHz, columns);
    const parts: string[] = [];
    for (let c = 0; c < columns; c++) {
      const level = Math.min(LEVEL_RANGE_DB[1], Math.max(LEVEL_RANGE_DB[0], Number.isNaN(levels[c]) ? LEVEL_RANGE_DB[0] : levels[c]));
      parts.push(`${c === 0 ? 'M' : 'L'}${(MARGINS.left + c + 0.5).toFixed(1)} ${y(level).toFixed(1)}`);
    }
    const line = parts.join('');
    return { line, area: `${line}L${(MARGINS.left + columns - 0.5).toFixed(1)} ${plotBottom}L${(MARGINS.left + 0.5).toFixed(1)} ${plotBottom}Z` };
  }, [spectrum, toHz, plotRight, plotBottom, y]);

  const modeTicks = useMemo(() => {
    const columns = new Set<number>();
    for (let m = 0; m < result.modeCount; m++) {
      const hz = result.frequencyHz[m];
      if (hz >= SPECTRUM_FROM_HZ && hz <= toHz) columns.add(Math.round(x(hz) * 2) / 2);
    }
    return { count: columns.size, path: [...columns].map((px) => `M${px} ${MARGINS.top}v${MODE_TICK_PX}`).join('') };
  }, [result, toHz, x]);

  const xTicks = logTicks([SPECTRUM_FROM_HZ, toHz], Math.max(3, Math.floor((plotRight - MARGINS.left) / 40)));
  return (
    <svg width={widthPx} height={heightPx} viewBox={`0 0 ${widthPx} ${heightPx}`} className="block" aria-hidden="true">
      <SideAxis scale={y} ticks={LEVEL_TICKS_DB} format={levelTickLabel} title="level (dB re max)" at={MARGINS.left} gridTo={plotRight} />
      <BottomAxis scale={x} ticks={xTicks} format={frequencyTickLabel} title="frequency (Hz, log)" at={plotBottom} />
      <path d={modeTicks.path} data-mode-ticks={modeTicks.count} className="stroke-brass-600 dark:stroke-brass-400" strokeWidth={1} opacity={0.45} />
      <path d={curve.area} className="fill-teal-600 dark:fill-teal-400" opacity={0.15} />
      <path d={curve.line} data-spectrum-curve="" fill="none" className="stroke-teal-600 dark:stroke-teal-400" strokeWidth={1.25} strokeLinejoin="round" />
    </svg>
  );
}
