import { gainFromDecibels } from '../audio/decibels';
import { bankSegment } from '../engine/bank-segment';
import type { ModeTable } from '../engine/mode-table';
import { buildOscillatorBank, FAST_GROUP, type OscillatorBank } from '../engine/oscillator-bank';
import { renderBank } from '../engine/render-bank';
import { renderBankStereo } from '../engine/render-bank-stereo';
import type { Patch } from '../patch/patch-schema';
import type { RenderOutput } from './render-settings';

/** One stretch of a channel, rendered as one task; `work` is its mode-samples, for progress. */
export interface RenderSegment {
  start: number;
  count: number;
  work: number;
}

/** Segments per channel aimed for: fine enough for progress and for sharing the cores, coarse enough that messaging costs nothing. */
export const SEGMENTS_PER_CHANNEL = 24;
/** Shortest segment, samples. */
export const MIN_SEGMENT_SAMPLES = 16_384;
/** How much of the start a decay-cut render looks at to learn its peak before planning, seconds. */
const EARLY_PEAK_S = 0.1;

/** The patch as a render hears it: the render's sample rate, and its fixed length or its longest. */
export function patchForOutput(patch: Patch, output: RenderOutput): Patch {
  const durationS = output.length.kind === 'fixed' ? output.length.durationS : output.length.maxDurationS;
  return { ...patch, render: { ...patch.render, sampleRateHz: output.sampleRateHz, durationS } };
}

/** The pickup position of each channel: the patch's own, and for stereo a second one. */
export function channelPickupsM(patch: Patch, output: RenderOutput): number[] {
  return output.channels.kind === 'stereo' ? [patch.pickup.positionM, output.channels.secondPickupPositionM] : [patch.pickup.positionM];
}

/** The patch with its pickup moved (the mode table does not depend on the pickup). */
export function withPickupM(patch: Patch, positionM: number): Patch {
  return { ...patch, pickup: { ...patch.pickup, positionM } };
}

/**
 * The oscillators of a render for `sampleCount` samples: mono at one pickup, or stereo (two
 * pickups reading one set of oscillators, see `renderBankStereo`).
 */
export function renderBankFor(patch: Patch, table: ModeTable, pickupsM: ReadonlyArray<number>, sampleCount: number): OscillatorBank {
  return buildOscillatorBank(withPickupM(patch, pickupsM[0]), table, sampleCount, pickupsM[1]);
}

/** Renders a bank (or a segment of one) into one channel per pickup. */
export function renderChannels(bank: OscillatorBank, sampleCount: number): Float64Array[] {
  if (!bank.fast.gainA && !bank.slow.gainA) {
    const out = new Float64Array(sampleCount);
    renderBank(bank, out);
    return [out];
  }
  const outA = new Float64Array(sampleCount);
  const outB = new Float64Array(sampleCount);
  renderBankStereo(bank, outA, outB);
  return [outA, outB];
}

/**
 * An upper bound of the channel's magnitude from sample k on: Σ |G_n|·|r_n|^k over the ringing
 * modes (|Re(G r^k)| ≤ |G||r|^k), plus, for the heavily damped modes, their whole amplitude
 * until their own end (a generous bound; they last a few milliseconds).
 */
function envelopeBound(bank: OscillatorBank, k: number): number {
  let bound = 0;
  const { fast, slow } = bank;
  // A stereo bank's channels weigh each mode by their pickup: the larger weight bounds both.
  const largest = (gainA: Float64Array | undefined, gainB: Float64Array | undefined, j: number) => (gainA && gainB ? Math.max(Math.abs(gainA[j]), Math.abs(gainB[j])) : 1);
  for (let j = 0; j < fast.count; j++) {
    if (fast.activeSamples[j] <= k) continue;
    const magnitude = Math.hypot(fast.stepRe[j], fast.stepIm[j]);
    bound += Math.hypot(fast.stateRe[j], fast.stateIm[j]) * largest(fast.gainA, fast.gainB, j) * Math.exp(k * Math.log(magnitude));
  }
  for (let j = 0; j < slow.count; j++) if (slow.activeSamples[j] > k) bound += 1e6 * (Math.abs(slow.q[j]) + Math.abs(slow.u[j])) * largest(slow.gainA, slow.gainB, j);
  return bound;
}

/**
 * How many samples a render "until decayed" needs: the first sample after which no channel can
 * reach `thresholdDb` below its peak any more. The peak is at least that of the first 0.1 s
 * (rendered here), and the envelope bound only falls, so the search by bisection never cuts a
 * tail that would cross the threshold; the exact cut is then found in the rendered samples.
 */
export function decayedLengthSamples(bank: OscillatorBank, sampleRateHz: number, thresholdDb: number): number {
  const maxSamples = bank.sampleCount;
  const earlyCount = Math.min(maxSamples, Math.round(EARLY_PEAK_S * sampleRateHz));
  let peak = 0;
  for (const channel of renderChannels(bankSegment(bank, 0, earlyCount), earlyCount)) for (const value of channel) peak = Math.max(peak, Math.abs(value));
  if (peak === 0) return earlyCount;
  const level = peak * gainFromDecibels(thresholdDb);
  if (envelopeBound(bank, maxSamples) >= level) return maxSamples;
  let low = 0;
  let high = maxSamples;
  while (high - low > 1) {
    const middle = Math.floor((low + high) / 2);
    if (envelopeBound(bank, middle) < level) high = middle;
    else low = middle;
  }
  return Math.max(high, earlyCount);
}

/** Mode-samples of work in samples [start, end) of a bank. */
function segmentWork(bank: OscillatorBank, start: number, end: number): number {
  let work = 0;
  const overlap = (active: number) => Math.max(0, Math.min(active, end) - start);
  for (let j = 0; j < bank.fast.count; j += FAST_GROUP) work += FAST_GROUP * overlap(bank.fast.activeSamples[j]);
  for (let j = 0; j < bank.slow.count; j++) work += overlap(bank.slow.activeSamples[j]);
  return work;
}

/** The segments of a render of `totalSamples` samples (every channel at once), in time order. */
export function planSegments(bank: OscillatorBank, totalSamples: number): RenderSegment[] {
  const length = Math.max(MIN_SEGMENT_SAMPLES, Math.ceil(totalSamples / SEGMENTS_PER_CHANNEL));
  const segments: RenderSegment[] = [];
  for (let start = 0; start < totalSamples; start += length) {
    const count = Math.min(length, totalSamples - start);
    segments.push({ start, count, work: segmentWork(bank, start, start + count) + count });
  }
  return segments;
}
