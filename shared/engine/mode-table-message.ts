import type { Patch } from '../patch/patch-schema';
import type { ModeTableWire } from '../protocol/mode-table-wire';
import { computeModeTable } from './mode-table';
import { previewPatch } from './preview-patch';
import { previewSampleRateHz } from './preview-sample-rate';

/**
 * The patch the live preview is synthesised from: as long as the patch, up to `maxDurationS`, at a
 * rate that keeps it within LIMITS.previewMaxSamples (so a 12 s preview is made at 24 kHz).
 */
export function livePreviewPatch(patch: Patch, maxDurationS: number): Patch {
  const preview = previewPatch(patch, maxDurationS);
  return { ...preview, render: { ...preview.render, sampleRateHz: previewSampleRateHz(preview.render.sampleRateHz, preview.render.durationS) } };
}

/** Where a table stands in the session's history: set by the compute channel. */
export interface TableStamp {
  sequence: number;
  documentVersion: number;
  stateVector: Uint8Array;
}

/**
 * The mode table of a validated patch as it is sent: its kept modes' amplitudes and the numbers the
 * rest follows from, with the preview (at most `previewMaxDurationS`) the browser synthesises.
 */
export function modeTableMessage(patch: Patch, previewMaxDurationS: number, stamp: TableStamp): ModeTableWire {
  const started = performance.now();
  const table = computeModeTable(patch);
  const preview = livePreviewPatch(patch, previewMaxDurationS);
  return {
    ...stamp,
    string: { lengthM: patch.string.lengthM, tensionN: patch.string.tensionN, linearDensityKgPerM: patch.string.linearDensityKgPerM, inharmonicityB: patch.string.inharmonicityB },
    damping: { b1PerS: patch.damping.b1PerS, b2M2PerS: patch.damping.b2M2PerS },
    pickup: { output: patch.pickup.output, positionM: patch.pickup.positionM },
    render: { sampleRateHz: patch.render.sampleRateHz, durationS: patch.render.durationS },
    preview: { sampleRateHz: preview.render.sampleRateHz, durationS: preview.render.durationS },
    totalEnergyJ: table.totalEnergyJ,
    aM: Float32Array.from(table.aM),
    vMPerS: Float32Array.from(table.vMPerS),
    computeMs: performance.now() - started,
  };
}
