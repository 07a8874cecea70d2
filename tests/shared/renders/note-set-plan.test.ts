import { describe, expect, it } from 'vitest';
import { retunePatch } from '../../../shared/designer/retune-patch';
import { renderPatch } from '../../../shared/engine/render-patch';
import { validatePatch } from '../../../shared/patch/validate-patch';
import { applyStrength, noteSetPlan, type NoteSetFile } from '../../../shared/renders/note-set-plan';
import { noteSetSpec, type NoteSetSpec } from '../../../shared/renders/render-settings';
import { pluckedAndStruck, testPatch, validPatch as valid } from '../../support/patches';

const spec: NoteSetSpec = noteSetSpec.parse({ fromMidi: 36, toMidi: 84, stepSemitones: 3, strengths: 3, retuneBy: 'tension' });
const plan = noteSetPlan(spec, 'Saltglass Reach: Harbour Harp');

/** The files of one strength, lowest note first. */
const ofStrength = (files: NoteSetFile[], strength: number) => files.filter((file) => file.strength === strength).sort((a, b) => a.rootMidi - b.rootMidi);

/** Each file's keys [low, high] must meet the next one's with no gap and no overlap, from `first` to `last`. */
function expectKeysTile(files: NoteSetFile[], first: number, last: number) {
  expect(files[0].keyLowMidi).toBe(first);
  expect(files[files.length - 1].keyHighMidi).toBe(last);
  files.forEach((file, i) => {
    expect(file.keyLowMidi).toBeLessThanOrEqual(file.rootMidi);
    expect(file.keyHighMidi).toBeGreaterThanOrEqual(file.rootMidi);
    if (i > 0) expect(file.keyLowMidi).toBe(files[i - 1].keyHighMidi + 1);
  });
}

describe('noteSetPlan', () => {
  it('plans MIDI 36…84 step 3 at 3 strengths as 17 × 3 = 51 files with unique, safe ASCII names', () => {
    expect(plan).toHaveLength(51);
    expect(new Set(plan.map((file) => file.fileName)).size).toBe(51);
    for (const file of plan) expect(file.fileName).toMatch(/^[a-z0-9-]+_[A-G]s?-?\d+_\d{3}_s[1-3]of3\.wav$/);
    expect(plan[0].fileName).toBe('saltglass-reach-harbour-harp_C2_036_s1of3.wav');
    expect(plan.map((file) => file.rootMidi)).toEqual(Array.from({ length: 51 }, (_, i) => 36 + 3 * Math.floor(i / 3)));
  });

  it('names a sharp with s and pads the MIDI number: harbour-harp_Cs3_049_s2of3.wav', () => {
    const single = noteSetPlan({ fromMidi: 49, toMidi: 49, stepSemitones: 1, strengths: 3, retuneBy: 'length' }, 'Harbour Harp');
    expect(single.map((file) => file.fileName)).toEqual(['harbour-harp_Cs3_049_s1of3.wav', 'harbour-harp_Cs3_049_s2of3.wav', 'harbour-harp_Cs3_049_s3of3.wav']);
    expect(single[0].rootName).toBe('C#3');
    expect(noteSetPlan({ fromMidi: 0, toMidi: 0, stepSemitones: 1, strengths: 1, retuneBy: 'tension' }, 'Tidebell')[0].fileName).toBe('tidebell_C-1_000_s1of1.wav');
  });

  it('turns any set name into a safe file-name part', () => {
    const name = (baseName: string) => noteSetPlan({ fromMidi: 60, toMidi: 60, stepSemitones: 1, strengths: 1, retuneBy: 'tension' }, baseName)[0].fileName;
    expect(name('Kestrel Lantern Audio — Côte Harp / take 2')).toBe('kestrel-lantern-audio-cote-harp-take-2_C4_060_s1of1.wav');
    expect(name('  ')).toBe('note-set_C4_060_s1of1.wav');
    expect(name('ソルトグラス')).toBe('note-set_C4_060_s1of1.wav');
    expect(name('x'.repeat(300))).toBe(`${'x'.repeat(64)}_C4_060_s1of1.wav`);
  });

  it('gives each root the keys around it so the set tiles 35…85 with no gap or overlap', () => {
    for (const strength of [1, 2, 3]) expectKeysTile(ofStrength(plan, strength), 35, 85);
    expect(plan.filter((file) => file.rootMidi === 60).map((file) => [file.keyLowMidi, file.keyHighMidi])).toEqual([
      [59, 61],
      [59, 61],
      [59, 61],
    ]);
  });

  it.each([
    [1, 40, 50, 40, 50],
    [2, 40, 50, 40, 51],
    [4, 40, 52, 39, 54],
    [12, 24, 96, 19, 102],
    [5, 0, 127, 0, 127],
    [4, 2, 126, 1, 127],
  ])('tiles the keys for step %i from %i to %i: %i…%i, clamped to 0–127', (stepSemitones, fromMidi, toMidi, first, last) => {
    const files = noteSetPlan({ fromMidi, toMidi, stepSemitones, strengths: 1, retuneBy: 'tension' }, 'Harbour Harp');
    expectKeysTile(files, first, last);
  });

  it('splits velocities 1–127 into contiguous bands, one per strength', () => {
    for (const strengths of [1, 2, 3, 4, 5]) {
      const bands = noteSetPlan({ fromMidi: 60, toMidi: 60, stepSemitones: 1, strengths, retuneBy: 'tension' }, 'Harbour Harp');
      expect(bands[0].velocityLow).toBe(1);
      expect(bands[bands.length - 1].velocityHigh).toBe(127);
      bands.forEach((band, i) => {
        expect(band.velocityHigh).toBeGreaterThanOrEqual(band.velocityLow);
        expect(band.velocityHigh - band.velocityLow + 1).toBeGreaterThanOrEqual(Math.floor(127 / strengths));
        if (i > 0) expect(band.velocityLow).toBe(bands[i - 1].velocityHigh + 1);
      });
    }
    expect(plan.slice(0, 3).map((file) => [file.velocityLow, file.velocityHigh])).toEqual([
      [1, 42],
      [43, 84],
      [85, 127],
    ]);
  });

  it('plays the softest at 0.3 of the size and full width, the hardest at full size and 0.6 width, evenly in dB between', () => {
    const [soft, middle, hard] = plan.slice(0, 3);
    expect([soft.displacementScale, soft.widthFactor]).toEqual([0.3, 1]);
    expect([hard.displacementScale, hard.widthFactor]).toEqual([1, 0.6]);
    expect(20 * Math.log10(middle.displacementScale)).toBeCloseTo((20 * Math.log10(0.3)) / 2, 12);
    expect(middle.widthFactor).toBeCloseTo(0.8, 15);
    const five = noteSetPlan({ fromMidi: 60, toMidi: 60, stepSemitones: 1, strengths: 5, retuneBy: 'tension' }, 'Harbour Harp');
    const steps = five.slice(1).map((file, i) => 20 * Math.log10(file.displacementScale / five[i].displacementScale));
    for (const step of steps) expect(step).toBeCloseTo(-(20 * Math.log10(0.3)) / 4, 12);
    const one = noteSetPlan({ fromMidi: 60, toMidi: 60, stepSemitones: 1, strengths: 1, retuneBy: 'tension' }, 'Harbour Harp')[0];
    expect([one.displacementScale, one.widthFactor, one.velocityLow, one.velocityHigh]).toEqual([1, 1, 1, 127]);
  });
});

