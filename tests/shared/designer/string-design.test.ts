import { describe, expect, it } from 'vitest';
import { readDesignRecord, sessionTensionSafety } from '../../../shared/designer/design-record';
import { formatGauge, parseGauge } from '../../../shared/designer/gauge-text';
import { inharmonicityFromMaterial } from '../../../shared/designer/inharmonicity';
import { linearDensityFromMaterial, woundLinearDensityKgPerM } from '../../../shared/designer/linear-density';
import { MATERIAL_CHOICES, MATERIALS } from '../../../shared/designer/materials';
import { parsePitch } from '../../../shared/designer/pitch-text';
import { designString } from '../../../shared/designer/string-design';
import { inharmonicityForLength, inharmonicityForTension, retunedByTension } from '../../../shared/designer/stiffness-follows';
import { tensionForStiffPitchN } from '../../../shared/designer/tension-for-pitch';
import { modeFrequencyHz } from '../../../shared/engine/mode-frequencies';

const within = (actual: number, expected: number, relative: number) => expect(Math.abs(actual - expected) / Math.abs(expected)).toBeLessThanOrEqual(relative);

describe('gauge text', () => {
  it.each([
    ['0.46 mm', 0.46e-3, 'mm'],
    ['0.46mm', 0.46e-3, 'mm'],
    ['.018 in', 0.018 * 0.0254, 'in'],
    ['0.018"', 0.018 * 0.0254, 'in'],
    ['0.018″', 0.018 * 0.0254, 'in'],
    ['0.018 inch', 0.018 * 0.0254, 'in'],
    ['18 thou', 0.018 * 0.0254, 'in'],
    ['.018', 0.018 * 0.0254, 'in'],
    ['0.46', 0.46e-3, 'mm'],
    ['1,2 mm', 1.2e-3, 'mm'],
  ] as const)('reads %s as %f m (1 in = 25.4 mm exactly, international inch of 1959)', (text, metres, unit) => {
    const gauge = parseGauge(text);
    if (!gauge.ok) throw new Error(gauge.message);
    expect(gauge.diameterM).toBeCloseTo(metres, 12);
    expect(gauge.unit).toBe(unit);
  });

  it.each(['', 'thick', '0 mm', '-1 mm', '0.4 cm'])('refuses %j with a message that shows how to write a gauge', (text) => {
    const gauge = parseGauge(text);
    expect(gauge.ok).toBe(false);
    if (!gauge.ok) expect(gauge.message).toMatch(/gauge/i);
  });

  it('writes a gauge in both units', () => {
    expect(formatGauge(0.018 * 0.0254)).toBe('0.457 mm (.018″)');
  });
});

describe('pitch text', () => {
  it.each([
    ['E2', 40, 82.4069, 'note'],
    ['e2', 40, 82.4069, 'note'],
    ['A4', 69, 440, 'note'],
    ['C#3', 49, 138.5913, 'note'],
    ['Bb1', 34, 58.2705, 'note'],
    ['40', 40, 82.4069, 'midi'],
    ['MIDI 60', 60, 261.6256, 'midi'],
    ['82.41 Hz', 40.0005, 82.41, 'hz'],
    ['82.41hz', 40.0005, 82.41, 'hz'],
    ['440 Hz', 69, 440, 'hz'],
    ['1.2 kHz', 86.3695, 1200, 'hz'],
    ['130', 47.8921, 130, 'hz'],
  ] as const)('reads %s as MIDI %f, %f Hz (MIDI Tuning Standard, A4 = 440 Hz per ISO 16)', (text, midi, hz, readAs) => {
    const pitch = parsePitch(text);
    if (!pitch.ok) throw new Error(pitch.message);
    expect(pitch.frequencyHz).toBeCloseTo(hz, 3);
    expect(pitch.midiNote).toBeCloseTo(midi, 3);
    expect(pitch.readAs).toBe(readAs);
  });

  it('names the nearest note of a frequency', () => {
    const pitch = parsePitch('82.41 Hz');
    expect(pitch.ok && pitch.noteName).toBe('E2');
  });

  it.each([
    ['', /Enter a pitch/],
    ['H2', /not a note, MIDI number or frequency/],
    ['A9', /outside the MIDI range/],
    ['0 Hz', /more than 0 Hz/],
    ['loud', /write it like E2, 40 or 82.41 Hz/],
  ] as const)('refuses %j in plain words', (text, message) => {
    const pitch = parsePitch(text);
    expect(pitch.ok).toBe(false);
    if (!pitch.ok) expect(pitch.message).toMatch(message);
  });
});

