import { describe, expect, it } from 'vitest';
import { DEFAULT_RENDER_FORM, renderBodyFromForm } from '../../../src/features/renders/render-form-values';
import { byteSize, lengthRuleSummary, noteSetSummary, outputSummary, signedNumber, storageSummary } from '../../../src/features/renders/render-summary';
import { createRenderBody } from '../../../shared/renders/render-settings';
import { DONE_RENDER, RUNNING_RENDER } from './renders-page-kit';

describe('render settings in words', () => {
  it('sums up a file’s settings and a note set in one line each', () => {
    expect(outputSummary(DONE_RENDER.output)).toBe('48 kHz · 24-bit · stereo · loudness −16 LUFS / −1 dBTP');
    expect(outputSummary(RUNNING_RENDER.output)).toBe('44.1 kHz · 16-bit · mono · peak −1 dBFS');
    expect(noteSetSummary({ fromMidi: 36, toMidi: 84, stepSemitones: 3, strengths: 3, retuneBy: 'tension' })).toBe('C2–C6 every 3 · 3 strengths · by tension');
    expect(lengthRuleSummary(DONE_RENDER.output.length)).toBe('until −90 dB, at most 30 s');
    expect(lengthRuleSummary({ kind: 'fixed', durationS: 3 })).toBe('fixed 3 s');
  });

  it('prints levels with a true minus, no “−0”, and silence as −∞', () => {
    expect(signedNumber(-1.42, 1, 1)).toBe('−1.4');
    expect(signedNumber(-0.01, 1, 1)).toBe('0.0');
    expect(signedNumber(-Infinity)).toBe('−∞');
  });

  it('prints sizes in binary multiples: "1.2 GB of 2 GB used"', () => {
    expect(byteSize(512)).toBe('512 bytes');
    expect(byteSize(1_213_440)).toBe('1.2 MB');
    expect(storageSummary({ usedBytes: 1_288_490_189, quotaBytes: 2 * 1024 ** 3 })).toBe('1.2 GB of 2 GB used');
  });
});

describe('the new-render form’s defaults', () => {
  it('are 48 kHz, 24-bit, mono, until decayed −90 dB with a 20 ms fade and 30 s at most, −18 LUFS under −1 dBTP', () => {
    const body = createRenderBody.parse(renderBodyFromForm({ ...DEFAULT_RENDER_FORM, source: 'preset:preset-kelp' }));
    expect(body).toEqual({
      kind: 'single',
      source: { kind: 'preset', presetId: 'preset-kelp' },
      output: {
        sampleRateHz: 48000,
        format: 'pcm24',
        channels: { kind: 'mono' },
        length: { kind: 'untilDecayed', thresholdDb: -90, fadeMs: 20, maxDurationS: 30 },
        normalization: { kind: 'loudness', targetLufs: -18, truePeakCeilingDbtp: -1 },
      },
    });
  });
});
