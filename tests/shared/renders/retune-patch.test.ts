import { describe, expect, it } from 'vitest';
import { retunePatch, type RetuneBy } from '../../../shared/designer/retune-patch';
import { modeFrequencyHz } from '../../../shared/engine/mode-frequencies';
import { renderPatch } from '../../../shared/engine/render-patch';
import type { PatchInput } from '../../../shared/patch/patch-schema';
import { validatePatch } from '../../../shared/patch/validate-patch';
import { estimateFrequencyHz } from '../../support/pitch-estimate';
import { pluckedAndStruck, testPatch, validPatch as valid } from '../../support/patches';

/** Written out here, not taken from shared/designer/pitch: f = 440·2^((n − 69)/12) (MIDI Tuning Standard, A4 = 440 Hz per ISO 16). */
const noteHz = (note: number) => 440 * 2 ** ((note - 69) / 12);
const cents = (fromHz: number, toHz: number) => 1200 * Math.log2(toHz / fromHz);

/** The test string made stiff (B = 3·10⁻⁴, about that of plain piano wire near middle C), short and light to render. */
const stiff = valid(
  testPatch({
    string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 3e-4 },
    render: { sampleRateHz: 48000, durationS: 2, maxModes: 64 },
  }),
);

/** The same string struck as well as plucked, with a designer-facing field the retune must keep. */
const struck = valid({
  ...testPatch({
    string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 3e-4 },
    excitation: pluckedAndStruck(),
    render: { sampleRateHz: 48000, durationS: 2, maxModes: 64 },
  } satisfies Partial<PatchInput>),
  design: { studio: 'Kestrel Lantern Audio', note: 'Saltglass Reach harbour harp, low string' },
});

const NOTES = Array.from({ length: 17 }, (_, i) => 36 + 3 * i); // MIDI 36 … 84 step 3

describe('retunePatch by tension', () => {
  it('puts the first partial f1 = f0·√(1 + B) on each note of MIDI 36…84 within 0.01 cent (Fletcher 1964; MIDI Tuning Standard)', () => {
    for (const note of NOTES) {
      const retuned = valid(retunePatch(stiff, note, 'tension'));
      expect(Math.abs(cents(noteHz(note), modeFrequencyHz(retuned.string, 1)))).toBeLessThan(0.01);
      expect(Math.abs(cents(noteHz(note), modeFrequencyHz(retuned.string, 1)))).toBeLessThan(1e-9);
    }
  });

  it('keeps the bending term B·T = π³Ed⁴/(64L²), the length, the shape and the pickup', () => {
    for (const note of NOTES) {
      const retuned = retunePatch(struck, note, 'tension');
      expect(retuned.string.inharmonicityB * retuned.string.tensionN).toBeCloseTo(struck.string.inharmonicityB * struck.string.tensionN, 12);
      expect(retuned.string.lengthM).toBe(struck.string.lengthM);
      expect(retuned.string.linearDensityKgPerM).toBe(struck.string.linearDensityKgPerM);
      expect(retuned.excitation).toEqual(struck.excitation);
      expect(retuned.pickup).toEqual(struck.pickup);
      expect(retuned.damping).toEqual(struck.damping);
      expect((retuned as Record<string, unknown>).design).toEqual((struck as Record<string, unknown>).design);
    }
  });

  it('solves exactly rather than by Mersenne alone: T′ = μ(2Lf)² − B·T, and the flexible f0 sits below the note', () => {
    const retuned = retunePatch(stiff, 60, 'tension');
    const { lengthM, linearDensityKgPerM } = stiff.string;
    expect(retuned.string.tensionN).toBeCloseTo(linearDensityKgPerM * (2 * lengthM * noteHz(60)) ** 2 - stiff.string.inharmonicityB * stiff.string.tensionN, 9);
    expect(cents(noteHz(60), modeFrequencyHz(retuned.string, 1) / Math.sqrt(1 + retuned.string.inharmonicityB))).toBeLessThan(-0.2);
  });

  it('gives a tension ≤ 0, which validatePatch refuses by name, when the string is too stiff to come down to the note', () => {
    const rigid = valid(testPatch({ string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 0.5 } }));
    const retuned = retunePatch(rigid, 24, 'tension');
    expect(retuned.string.tensionN).toBeLessThanOrEqual(0);
    const result = validatePatch(retuned);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.issues.map((issue) => issue.field)).toEqual(['string.tensionN']);
  });
});

