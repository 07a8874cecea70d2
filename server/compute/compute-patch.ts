import { samplePeak } from '../../shared/audio/peak';
import { computeModeTable } from '../../shared/engine/mode-table';
import { previewPatch } from '../../shared/engine/preview-patch';
import { previewSampleRateHz } from '../../shared/engine/preview-sample-rate';
import { renderBank } from '../../shared/engine/render-bank';
import { buildOscillatorBank, type OscillatorBank } from '../../shared/engine/oscillator-bank';
import { renderSampleCount } from '../../shared/engine/render-patch';
import type { Patch } from '../../shared/patch/patch-schema';
import type { ComputeResultMessage } from '../../shared/protocol/compute-protocol';

/** A compute result without its envelope (type, session, sequence), which the channel adds. */
export type ComputeOutput = Omit<ComputeResultMessage, 'type' | 'sessionId' | 'sequence'>;

/**
 * The patch the live preview renders: as long as the patch, up to `maxDurationS`, at a rate that
 * keeps it within LIMITS.previewMaxSamples (so a 12 s preview is sent at 24 kHz).
 */
export function livePreviewPatch(patch: Patch, maxDurationS: number): Patch {
  const preview = previewPatch(patch, maxDurationS);
  return { ...preview, render: { ...preview.render, sampleRateHz: previewSampleRateHz(preview.render.sampleRateHz, preview.render.durationS) } };
}

/**
 * The mode table of the patch itself (as the CLI prints it) and a bounded preview, peak-normalised
 * to ±1. `render` adds a bank into a buffer: the TypeScript kernel, or the worker's WebAssembly one.
 */
export function computePatch(patch: Patch, previewDurationS: number, render: (bank: OscillatorBank, out: Float64Array) => void = renderBank): ComputeOutput {
  const started = performance.now();
  const table = computeModeTable(patch);
  const preview = livePreviewPatch(patch, previewDurationS);
  const previewTable = preview.render.sampleRateHz === patch.render.sampleRateHz ? table : computeModeTable(preview);
  const bank = buildOscillatorBank(preview, previewTable, renderSampleCount(preview));
  const samples = new Float64Array(bank.sampleCount);
  render(bank, samples);
  const peak = samplePeak(samples);
  const normalized = new Float32Array(samples.length);
  const gain = peak > 0 ? 1 / peak : 0;
  for (let i = 0; i < samples.length; i++) normalized[i] = samples[i] * gain;
  return {
    f0Hz: table.f0Hz,
    waveSpeedMPerS: table.waveSpeedMPerS,
    totalEnergyJ: table.totalEnergyJ,
    modeCount: table.count,
    frequencyHz: table.frequencyHz,
    aM: table.aM,
    vMPerS: table.vMPerS,
    energyJ: table.energyJ,
    decayRatePerS: table.decayRatePerS,
    previewSampleRateHz: preview.render.sampleRateHz,
    preview: normalized,
    previewPhysicalPeak: peak,
    computeMs: performance.now() - started,
  };
}
