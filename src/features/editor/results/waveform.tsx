import { memo, useMemo } from 'react';
import type { FieldIssue } from '../../../../shared/patch/field-issue';
import type { ComputeResult } from '../../../lib/live-session/session-connection';
import type { PreviewSound } from '../../../lib/synthesis/preview-sound';
import { BottomAxis, SideAxis, type ChartMargins } from './chart-axes';
import { ChartFrame, resultsState } from './chart-frame';
import { linearScale, linearTicks } from './chart-scales';
import type { WaveformColumns } from '../../../lib/synthesis/preview-analysis';
import { useWaveformRequest } from '../../../lib/synthesis/use-waveform-request';
import { formatDb } from './quantity-format';
import { MINUS } from './si-prefix';

export interface WaveformProps {
  result: ComputeResult | null;
  /** The preview synthesised from the result (drawn once it is complete, from the columns and envelope the synthesis worker computed). */
  sound: PreviewSound | null;
  issues: FieldIssue[];
  /** Fill the parent's height (a workbench pane) instead of the fixed height. */
  fill?: boolean;
}

const HEIGHT_PX = 220;
const MARGINS: ChartMargins = { top: 10, right: 50, bottom: 40, left: 52 };
/** The envelope's dB axis: 0 dB at the top of the plot, this level on the centre line. */
export const ENVELOPE_RANGE_DB = 60;
const ENVELOPE_TICKS_DB = [0, -20, -40, -60];

/** Where a level in dB sits on the amplitude axis: 0 dB at +1, −60 dB (and below) at 0. */
export function envelopeAmplitude(levelDb: number): number {
  return Math.min(1, Math.max(0, 1 + levelDb / ENVELOPE_RANGE_DB));
}

function signedLabel(value: number): string {
  return value < 0 ? `${MINUS}${Math.abs(value)}` : String(value);
}

/**
 * The preview as a waveform: each pixel column shows the lowest and highest sample it covers, so no
 * peak is lost. On top, its decay envelope: the RMS over blocks of two periods of f0, in dB (read on
 * the right-hand axis, 0 dB at the top and −60 dB on the centre line), where an exponential decay is
 * a straight line. The synthesis worker computes both for the plot's width (asked for when the width
 * changes); until the new width's columns arrive, the ones it has are stretched across the plot.
 */
export const Waveform = memo(function Waveform({ result, sound, issues, fill = false }: WaveformProps) {
  const state = resultsState(result, issues);
  const preview = sound?.complete ? sound : null;
  const analysis = preview?.analysis ?? null;
  const durationS = preview ? preview.samples.length / preview.sampleRateHz : 0;
  let summary: string | null = null;
  if (result && analysis) {
    const levels = analysis.envelope.levelDb;
    summary =
      levels.length === 0
        ? 'The preview is empty.'
        : `${durationS.toFixed(2)} s of the preview at ${((preview?.sampleRateHz ?? 0) / 1000).toLocaleString('en')} kHz, normalised to its peak. ` +
          `The envelope falls from ${formatDb(levels.reduce((a, b) => Math.max(a, b), -Infinity))} to ${formatDb(levels[levels.length - 1])}.`;
  }
  return (
    <ChartFrame title="Waveform" subject="the waveform" summary={summary} state={state} heightPx={fill ? undefined : HEIGHT_PX}>
      {(widthPx, heightPx) => (result && preview && analysis ? <WaveformPlot sound={preview} waveform={analysis.waveform} durationS={durationS} widthPx={widthPx} heightPx={heightPx} /> : null)}
    </ChartFrame>
  );
});

function WaveformPlot({ sound, waveform, durationS, widthPx, heightPx }: { sound: PreviewSound; waveform: WaveformColumns | null; durationS: number; widthPx: number; heightPx: number }) {
  const plotRight = Math.max(MARGINS.left + 10, widthPx - MARGINS.right);
  const plotBottom = heightPx - MARGINS.bottom;
  const columns = Math.max(1, Math.round(plotRight - MARGINS.left));
  useWaveformRequest(sound, columns);
  const x = useMemo(() => linearScale([0, durationS > 0 ? durationS : 1], [MARGINS.left, plotRight]), [durationS, plotRight]);
  const y = useMemo(() => linearScale([-1, 1], [plotBottom, MARGINS.top]), [plotBottom]);

  const wave = useMemo(() => {
    if (!waveform || waveform.columns === 0 || sound.samples.length === 0) return '';
    const { min, max } = waveform;
    // One point per column the worker computed: exactly one per pixel once it has this width.
    const step = columns / waveform.columns;
    const upper: string[] = [];
    const lower: string[] = [];
    for (let c = 0; c < waveform.columns; c++) {
      const px = (MARGINS.left + (c + 0.5) * step).toFixed(1);
      upper.push(`${c === 0 ? 'M' : 'L'}${px} ${y(max[c]).toFixed(1)}`);
      // A column whose samples are all equal still gets a hairline.
      lower.push(`L${px} ${(y(min[c]) + (max[c] === min[c] ? 0.5 : 0)).toFixed(1)}`);
    }
    return `${upper.join('')}${lower.reverse().join('')}Z`;
  }, [waveform, sound, columns, y]);

  const envelope = useMemo(() => {
    if (!waveform) return '';
    const { timeS, levelDb } = waveform.envelope;
    const parts: string[] = [];
    for (let block = 0; block < timeS.length; block++) {
      parts.push(`${block === 0 ? 'M' : 'L'}${x(timeS[block]).toFixed(1)} ${y(envelopeAmplitude(levelDb[block])).toFixed(1)}`);
    }
    return parts.join('');
  }, [waveform, x, y]);

  const timeTicks = linearTicks(x.domain, Math.max(2, Math.floor(columns / 70)));
  const dbScale = linearScale([-ENVELOPE_RANGE_DB, 0], [y(0), y(1)]);
  return (
    <svg width={widthPx} height={heightPx} viewBox={`0 0 ${widthPx} ${heightPx}`} className="block" aria-hidden="true">
      <SideAxis scale={y} ticks={[-1, -0.5, 0, 0.5, 1]} format={signedLabel} title="amplitude (normalised)" at={MARGINS.left} gridTo={plotRight} />
      <BottomAxis scale={x} ticks={timeTicks} format={(t) => String(t)} title="time (s)" at={plotBottom} />
      <path d={wave} data-waveform="" className="fill-teal-600 stroke-teal-600 dark:fill-teal-400 dark:stroke-teal-400" strokeWidth={0.5} />
      <path d={envelope} fill="none" className="stroke-white dark:stroke-slate-900" strokeWidth={4} strokeLinejoin="round" opacity={0.8} />
      <path d={envelope} data-envelope="" fill="none" className="stroke-brass-600 dark:stroke-brass-300" strokeWidth={1.75} strokeLinejoin="round" />
      <SideAxis
        scale={dbScale}
        ticks={ENVELOPE_TICKS_DB}
        format={signedLabel}
        title="envelope (dB)"
        at={plotRight}
        side="right"
        className="text-brass-600 dark:text-brass-300"
      />
    </svg>
  );
}
