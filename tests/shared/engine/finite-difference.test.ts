import { describe, expect, it } from 'vitest';
import { samplePeak } from '../../../shared/audio/peak';
import { renderPatch } from '../../../shared/engine/render-patch';
import { validatePatch } from '../../../shared/patch/validate-patch';
import { simulateFiniteDifference } from '../../support/finite-difference-string';
import { testPatch } from '../../support/patches';

/** Linear interpolation of a polyline (what the patch's displacement means between its points). */
function polylineAt(points: [number, number][]) {
  return (x: number) => {
    let j = 0;
    while (j + 2 < points.length && points[j + 1][0] < x) j++;
    const [x0, y0] = points[j];
    const [x1, y1] = points[j + 1];
    return y0 + ((y1 - y0) * (x - x0)) / (x1 - x0);
  };
}

describe('modal render against an independent finite-difference simulation (Bensa et al. 2003 scheme)', () => {
  it('agrees at the pickup over the first 5 ms for a stiff, lossy, plucked and struck string', () => {
    const L = 0.65;
    const T = 70;
    const mu = 6e-4;
    const B = 1e-4;
    const displacement: [number, number][] = [
      [0, 0],
      [0.16, 0.0025],
      [0.18, 0.0025],
      [L, 0],
    ];
    const velocity: [number, number][] = [
      [0, 0],
      [0.4, 0],
      [0.42, 0.8],
      [0.44, 0],
      [L, 0],
    ];
    const sampleRateHz = 96000;
    const result = validatePatch(
      testPatch({
        string: { lengthM: L, tensionN: T, linearDensityKgPerM: mu, inharmonicityB: B },
        excitation: { displacementM: displacement, velocityMPerS: velocity },
        damping: { b1PerS: 3, b2M2PerS: 5e-3 },
        pickup: { positionM: 0.1, output: 'displacement' },
        render: { sampleRateHz, durationS: 0.005, maxModes: 4096 },
      }),
    );
    if (!result.ok) throw new Error(result.issues[0].message);
    const modal = renderPatch(result.value);

    const c = Math.sqrt(T / mu);
    const substeps = 48;
    const peak = samplePeak(modal);
    const gapAt = (intervals: number) => {
      const simulated = simulateFiniteDifference({
        lengthM: L,
        waveSpeedMPerS: c,
        stiffnessM2PerS: Math.sqrt((B * c * c * L * L) / (Math.PI * Math.PI)),
        b1PerS: 3,
        b2M2PerS: 5e-3,
        intervals,
        timeStepS: 1 / (sampleRateHz * substeps),
        steps: (modal.length - 1) * substeps,
        displacement: polylineAt(displacement),
        velocity: polylineAt(velocity),
        pickupIndex: Math.round((0.1 / L) * intervals),
      });
      let worst = 0;
      for (let i = 0; i < modal.length; i++) worst = Math.max(worst, Math.abs(modal[i] - simulated[i * substeps]));
      return worst / peak;
    };
    const coarse = gapAt(325);
    const fine = gapAt(650);
    expect(peak).toBeGreaterThan(1e-3);
    // The simulation converges on the modal result as its grid is refined (h = 2 mm → 1 mm).
    expect(fine).toBeLessThan(3e-3);
    expect(coarse / fine).toBeGreaterThan(1.8);
  });
});
