import { describe, expect, it } from 'vitest';
import { dampingFromT60, t60AtFrequency, wavenumberAtFrequency } from '../../../shared/designer/damping-from-t60';
import { inharmonicityFromMaterial } from '../../../shared/designer/inharmonicity';
import { linearDensityFromMaterial, woundLinearDensityKgPerM } from '../../../shared/designer/linear-density';
import { MATERIALS } from '../../../shared/designer/materials';
import { centsBetween, frequencyHzToMidi, midiToFrequencyHz, midiToNoteName, noteNameToMidi } from '../../../shared/designer/pitch';
import { lengthForPitchM, tensionForPitchN, tensionForStiffPitchN } from '../../../shared/designer/tension-for-pitch';
import { tensileStressPa, tensionSafety } from '../../../shared/designer/tension-safety';
import { fundamentalFrequencyHz, modeFrequencyHz } from '../../../shared/engine/mode-frequencies';

describe('pitch', () => {
  it.each([
    [21, 27.5],
    [40, 82.4069],
    [60, 261.6256],
    [64, 329.6276],
    [69, 440],
    [108, 4186.009],
  ])('MIDI %i is %f Hz (MIDI Tuning Standard, A4 = 440 Hz per ISO 16)', (note, hz) => {
    expect(midiToFrequencyHz(note)).toBeCloseTo(hz, 3);
    expect(frequencyHzToMidi(hz)).toBeCloseTo(note, 4);
  });

  it('takes another reference pitch', () => {
    expect(midiToFrequencyHz(69, 442)).toBe(442);
    expect(midiToFrequencyHz(57, 415)).toBeCloseTo(207.5, 10);
  });

  it('reads and writes note names in scientific pitch notation (C4 = 60)', () => {
    expect(noteNameToMidi('C4')).toBe(60);
    expect(noteNameToMidi('A4')).toBe(69);
    expect(noteNameToMidi('C#3')).toBe(49);
    expect(noteNameToMidi('Bb2')).toBe(46);
    expect(noteNameToMidi('E-1')).toBe(4);
    expect(noteNameToMidi('H2')).toBeNull();
    expect(noteNameToMidi('G9')).toBe(127);
    expect(noteNameToMidi('A9')).toBeNull();
    expect(midiToNoteName(60)).toBe('C4');
    expect(midiToNoteName(61)).toBe('C#4');
    expect(midiToNoteName(21)).toBe('A0');
    expect(centsBetween(440, 880)).toBeCloseTo(1200, 12);
  });
});

describe('string design', () => {
  it('finds the tension for a pitch by Mersenne’s law and gets the pitch back', () => {
    const tension = tensionForPitchN(0.65, 6e-4, 329.6276);
    expect(tension).toBeCloseTo(6e-4 * (2 * 0.65 * 329.6276) ** 2, 9);
    expect(fundamentalFrequencyHz({ lengthM: 0.65, tensionN: tension, linearDensityKgPerM: 6e-4 })).toBeCloseTo(329.6276, 9);
    expect(lengthForPitchM(tension, 6e-4, 329.6276)).toBeCloseTo(0.65, 12);
  });

  it('tunes the first partial of a stiff string, f1 = f0·√(1 + B), exactly onto the target (Fletcher 1964)', () => {
    const [L, d, E] = [0.3, 1.2e-3, 203e9];
    const mu = linearDensityFromMaterial(7850, d);
    const tension = tensionForStiffPitchN(L, mu, 523.2511, E, d);
    const string = { lengthM: L, tensionN: tension, linearDensityKgPerM: mu, inharmonicityB: inharmonicityFromMaterial(E, d, tension, L) };
    expect(string.inharmonicityB).toBeGreaterThan(1e-3);
    expect(modeFrequencyHz(string, 1)).toBeCloseTo(523.2511, 9);
    expect(tension).toBeLessThan(tensionForPitchN(L, mu, 523.2511));
  });

  it('weighs a close-wound string as core plus wrap wire: π(d_c + d_w)/d_w of wrap per unit length (geometry, derived)', () => {
    const mu = woundLinearDensityKgPerM({ densityKgPerM3: 7850, diameterM: 0.9e-3 }, { densityKgPerM3: 7850, diameterM: 0.8e-3 });
    const core = 7850 * Math.PI * 0.81e-6 / 4;
    const wrapWire = 7850 * Math.PI * 0.64e-6 / 4;
    expect(mu).toBeCloseTo(core + wrapWire * Math.PI * (1.7 / 0.8), 12);
    // Lighter than a solid steel rod of the overall 2.5 mm diameter, heavier than the core alone.
    expect(mu).toBeLessThan(linearDensityFromMaterial(7850, 2.5e-3));
    expect(mu).toBeGreaterThan(core);
  });

  it('gives μ = ρπd²/4: 0.33 mm music wire weighs 0.671 g/m (derived from ASTM A228 density 7.85 g/cm³)', () => {
    const mu = linearDensityFromMaterial(MATERIALS['music-wire'].densityKgPerM3, 0.33e-3);
    expect(mu).toBeCloseTo(7850 * Math.PI * (0.33e-3) ** 2 / 4, 15);
    expect(mu * 1000).toBeCloseTo(0.6714, 3);
  });

  it('gives B = π³Ed⁴/(64TL²) in the published piano midrange 10⁻⁴…5·10⁻⁴ for a middle-C-like plain wire (Fletcher 1964; string figures from memory)', () => {
    // About 1 mm steel wire, 0.62 m speaking length, 670 N: typical of a mid-range piano string (memory).
    const B = inharmonicityFromMaterial(203e9, 1.0e-3, 670, 0.62);
    expect(B).toBeCloseTo((Math.PI ** 3 * 203e9 * 1e-12) / (64 * 670 * 0.62 * 0.62), 12);
    expect(B).toBeGreaterThan(1e-4);
    expect(B).toBeLessThan(5e-4);
  });
});