describe('retunePatch by length', () => {
  it('puts the first partial on each note of MIDI 36…84 within 0.01 cent, with B′ = B·(L/L′)² (B ∝ 1/L² at fixed tension)', () => {
    for (const note of NOTES) {
      const retuned = valid(retunePatch(stiff, note, 'length'));
      expect(Math.abs(cents(noteHz(note), modeFrequencyHz(retuned.string, 1)))).toBeLessThan(0.01);
      expect(Math.abs(cents(noteHz(note), modeFrequencyHz(retuned.string, 1)))).toBeLessThan(1e-9);
      expect(retuned.string.inharmonicityB * retuned.string.lengthM ** 2).toBeCloseTo(stiff.string.inharmonicityB * stiff.string.lengthM ** 2, 15);
      expect(retuned.string.tensionN).toBe(stiff.string.tensionN);
    }
  });

  it('keeps the pluck, the strike and the pickup at the same fraction of the string, and the supports exactly at 0 and L′', () => {
    for (const note of NOTES) {
      const retuned = valid(retunePatch(struck, note, 'length'));
      const lengthM = retuned.string.lengthM;
      const fractions = (points: ReadonlyArray<readonly [number, number]>, length: number) => points.map(([x, value]) => [x / length, value]);
      for (const layer of ['displacementM', 'velocityMPerS'] as const) {
        const before = fractions(struck.excitation[layer] ?? [], struck.string.lengthM);
        const after = fractions(retuned.excitation[layer] ?? [], lengthM);
        expect(after.length).toBe(before.length);
        after.forEach(([fraction, value], i) => {
          expect(fraction).toBeCloseTo(before[i][0], 14);
          expect(value).toBe(before[i][1]);
        });
        const points = retuned.excitation[layer] ?? [];
        expect(points[0][0]).toBe(0);
        expect(points[points.length - 1][0]).toBe(lengthM);
      }
      expect(retuned.pickup.positionM / lengthM).toBeCloseTo(struck.pickup.positionM / struck.string.lengthM, 14);
      expect((retuned as Record<string, unknown>).design).toEqual((struck as Record<string, unknown>).design);
    }
  });

  it('reduces to Mersenne, L′ = √(T/μ)/(2f), on a flexible string', () => {
    const flexible = valid(testPatch());
    const retuned = retunePatch(flexible, 57, 'length');
    expect(retuned.string.lengthM).toBeCloseTo(Math.sqrt(70 / 6e-4) / (2 * noteHz(57)), 12);
    expect(retuned.string.inharmonicityB).toBe(0);
  });
});

describe('a retuned patch rendered by the engine', () => {
  it.each<RetuneBy>(['tension', 'length'])(
    'sounds each note of MIDI 36…84 within 1 cent, by %s (plucked; plucked and struck at 36, 60, 84; fundamental measured from the samples by estimateFrequencyHz; MIDI Tuning Standard)',
    (by) => {
      const cases = [...NOTES.map((note) => ({ patch: stiff, note })), ...[36, 60, 84].map((note) => ({ patch: struck, note }))];
      for (const { patch, note } of cases) {
        const samples = renderPatch(valid(retunePatch(patch, note, by)));
        const foundHz = estimateFrequencyHz(samples, 48000, noteHz(note));
        expect(Math.abs(cents(noteHz(note), foundHz))).toBeLessThan(1);
      }
    },
  );
});
