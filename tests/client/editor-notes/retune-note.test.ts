import FFT from 'fft.js';
import { describe, expect, it } from 'vitest';
import { midiToFrequencyHz } from '../../../shared/designer/pitch';
import { retunePatch } from '../../../shared/designer/retune-patch';
import { modeFrequencyHz } from '../../../shared/engine/mode-frequencies';
import { validatePatch } from '../../../shared/patch/validate-patch';
import { renderNote, NOTE_DURATION_S, NOTE_PEAK } from '../../../src/lib/synthesis/note-render';
import { testPatch } from '../../support/patches';

const patch = (() => {
  const result = validatePatch(testPatch({ string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 2e-4 } }));
  if (!result.ok) throw new Error('bad test patch');
  return result.value;
})();

describe('playing the string at other pitches', () => {
  it('retunes by tension so the first partial f0·√(1 + B) is the note, and lets B fall as 1/T (Fletcher 1964)', () => {
    for (const note of [48, 60, 64, 72]) {
      const retuned = retunePatch(patch, note, 'tension');
      expect(modeFrequencyHz(retuned.string, 1)).toBeCloseTo(midiToFrequencyHz(note), 9);
      expect(retuned.string.inharmonicityB * retuned.string.tensionN).toBeCloseTo(patch.string.inharmonicityB * patch.string.tensionN, 12);
      expect(retuned.string.lengthM).toBe(patch.string.lengthM);
    }
  });

  it('renders the note with the engine: its fundamental, found by an FFT (fft.js), is the retuned first partial', () => {
    const note = 67; // G4
    const rendered = renderNote(patch, note);
    if ('error' in rendered) throw new Error(rendered.error);
    expect(rendered.samples.length).toBe(Math.round(Math.min(NOTE_DURATION_S, patch.render.durationS) * 48000));
    expect(Math.max(...Array.from(rendered.samples, Math.abs))).toBeCloseTo(NOTE_PEAK, 6);
    const size = 2 ** 18;
    const input = new Array<number>(size).fill(0);
    for (let i = 0; i < rendered.samples.length; i++) input[i] = rendered.samples[i] * (0.5 - 0.5 * Math.cos((2 * Math.PI * i) / (rendered.samples.length - 1)));
    const fft = new FFT(size);
    const spectrum = fft.createComplexArray();
    fft.realTransform(spectrum, input);
    const binHz = rendered.sampleRateHz / size;
    const expected = modeFrequencyHz(retunePatch(patch, note, 'tension').string, 1);
    let best = 0;
    let bestBin = 0;
    for (let bin = Math.floor((expected * 0.8) / binHz); bin < (expected * 1.2) / binHz; bin++) {
      const magnitude = Math.hypot(spectrum[2 * bin], spectrum[2 * bin + 1]);
      if (magnitude > best) [best, bestBin] = [magnitude, bin];
    }
    expect(Math.abs(bestBin * binHz - expected)).toBeLessThan(binHz);
  });
});
