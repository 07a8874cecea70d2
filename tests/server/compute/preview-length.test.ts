import { describe, expect, it } from 'vitest';
import { computeTableBytes } from '../../../server/compute/compute-patch';
import { livePreviewPatch } from '../../../shared/engine/mode-table-message';
import { previewSampleRateHz } from '../../../shared/engine/preview-sample-rate';
import { renderBank } from '../../../shared/engine/render-bank';
import { modeTableFromWire, previewBankFromWire, previewSampleCount, renderBankChunk } from '../../../shared/engine/table-synthesis';
import { LIMITS } from '../../../shared/limits';
import { decodeModeTable, type ModeTableWire } from '../../../shared/protocol/mode-table-wire';
import { estimateFrequencyHz } from '../../support/pitch-estimate';
import { testPatch, validPatch } from '../../support/patches';

const stamp = { sequence: 1, documentVersion: 0, stateVector: new Uint8Array(0) };

/** The table as the server encodes it and a browser reads it back. */
function sentTable(durationS: number): { bytes: Uint8Array; wire: ModeTableWire } {
  const patch = validPatch(testPatch({ render: { sampleRateHz: 48000, durationS, maxModes: 4096 } }));
  const bytes = computeTableBytes(patch, LIMITS.livePreviewMaxDurationS, stamp);
  const decoded = decodeModeTable(bytes);
  if (!decoded.ok) throw new Error(decoded.reason);
  return { bytes, wire: decoded.table };
}

/**
 * The live preview follows the patch's length up to LIMITS.livePreviewMaxDurationS (12 s); a long one
 * is described at a lower standard rate so the browser's synthesis stays within LIMITS.previewMaxSamples.
 * The server sends no samples: these rules now hold for the table's `preview` (rate and length), from
 * which each browser synthesises its own preview.
 */
describe('the live preview length', () => {
  it('keeps the patch rate while the preview fits the sample budget, then steps down through standard rates', () => {
    expect(LIMITS.livePreviewMaxDurationS).toBe(12);
    expect(previewSampleRateHz(48000, 4)).toBe(48000);
    expect(previewSampleRateHz(48000, 6)).toBe(48000);
    expect(previewSampleRateHz(48000, 8)).toBe(32000);
    expect(previewSampleRateHz(48000, 12)).toBe(24000);
    expect(previewSampleRateHz(44100, 12)).toBe(24000);
    expect(previewSampleRateHz(96000, 2)).toBe(48000);
    expect(previewSampleRateHz(22050, 12)).toBe(22050);
    for (const durationS of [0.5, 1, 3, 5, 6.5, 7, 9, 10, 11.9, 12]) {
      expect(Math.round(durationS * previewSampleRateHz(48000, durationS))).toBeLessThanOrEqual(LIMITS.previewMaxSamples);
    }
  });

  it('a 10 s patch previews for 10 s, a 30 s patch for 12 s, a 2 s patch for 2 s: in the patch the server derives and in the table it sends', () => {
    for (const [durationS, expectedS, expectedRateHz] of [
      [10, 10, 24000],
      [30, 12, 24000],
      [2, 2, 48000],
    ] as const) {
      const preview = livePreviewPatch(validPatch(testPatch({ render: { sampleRateHz: 48000, durationS, maxModes: 4096 } })), LIMITS.livePreviewMaxDurationS);
      expect(preview.render.durationS).toBe(expectedS);
      const { wire } = sentTable(durationS);
      expect(wire.preview).toEqual({ sampleRateHz: expectedRateHz, durationS: expectedS });
      // The patch's own render settings travel too (the table's mode count follows from them).
      expect(wire.render).toEqual({ sampleRateHz: 48000, durationS });
      expect(previewSampleCount(wire)).toBeLessThanOrEqual(LIMITS.previewMaxSamples);
    }
  });

  it('a 12 s preview is described at 24 kHz, its table is a few KB, and the browser’s synthesis from it sounds the string at its pitch to the end', () => {
    // f0 = (1/2L)·√(T/μ) for an ideal string (Mersenne's law): 1/1.3 · √(70/6e-4) = 262.7 Hz for the test string.
    const expectedF0Hz = Math.sqrt(70 / 6e-4) / (2 * 0.65);
    const { bytes, wire } = sentTable(12);
    expect(wire.preview).toEqual({ sampleRateHz: 24000, durationS: 12 });
    expect(previewSampleCount(wire)).toBe(12 * 24000);
    // 91 modes below 24 kHz (f_n = n·262.7 Hz): 132 header bytes + 8 per mode, against ≈ 1.15 MB of samples before.
    expect(wire.aM.length).toBe(Math.floor(24000 / expectedF0Hz));
    expect(bytes.byteLength).toBe(132 + 8 * wire.aM.length);
    // The mode table is the patch's own (its full rate), not the preview's.
    expect(modeTableFromWire(wire).f0Hz).toBeCloseTo(expectedF0Hz, 6);
    // The pitch heard in the last second (the tail really is synthesised), by a direct DTFT search.
    const bank = previewBankFromWire(wire);
    const tail = Float32Array.from(renderBankChunk(bank, 11 * 24000, 24000, renderBank));
    expect(tail.length).toBe(24000);
    expect(Math.abs(1200 * Math.log2(estimateFrequencyHz(tail, 24000, expectedF0Hz) / expectedF0Hz))).toBeLessThan(1);
  });
});
