import { describe, expect, it } from 'vitest';
import { MODE_LEVEL_FLOOR_DB, modeLevelsDb } from '../../../src/features/editor/results/mode-level-db';

describe('modeLevelsDb', () => {
  it('gives 10·log10(E_n/E_max): energies falling as 1/n² read −20·log10(n) dB', () => {
    const energyJ = Float64Array.from({ length: 20 }, (_, m) => 3e-4 / (m + 1) ** 2);
    const levels = modeLevelsDb(energyJ);
    for (let m = 0; m < 20; m++) expect(levels[m]).toBeCloseTo(-20 * Math.log10(m + 1), 12);
    expect(levels[1]).toBeCloseTo(-6.0206, 4);
  });

  it('measures from the loudest mode wherever it is, so that one reads 0 dB', () => {
    const levels = modeLevelsDb([1e-6, 4e-6, 2e-6]);
    expect(levels[1]).toBe(0);
    expect(levels[0]).toBeCloseTo(-10 * Math.log10(4), 12);
  });

  it('puts silent and very quiet modes on the −80 dB floor, and every mode there when none has energy', () => {
    expect(MODE_LEVEL_FLOOR_DB).toBe(-80);
    expect([...modeLevelsDb([1, 0, 1e-9, 1e-7])]).toEqual([0, -80, -80, expect.closeTo(-70, 9)]);
    expect([...modeLevelsDb([0, 0])]).toEqual([-80, -80]);
    expect([...modeLevelsDb([1, 1e-5], -40)]).toEqual([0, -40]);
    expect(modeLevelsDb([]).length).toBe(0);
  });
});
