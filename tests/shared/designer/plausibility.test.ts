import { describe, expect, it } from 'vitest';
import { plausibilityCautions, steepestSlope } from '../../../shared/designer/plausibility';
import { testPatch, trianglePluck, validPatch } from '../../support/patches';

describe('cautions for valid but implausible numbers', () => {
  it('measures the steepest slope of a polyline: a triangle of height h at p on L has slopes h/p and h/(L − p)', () => {
    expect(steepestSlope(trianglePluck(0.65, 0.17, 0.003))).toBeCloseTo(0.003 / 0.17, 12);
    expect(steepestSlope(trianglePluck(0.65, 0.6, 0.01))).toBeCloseTo(0.01 / 0.05, 12);
  });

  it('says nothing for the ordinary test string (3 mm pluck on 650 mm, nylon-like density)', () => {
    expect(plausibilityCautions(validPatch(testPatch()))).toEqual([]);
  });

  it('names the slope when the displacement is large against the length', () => {
    const [caution] = plausibilityCautions(validPatch(testPatch({ excitation: { displacementM: trianglePluck(0.65, 0.1, 0.03) } })));
    expect(caution).toContain('0.30 mm per mm');
    expect(caution).toContain('slopes well below 0.1');
  });

  it('cautions on lengths and densities outside real strings, in mm and g/m', () => {
    const long = validPatch(testPatch({ string: { lengthM: 12, tensionN: 500, linearDensityKgPerM: 6e-4, inharmonicityB: 0 }, excitation: { displacementM: trianglePluck(12, 3, 0.003) }, pickup: { positionM: 1, output: 'displacement' } }));
    expect(plausibilityCautions(long)).toEqual([expect.stringContaining('A length of 12 m is outside real strings')]);
    const heavy = validPatch(testPatch({ string: { lengthM: 0.65, tensionN: 70000, linearDensityKgPerM: 2, inharmonicityB: 0 } }));
    expect(plausibilityCautions(heavy)).toEqual([expect.stringContaining('2000 g/m is outside real strings')]);
  });
});
