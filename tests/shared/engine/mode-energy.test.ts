import { describe, expect, it } from 'vitest';
import { modeEnergyJ } from '../../../shared/engine/mode-energy';
import { computeModeTable } from '../../../shared/engine/mode-table';
import { sineProjection } from '../../../shared/engine/sine-projection';
import { validatePatch } from '../../../shared/patch/validate-patch';
import { seededRandom } from '../../../shared/random/seeded-random';
import { testPatch, trianglePluck } from '../../support/patches';

const L = 0.65;
const T = 70;
const mu = 6e-4;
const c = Math.sqrt(T / mu);

/** Σ E_n over `modes` modes of a flexible string for given displacement and velocity polylines. */
function modalEnergy(displacement: [number, number][], velocity: [number, number][] | null, modes: number): number {
  const a = sineProjection(displacement, L, modes);
  const v = velocity ? sineProjection(velocity, L, modes) : new Float64Array(modes);
  let sum = 0;
  for (let m = 0; m < modes; m++) sum += modeEnergyJ(mu, L, ((m + 1) * Math.PI * c) / L, a[m], v[m]);
  return sum;
}

describe('mode energies', () => {
  it('sum to T h² L / (2p(L − p)) for the triangular pluck (Parseval; team reference sheet: 200,000 modes agree to 3e-6)', () => {
    const p = 0.17;
    const h = 0.003;
    const closedForm = (T * h * h * L) / (2 * p * (L - p));
    const sum = modalEnergy(trianglePluck(L, p, h), null, 200_000);
    expect(Math.abs(sum - closedForm) / closedForm).toBeLessThan(3e-6);
  });

  it('sum to 2Th²/L for a pluck at the centre (derived from the same closed form)', () => {
    const h = 0.002;
    const sum = modalEnergy(trianglePluck(L, L / 2, h), null, 200_000);
    expect(Math.abs(sum - (2 * T * h * h) / L) / ((2 * T * h * h) / L)).toBeLessThan(3e-6);
  });

  it('conserve (T/2)∫y′²dx + (μ/2)∫v²dx for a random displacement and velocity, no losses (energy of the wave equation)', () => {
    const random = seededRandom(77);
    const polyline = (amplitude: number, count: number): [number, number][] => {
      const points: [number, number][] = [[0, 0]];
      for (let i = 1; i < count; i++) points.push([(L * i) / count, (random() - 0.5) * amplitude]);
      points.push([L, 0]);
      return points;
    };
    const y = polyline(0.004, 17);
    const v = polyline(0.8, 11);
    let potential = 0;
    for (let j = 0; j + 1 < y.length; j++) {
      const dx = y[j + 1][0] - y[j][0];
      const slope = (y[j + 1][1] - y[j][1]) / dx;
      potential += (T / 2) * slope * slope * dx;
    }
    let kinetic = 0;
    for (let j = 0; j + 1 < v.length; j++) {
      const dx = v[j + 1][0] - v[j][0];
      const [v0, v1] = [v[j][1], v[j + 1][1]];
      kinetic += (mu / 2) * dx * ((v0 * v0 + v0 * v1 + v1 * v1) / 3); // ∫ of a linear function squared
    }
    const exact = potential + kinetic;
    // A polyline's kinks leave a tail that falls as 1/N (E_n ~ 1/n²): the sum must approach the
    // exact energy from below, and doubling the modes must halve the gap.
    const gap100k = (exact - modalEnergy(y, v, 100_000)) / exact;
    const gap200k = (exact - modalEnergy(y, v, 200_000)) / exact;
    expect(gap200k).toBeGreaterThan(0);
    expect(gap200k).toBeLessThan(5e-5);
    expect(gap100k / gap200k).toBeGreaterThan(1.8);
    expect(gap100k / gap200k).toBeLessThan(2.2);
  });

  it('add up to the mode table’s total energy', () => {
    const result = validatePatch(testPatch());
    if (!result.ok) throw new Error(result.issues[0].message);
    const table = computeModeTable(result.value);
    const sum = table.energyJ.reduce((total, energy) => total + energy, 0);
    expect(table.totalEnergyJ).toBeCloseTo(sum, 15);
    expect(table.count).toBe(91); // f0 = 262.74 Hz: 91 modes lie below 24 kHz
  });
});