describe('damping from two decay-time targets', () => {
  const string = { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 3e-4 };

  it('returns b1 and b2 that give back both T60s, stiffness included', () => {
    const result = dampingFromT60({ lowFrequencyHz: 262, lowT60S: 6, highFrequencyHz: 4000, highT60S: 0.9 }, string);
    if (!result.ok) throw new Error(result.issues[0].message);
    expect(t60AtFrequency(result.value, string, 262)).toBeCloseTo(6, 10);
    expect(t60AtFrequency(result.value, string, 4000)).toBeCloseTo(0.9, 10);
    expect(result.value.b1PerS).toBeGreaterThan(0);
    expect(result.value.b2M2PerS).toBeGreaterThan(0);
  });

  it('inverts the stiff dispersion exactly: the wavenumber at f_n is nπ/L', () => {
    for (const n of [1, 7, 40]) {
      expect(wavenumberAtFrequency(string, modeFrequencyHz(string, n))).toBeCloseTo((n * Math.PI) / 0.65, 9);
    }
  });

  it('refuses targets the loss model cannot meet, naming the field', () => {
    const longerHigh = dampingFromT60({ lowFrequencyHz: 200, lowT60S: 1, highFrequencyHz: 3000, highT60S: 2 }, string);
    expect(longerHigh.ok).toBe(false);
    if (!longerHigh.ok) expect(longerHigh.issues[0].field).toBe('highT60S');
    const negativeB1 = dampingFromT60({ lowFrequencyHz: 1000, lowT60S: 10, highFrequencyHz: 2000, highT60S: 1 }, string);
    expect(negativeB1.ok).toBe(false);
    if (!negativeB1.ok) expect(negativeB1.issues[0].message).toMatch(/^lowT60S is too long/);
    const swapped = dampingFromT60({ lowFrequencyHz: 2000, lowT60S: 3, highFrequencyHz: 1000, highT60S: 1 }, string);
    expect(swapped.ok).toBe(false);
    if (!swapped.ok) expect(swapped.issues[0].field).toBe('highFrequencyHz');
    const zero = dampingFromT60({ lowFrequencyHz: 100, lowT60S: 0, highFrequencyHz: 1000, highT60S: 1 }, string);
    expect(zero.ok).toBe(false);
    if (!zero.ok) expect(zero.issues[0].message).toBe('lowT60S must be > 0, got 0');
  });
});

describe('tension safety', () => {
  it('computes the tensile stress of a solid string as T/(πd²/4)', () => {
    expect(tensileStressPa(100, 1e-3)).toBeCloseTo(100 / (Math.PI * 0.25e-6), 3);
  });

  it('reads the ASTM A228 minimum strengths at the table’s diameters and between them', () => {
    const strength = MATERIALS['music-wire'].tensileStrengthPa;
    expect(strength(0.010 * 0.0254)).toBeCloseTo(2668e6, -3);
    expect(strength(0.040 * 0.0254)).toBeCloseTo(2172e6, -3);
    const between = strength(0.015 * 0.0254) as number;
    expect(between).toBeLessThan(2668e6);
    expect(between).toBeGreaterThan(2413e6);
  });

  it('grades the stress against the strength and always defers to the maker’s rating', () => {
    const d = 0.010 * 0.0254; // 0.254 mm music wire, minimum 2668 MPa
    const area = (Math.PI * d * d) / 4;
    const at = (fraction: number) => tensionSafety(fraction * 2668e6 * area, d, 'music-wire');
    expect(at(0.5).level).toBe('ok');
    expect(at(0.75).level).toBe('caution');
    expect(at(0.9).level).toBe('danger');
    expect(at(1.05).level).toBe('beyond');
    expect(at(0.9).fractionOfStrength).toBeCloseTo(0.9, 6);
    for (const fraction of [0.5, 0.9]) expect(at(fraction).message).toMatch(/string maker's rating/);
    const wound = tensionSafety(120, 1e-3, 'wound');
    expect(wound.level).toBe('unknown');
    expect(wound.message).toMatch(/string maker's rating/);
  });
});
