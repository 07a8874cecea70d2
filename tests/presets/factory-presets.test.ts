import { describe, it, expect } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { validatePatch } from '../../shared/patch/validate-patch';
import type { Patch } from '../../shared/patch/patch-schema';
import { LIMITS } from '../../shared/limits';
import { fundamentalFrequencyHz, modeFrequencyHz } from '../../shared/engine/mode-frequencies';
import { centsBetween, midiToFrequencyHz, noteNameToMidi } from '../../shared/designer/pitch';
import { MATERIALS, type MaterialId } from '../../shared/designer/materials';
import { inharmonicityFromMaterial } from '../../shared/designer/inharmonicity';
import { tensionSafety } from '../../shared/designer/tension-safety';
import { t60AtFrequency } from '../../shared/designer/damping-from-t60';

/** The designer-facing record a factory preset carries beside the patch fields. */
interface Design {
  material?: MaterialId;
  diameterM?: number;
  core?: { material: MaterialId; diameterM: number };
  targetNote?: string;
  lowFrequencyHz?: number;
  lowT60S?: number;
  highFrequencyHz?: number;
  highT60S?: number;
}

interface PresetFile {
  file: string;
  json: Record<string, unknown>;
}

const presetsDir = fileURLToPath(new URL('../../presets/', import.meta.url));
const presets: PresetFile[] = readdirSync(presetsDir)
  .filter((file) => file.endsWith('.json'))
  .sort()
  .map((file) => ({ file, json: JSON.parse(readFileSync(join(presetsDir, file), 'utf8')) as Record<string, unknown> }));

/** Validates a preset, failing with every issue listed when it does not pass. */
function validated(preset: PresetFile): Patch {
  const result = validatePatch(preset.json);
  if (!result.ok) {
    expect.fail(`${preset.file} is not a valid patch:\n  ${result.issues.map((issue) => issue.message).join('\n  ')}`);
  }
  return result.value;
}

const design = (preset: PresetFile): Design | undefined => preset.json.design as Design | undefined;
const tags = (preset: PresetFile): string[] => (Array.isArray(preset.json.tags) ? (preset.json.tags as string[]) : []);
const withTag = (tag: string) => presets.filter((preset) => tags(preset).includes(tag));
const cases = presets.map((preset) => [preset.file, preset] as const);

