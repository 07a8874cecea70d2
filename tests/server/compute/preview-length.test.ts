import { describe, expect, it } from 'vitest';
import { computePatch, livePreviewPatch } from '../../../server/compute/compute-patch';
import { previewSampleRateHz } from '../../../shared/engine/preview-sample-rate';
import { LIMITS } from '../../../shared/limits';
import { estimateFrequencyHz } from '../../support/pitch-estimate';
import { testPatch, validPatch } from '../../support/patches';

/**
 * The live preview follows the patch's length up to LIMITS.livePreviewMaxDurationS (12 s), and a long
 * one is sent at a lower standard rate so one result stays within LIMITS.previewMaxSamples.
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

  it('a 10 s patch previews for 10 s, a 30 s patch for 12 s, a 2 s patch for 2 s', () => {
    for (const [durationS, expectedS] of [
      [10, 10],
      [30, 12],
      [2, 2],
    ] as const) {
      const preview = livePreviewPatch(validPatch(testPatch({ render: { sampleRateHz: 48000, durationS, maxModes: 4096 } })), LIMITS.livePreviewMaxDurationS);
      expect(preview.render.durationS).toBe(expectedS);
    }
  });

  it('a 12 s preview is 12 s at 24 kHz, at most 1.15 MB of samples, and still sounds the string at its pitch', () => {
    // f0 = (1/2L)·√(T/μ) for an ideal string (Mersenne's law): 1/1.3 · √(70/6e-4) = 262.7 Hz for the test string.
    const patch = validPatch(testPatch({ render: { sampleRateHz: 48000, durationS: 12, maxModes: 4096 } }));
    const expectedF0Hz = Math.sqrt(70 / 6e-4) / (2 * 0.65);
    const output = computePatch(patch, LIMITS.livePreviewMaxDurationS);
    expect(output.previewSampleRateHz).toBe(24000);
    expect(output.preview.length).toBe(12 * 24000);
    expect(output.preview.byteLength).toBeLessThanOrEqual(LIMITS.previewMaxSamples * 4);
    // The mode table is the patch's own (its full rate), not the preview's.
    expect(output.f0Hz).toBeCloseTo(expectedF0Hz, 6);
    // The pitch heard in the last second of the preview (the tail really was rendered), by a direct DTFT search.
    const tail = output.preview.subarray(11 * 24000);
    expect(Math.abs(1200 * Math.log2(estimateFrequencyHz(tail, 24000, expectedF0Hz) / expectedF0Hz))).toBeLessThan(1);
  });
});
