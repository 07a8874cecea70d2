import { describe, expect, it } from 'vitest';
import { LIMITS } from '../../../shared/limits';
import { validatePatch } from '../../../shared/patch/validate-patch';
import { testPatch } from '../../support/patches';

/** A deep copy of the test patch with one change applied. */
function withChange(change: (patch: any) => void): unknown {
  const patch = structuredClone(testPatch()) as any;
  change(patch);
  return patch;
}

function firstMessage(input: unknown): string {
  const result = validatePatch(input);
  if (result.ok) throw new Error('expected the patch to be refused');
  return result.issues[0].message;
}

describe('validatePatch', () => {
  it('accepts a good patch, fills in B = 0 and keeps designer-facing extras', () => {
    const input = withChange((p) => {
      delete p.string.inharmonicityB;
      p.string.material = 'nylon';
      p.design = { targetNote: 'C4' };
    });
    const result = validatePatch(input);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value.string.inharmonicityB).toBe(0);
    expect((result.value.string as Record<string, unknown>).material).toBe('nylon');
    expect((result.value as Record<string, unknown>).design).toEqual({ targetNote: 'C4' });
  });

  it.each<[string, (p: any) => void, string]>([
    ['negative tension', (p) => (p.string.tensionN = -5), 'string.tensionN must be > 0, got -5'],
    ['zero length', (p) => (p.string.lengthM = 0), 'string.lengthM must be > 0, got 0'],
    ['zero density', (p) => (p.string.linearDensityKgPerM = 0), 'string.linearDensityKgPerM must be > 0, got 0'],
    ['tension as text', (p) => (p.string.tensionN = '70'), 'string.tensionN must be a number, got "70"'],
    ['missing tension', (p) => delete p.string.tensionN, 'string.tensionN is required'],
    ['missing string', (p) => delete p.string, 'string is required'],
    ['negative B', (p) => (p.string.inharmonicityB = -1e-4), 'string.inharmonicityB must be >= 0, got -0.0001'],
    ['huge B', (p) => (p.string.inharmonicityB = 2), 'string.inharmonicityB must be <= 1, got 2'],
    ['infinite tension (JSON 1e999)', (p) => (p.string.tensionN = JSON.parse('1e999')), 'string.tensionN must be a finite number, got Infinity'],
    ['negative b1', (p) => (p.damping.b1PerS = -0.1), 'damping.b1PerS must be >= 0, got -0.1'],
    ['negative b2', (p) => (p.damping.b2M2PerS = -1), 'damping.b2M2PerS must be >= 0, got -1'],
    ['sample rate 22050', (p) => (p.render.sampleRateHz = 22050), 'render.sampleRateHz must be one of 44100, 48000, 88200, 96000, got 22050'],
    ['zero duration', (p) => (p.render.durationS = 0), 'render.durationS must be > 0, got 0'],
    ['61 s duration', (p) => (p.render.durationS = 61), `render.durationS must be <= ${LIMITS.maxDurationS}, got 61`],
    ['zero modes', (p) => (p.render.maxModes = 0), 'render.maxModes must be >= 1, got 0'],
    ['4097 modes', (p) => (p.render.maxModes = 4097), 'render.maxModes must be <= 4096, got 4097'],
    ['fractional modes', (p) => (p.render.maxModes = 10.5), 'render.maxModes must be a whole number, got 10.5'],
    ['pickup at 0', (p) => (p.pickup.positionM = 0), 'pickup.positionM must be > 0, got 0'],
    ['pickup at L', (p) => (p.pickup.positionM = 0.65), 'pickup.positionM must be < string.lengthM (0.65); the pickup sits between the supports, got 0.65'],
    ['pickup beyond L', (p) => (p.pickup.positionM = 0.9), 'pickup.positionM must be < string.lengthM (0.65); the pickup sits between the supports, got 0.9'],
    ['unknown output', (p) => (p.pickup.output = 'pressure'), 'pickup.output must be one of displacement, velocity, force, got "pressure"'],
    ['empty name', (p) => (p.name = '   '), 'name must not be empty, got "   "'],
    ['long name', (p) => (p.name = 'x'.repeat(201)), `name must be at most ${LIMITS.maxNameLength} characters, got "${'x'.repeat(40)}…"`],
    ['first x not 0', (p) => (p.excitation.displacementM[0] = [0.01, 0]), 'excitation.displacementM[0][0] must be 0 (the first point sits on the support at x = 0), got 0.01'],
    ['last x not L', (p) => (p.excitation.displacementM[2] = [0.64, 0]), 'excitation.displacementM[2][0] must equal string.lengthM (0.65), the far support, got 0.64'],
    ['first y not 0', (p) => (p.excitation.displacementM[0] = [0, 0.001]), 'excitation.displacementM[0][1] must be 0 (the string is pinned at its supports), got 0.001'],
    ['last y not 0', (p) => (p.excitation.displacementM[2] = [0.65, -0.001]), 'excitation.displacementM[2][1] must be 0 (the string is pinned at its supports), got -0.001'],
    ['x not increasing', (p) => (p.excitation.displacementM = [[0, 0], [0.3, 0.001], [0.3, 0.002], [0.65, 0]]), "excitation.displacementM[2][0] must be > the previous point's x (0.3); x must strictly increase, got 0.3"],
    ['point with one number', (p) => (p.excitation.displacementM[1] = [0.17]), 'excitation.displacementM[1] must be a pair [x, value], got an array of 1 item'],
    ['one point', (p) => (p.excitation.displacementM = [[0, 0]]), `excitation.displacementM must have at least ${LIMITS.minPolylinePoints} points (one at each support), got an array of 1 item`],
    ['velocity off the string', (p) => (p.excitation.velocityMPerS = [[0, 0], [0.3, 1], [0.7, 0]]), 'excitation.velocityMPerS[2][0] must equal string.lengthM (0.65), the far support, got 0.7'],
    ['fundamental above Nyquist', (p) => (p.string.tensionN = 5e6), 'string.tensionN gives a fundamental of 70220.8 Hz, at or above half the sample rate (24000 Hz); no mode could sound, got 5000000'],
  ])('refuses %s, naming the field', (_label, change, message) => {
    expect(firstMessage(withChange(change))).toBe(message);
  });

  it(`refuses a polyline of ${LIMITS.maxPolylinePoints + 1} points and accepts one of ${LIMITS.maxPolylinePoints}`, () => {
    const polyline = (count: number) =>
      Array.from({ length: count }, (_, i) => [i === count - 1 ? 0.65 : (0.65 * i) / (count - 1), i === 0 || i === count - 1 ? 0 : 0.001]);
    expect(firstMessage(withChange((p) => (p.excitation.displacementM = polyline(LIMITS.maxPolylinePoints + 1))))).toBe(
      `excitation.displacementM must have at most ${LIMITS.maxPolylinePoints} points, got an array of 10001 items`,
    );
    expect(validatePatch(withChange((p) => (p.excitation.displacementM = polyline(LIMITS.maxPolylinePoints)))).ok).toBe(true);
  });

  it('refuses input that is not an object', () => {
    expect(firstMessage([1, 2])).toBe('(patch) must be a JSON object, got an array of 2 items');
    expect(firstMessage(null)).toBe('(patch) must be a JSON object, got null');
  });

  it('reports every problem it finds, each with its field', () => {
    const result = validatePatch(withChange((p) => {
      p.string.tensionN = -1;
      p.render.durationS = 100;
    }));
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.issues.map((issue) => issue.field)).toEqual(['string.tensionN', 'render.durationS']);
    expect(result.issues[1]).toMatchObject({ problem: 'must be <= 60', got: '100' });
  });
});