/** Relative difference, for numbers the presets store to about 6 significant figures. */
const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe('factory presets', () => {
  it('has at least 8 presets, in kebab-case .json files', () => {
    expect(presets.length).toBeGreaterThanOrEqual(8);
    for (const { file } of presets) expect(file).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*\.json$/);
  });

  it.each(cases)('%s passes validatePatch', (_file, preset) => {
    validated(preset);
  });

  it('has unique names', () => {
    const names = presets.map((preset) => String(preset.json.name).trim().toLowerCase());
    expect(new Set(names).size).toBe(names.length);
  });

  it.each(cases)('%s has a description and tags', (_file, preset) => {
    expect(typeof preset.json.description).toBe('string');
    expect((preset.json.description as string).trim().length).toBeGreaterThan(0);
    expect(tags(preset).length).toBeGreaterThan(0);
    for (const tag of tags(preset)) expect(tag).toMatch(/^[a-z0-9][a-z0-9-]*$/);
  });

  it.each(cases)('%s renders between 1 and 12 s at an allowed rate', (_file, preset) => {
    const { render } = validated(preset);
    expect(render.durationS).toBeGreaterThanOrEqual(1);
    expect(render.durationS).toBeLessThanOrEqual(12);
    expect(LIMITS.sampleRatesHz).toContain(render.sampleRateHz);
    expect(render.maxModes).toBeLessThanOrEqual(LIMITS.maxModes);
  });

  it.each(cases)('%s sounds its design.targetNote within 1 cent (the first partial, stiffness included)', (_file, preset) => {
    const note = design(preset)?.targetNote;
    if (note === undefined) return;
    const midi = noteNameToMidi(note);
    expect(midi, `design.targetNote ${JSON.stringify(note)} is not a note name`).not.toBeNull();
    // The presets are tuned with tensionForStiffPitchN, so the partial heard, f1 = f0·√(1 + B)
    // (Fletcher 1964), sits on the note, not the flexible-string f0 = c/(2L).
    const f1Hz = modeFrequencyHz(validated(preset).string, 1);
    expect(Math.abs(centsBetween(midiToFrequencyHz(midi!), f1Hz))).toBeLessThan(1);
  });

  it.each(cases)('%s keeps its string tension clear of breaking', (_file, preset) => {
    const d = design(preset);
    const { string } = validated(preset);
    // Wound strings carry their load in the core, so the core is what is checked.
    const solid = d?.core ?? (d?.material && d.diameterM !== undefined ? { material: d.material, diameterM: d.diameterM } : undefined);
    if (solid === undefined) return;
    const safety = tensionSafety(string.tensionN, solid.diameterM, solid.material);
    expect(['danger', 'beyond'], safety.message).not.toContain(safety.level);
  });

  it.each(cases)('%s has the inharmonicity of its material (the core for wound strings)', (_file, preset) => {
    const d = design(preset);
    const { string } = validated(preset);
    const solid = d?.core ?? (d?.material && d.material !== 'wound' && d.diameterM !== undefined ? { material: d.material, diameterM: d.diameterM } : undefined);
    if (solid === undefined) return;
    const expected = inharmonicityFromMaterial(MATERIALS[solid.material].youngsModulusPa, solid.diameterM, string.tensionN, string.lengthM);
    expect(relativeError(string.inharmonicityB, expected)).toBeLessThan(1e-4);
  });

  it.each(cases)('%s meets its design decay-time targets', (_file, preset) => {
    const d = design(preset);
    const { string, damping } = validated(preset);
    if (d?.lowFrequencyHz === undefined || d.lowT60S === undefined || d.highFrequencyHz === undefined || d.highT60S === undefined) return;
    expect(relativeError(t60AtFrequency(damping, string, d.lowFrequencyHz)!, d.lowT60S)).toBeLessThan(1e-3);
    expect(relativeError(t60AtFrequency(damping, string, d.highFrequencyHz)!, d.highT60S)).toBeLessThan(1e-3);
  });

  describe('covers the required kinds', () => {
    it.each(['steel', 'nylon', 'wound', 'struck', 'muted', 'harp'])('has a preset tagged "%s"', (tag) => {
      expect(withTag(tag).length, `no preset is tagged ${JSON.stringify(tag)}`).toBeGreaterThan(0);
    });

    it('struck presets start from (nearly) rest and carry a velocity polyline', () => {
      for (const preset of withTag('struck')) {
        const { excitation } = validated(preset);
        const peakDisplacementM = Math.max(...excitation.displacementM.map(([, y]) => Math.abs(y)));
        expect(peakDisplacementM, preset.file).toBeLessThanOrEqual(1e-4);
        expect(excitation.velocityMPerS, preset.file).toBeDefined();
        expect(Math.max(...excitation.velocityMPerS!.map(([, v]) => Math.abs(v))), preset.file).toBeGreaterThan(0);
      }
    });

    it('muted presets die away quickly and harp presets ring long', () => {
      const t60AtF0 = (preset: PresetFile) => {
        const { string, damping } = validated(preset);
        return t60AtFrequency(damping, string, fundamentalFrequencyHz(string))!;
      };
      for (const preset of withTag('muted')) expect(t60AtF0(preset), preset.file).toBeLessThanOrEqual(0.5);
      for (const preset of withTag('harp')) expect(t60AtF0(preset), preset.file).toBeGreaterThanOrEqual(8);
    });

    it('uses every pickup output and a high sample rate', () => {
      const patches = presets.map(validated);
      for (const output of ['displacement', 'velocity', 'force'] as const) {
        expect(patches.some((patch) => patch.pickup.output === output), `no preset reads ${output}`).toBe(true);
      }
      expect(patches.some((patch) => patch.render.sampleRateHz === 96000)).toBe(true);
    });
  });
});