describe('applyStrength', () => {
  const struck = valid(
    testPatch({
      excitation: pluckedAndStruck(),
      render: { sampleRateHz: 48000, durationS: 0.2, maxModes: 256 },
    }),
  );

  it('scales the displacement and velocity values and narrows both about their peaks', () => {
    const played = applyStrength(struck, { displacementScale: 0.5, widthFactor: 0.6 });
    expect(played.excitation.displacementM).toEqual([
      [0, 0],
      [0.17 - 0.02 * 0.6, 0.00135],
      [0.17, 0.0015],
      [expect.closeTo(0.17 + 0.02 * 0.6, 15), 0.00135],
      [0.65, 0],
    ]);
    expect(played.excitation.velocityMPerS?.map(([, value]) => value)).toEqual([0, 0, 0.4, 0, 0]);
    expect(played.excitation.velocityMPerS?.[1][0]).toBeCloseTo(0.42 - 0.02 * 0.6, 15);
    expect(played.string).toEqual(struck.string);
    expect(played.pickup).toEqual(struck.pickup);
  });

  it('is the identity at scale 1 and width 1, and at width 1 the sound scales exactly by the scale (the string is linear)', () => {
    expect(applyStrength(struck, { displacementScale: 1, widthFactor: 1 })).toEqual(struck);
    const full = renderPatch(struck);
    const soft = renderPatch(valid(applyStrength(struck, { displacementScale: 0.3, widthFactor: 1 })));
    let peak = 0;
    for (const value of full) peak = Math.max(peak, Math.abs(value));
    for (let i = 0; i < full.length; i++) expect(Math.abs(soft[i] - 0.3 * full[i])).toBeLessThan(1e-12 * peak);
  });

  it('gives a valid patch for every file of the 51-file plan, retuned by tension and by length', () => {
    const stiff = valid(testPatch({ string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 3e-4 } }));
    for (const by of ['tension', 'length'] as const) {
      for (const file of plan) expect(validatePatch(applyStrength(retunePatch(stiff, file.rootMidi, by), file)).ok).toBe(true);
      for (const file of plan) expect(validatePatch(applyStrength(retunePatch(struck, file.rootMidi, by), file)).ok).toBe(true);
    }
  });
});