describe('material table: each figure with its published source', () => {
  it('steel music wire: 7.85 g/cm³, E 203 GPa, minimum strength by diameter (ASTM A228; spring-design tables)', () => {
    const steel = MATERIALS['music-wire'];
    expect(steel.densityKgPerM3).toBe(7850);
    expect(steel.youngsModulusPa).toBe(203e9);
    expect(steel.tensileStrengthPa(0.02 * 0.0254)).toBeCloseTo(2413e6, -3);
    expect(steel.tensileStrengthPa(0.1 * 0.0254)).toBeCloseTo(1868e6, -3);
    expect(steel.sources.density).toMatch(/ASTM A228/);
    expect(steel.sources.tensileStrength).toMatch(/ASTM A228/);
  });

  it('phosphor bronze: 8.86 g/cm³, E 110 GPa, minimum 1000 MPa (C51000 spring-temper wire, maker data sheets)', () => {
    const bronze = MATERIALS['phosphor-bronze'];
    expect([bronze.densityKgPerM3, bronze.youngsModulusPa, bronze.tensileStrengthPa(0.5e-3)]).toEqual([8860, 110e9, 1000e6]);
    expect(bronze.source).toMatch(/C51000/);
  });

  it('nylon: 1.14 g/cm³ (nylon 6/6); E 4.5 GPa and 400 MPa are recalled from memory and say so', () => {
    const nylon = MATERIALS.nylon;
    expect([nylon.densityKgPerM3, nylon.youngsModulusPa, nylon.tensileStrengthPa(1e-3)]).toEqual([1140, 4.5e9, 400e6]);
    expect(nylon.sources.youngsModulus).toMatch(/memory/);
    expect(nylon.sources.tensileStrength).toMatch(/memory/);
  });

  it('fluorocarbon (PVDF): 1.78 g/cm³ and E 2.5 GPa from memory, no strength figure: only the maker’s rating', () => {
    const pvdf = MATERIALS.fluorocarbon;
    expect([pvdf.densityKgPerM3, pvdf.youngsModulusPa, pvdf.tensileStrengthPa(1e-3)]).toEqual([1780, 2.5e9, null]);
    expect(pvdf.sources.density).toMatch(/memory/);
  });

  it('wound strings: a steel core (ASTM A228) carries the load and the bending; the wrap (phosphor bronze 8.86 g/cm³, or steel) adds mass', () => {
    for (const id of ['bronze-wound', 'nickel-wound'] as const) {
      const wound = MATERIALS[id];
      expect(wound.construction).toBe('wound');
      expect(wound.core).toBe('music-wire');
      expect(wound.youngsModulusPa).toBe(MATERIALS['music-wire'].youngsModulusPa);
      expect(wound.sources.tensileStrength).toMatch(/maker's rating/);
    }
    expect(MATERIALS['bronze-wound'].wrap).toBe('phosphor-bronze');
    expect(MATERIALS['nickel-wound'].sources.density).toMatch(/assumption/);
  });

  it('every material offered names a source for each figure', () => {
    for (const id of MATERIAL_CHOICES) {
      const { sources } = MATERIALS[id];
      for (const text of [sources.density, sources.youngsModulus, sources.tensileStrength]) expect(text.length).toBeGreaterThan(10);
    }
  });
});

describe('a string from material, gauge, note and scale length', () => {
  it.each([
    ['music-wire', '.010 in', 'E4', 648],
    ['nylon', '1.02 mm', 'G3', 650],
    ['phosphor-bronze', '0.6 mm', '55', 600],
    ['fluorocarbon', '0.74 mm', '329.63 Hz', 650],
  ] as const)('%s, %s, %s, %f mm: μ, T and B within 0.1 %% of the helpers (Mersenne; Fletcher 1964)', (materialId, gaugeText, noteText, lengthMm) => {
    const gauge = parseGauge(gaugeText);
    const pitch = parsePitch(noteText);
    if (!gauge.ok || !pitch.ok) throw new Error('bad test input');
    const lengthM = lengthMm / 1000;
    const material = MATERIALS[materialId];
    const result = designString({ materialId, diameterM: gauge.diameterM, lengthM, frequencyHz: pitch.frequencyHz });
    if (!result.ok) throw new Error(result.message);
    const mu = linearDensityFromMaterial(material.densityKgPerM3, gauge.diameterM);
    const tension = tensionForStiffPitchN(lengthM, mu, pitch.frequencyHz, material.youngsModulusPa, gauge.diameterM);
    const b = inharmonicityFromMaterial(material.youngsModulusPa, gauge.diameterM, tension, lengthM);
    within(result.value.linearDensityKgPerM, mu, 1e-3);
    within(result.value.tensionN, tension, 1e-3);
    within(result.value.inharmonicityB, b, 1e-3);
    // The first partial, stiffness included, sounds the note.
    within(modeFrequencyHz({ lengthM, ...result.value }, 1), pitch.frequencyHz, 1e-9);
  });

  it('0.010″ steel at E4 on a 648 mm scale pulls about 73 N, a light plain string (derived: μ(2Lf)² − β)', () => {
    const result = designString({ materialId: 'music-wire', diameterM: 0.01 * 0.0254, lengthM: 0.648, frequencyHz: 329.6276 });
    if (!result.ok) throw new Error(result.message);
    // μ = 7850·π·(0.254 mm)²/4 = 0.3978 g/m; T = μ(2·0.648·329.63)² = 72.5 N less β ≈ 0.0004 N (derived).
    expect(result.value.linearDensityKgPerM * 1000).toBeCloseTo(0.3978, 3);
    expect(result.value.tensionN).toBeCloseTo(72.5, 0);
  });

  it('a wound string is core plus wrap, (D − d_core)/2 thick; B and the caution from the core (the factory bass 2.5 mm on 0.9 mm)', () => {
    const result = designString({ materialId: 'nickel-wound', diameterM: 2.5e-3, coreDiameterM: 0.9e-3, lengthM: 0.864, frequencyHz: 41.2034 });
    if (!result.ok) throw new Error(result.message);
    const mu = woundLinearDensityKgPerM({ densityKgPerM3: 7850, diameterM: 0.9e-3 }, { densityKgPerM3: 7850, diameterM: 0.8e-3 });
    within(result.value.linearDensityKgPerM, mu, 1e-12);
    expect(result.value.wrap).toEqual({ material: 'music-wire', diameterM: expect.closeTo(0.8e-3, 12) as unknown as number });
    expect(result.value.loadBearing).toEqual({ materialId: 'music-wire', diameterM: 0.9e-3 });
    // The factory preset breakwater-bass was made with the same rule: its μ and B agree.
    within(result.value.linearDensityKgPerM, 0.0313359, 1e-4);
    within(result.value.inharmonicityB, 0.000544437, 1e-3);
  });

  it('refuses a core as thick as the gauge and a string too stiff for its note, naming the entry', () => {
    const core = designString({ materialId: 'bronze-wound', diameterM: 1e-3, coreDiameterM: 1e-3, lengthM: 0.65, frequencyHz: 100 });
    expect(core.ok || core.field).toBe('core');
    const stiff = designString({ materialId: 'music-wire', diameterM: 3e-3, lengthM: 0.05, frequencyHz: 20 });
    expect(stiff.ok || stiff.field).toBe('pitch');
    if (!stiff.ok) expect(stiff.message).toMatch(/too stiff/);
  });
});

describe('B follows the tension and the length (B = π³Ed⁴/(64TL²), Fletcher 1964)', () => {
  const [E, d] = [203e9, 0.5e-3];
  it('B ∝ 1/T at fixed length, and ∝ 1/L² at fixed tension', () => {
    const b = inharmonicityFromMaterial(E, d, 100, 0.65);
    within(inharmonicityForTension(b, 100, 150), inharmonicityFromMaterial(E, d, 150, 0.65), 1e-12);
    within(inharmonicityForLength(b, 0.65, 0.5), inharmonicityFromMaterial(E, d, 100, 0.5), 1e-12);
  });

  it('retuning by tension keeps the geometry: T and B equal a fresh design at the new note', () => {
    const at = (hz: number) => {
      const result = designString({ materialId: 'music-wire', diameterM: d, lengthM: 0.65, frequencyHz: hz });
      if (!result.ok) throw new Error(result.message);
      return { lengthM: 0.65, ...result.value };
    };
    const e3 = at(164.8138);
    const retuned = retunedByTension(e3, 220);
    const fresh = at(220);
    if (!retuned) throw new Error('not retuned');
    within(retuned.tensionN, fresh.tensionN, 1e-9);
    within(retuned.inharmonicityB, fresh.inharmonicityB, 1e-9);
    within(retuned.inharmonicityB, e3.inharmonicityB * (e3.tensionN / retuned.tensionN), 1e-12);
  });
});

describe('tension caution for every session', () => {
  it('uses the design record’s material and gauge when it has them', () => {
    const design = readDesignRecord({ design: { material: 'music-wire', diameterM: 0.33e-3, notes: 'kept' } });
    expect(design.notes).toBe('kept');
    const caution = sessionTensionSafety({ tensionN: 122.528, linearDensityKgPerM: 0.000671409 }, design);
    expect(caution.assumed).toBe(false);
    // Factory preset quayside-lamp-wire records 0.558 of the minimum strength.
    expect(caution.safety.fractionOfStrength).toBeCloseTo(0.558, 2);
    expect(caution.safety.message).toMatch(/string maker's rating/);
  });

  it('without a record, assumes steel music wire of the gauge that gives μ, and says so', () => {
    const mu = linearDensityFromMaterial(7850, 0.33e-3);
    const caution = sessionTensionSafety({ tensionN: 122.528, linearDensityKgPerM: mu }, readDesignRecord({}));
    expect(caution.assumed).toBe(true);
    expect(caution.basis).toMatch(/^assumed steel music wire of 0\.33 mm/);
    expect(caution.safety.fractionOfStrength).toBeCloseTo(0.558, 2);
  });

  it('checks a wound string on its core', () => {
    const caution = sessionTensionSafety({ tensionN: 158.767, linearDensityKgPerM: 0.0313 }, readDesignRecord({ design: { material: 'wound', core: { material: 'music-wire', diameterM: 0.0009 } } }));
    expect(caution.basis).toMatch(/core/);
    // Factory preset breakwater-bass records 0.113 of the core's minimum strength.
    expect(caution.safety.fractionOfStrength).toBeCloseTo(0.113, 2);
  });

  it('ignores a design record that makes no sense rather than trusting it', () => {
    expect(readDesignRecord({ design: { material: 'unobtainium', diameterM: -1 } })).toEqual({});
    expect(readDesignRecord({ design: 'steel' })).toEqual({});
  });
});
