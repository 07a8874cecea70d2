import type { Decibels, Joules } from '../../../../shared/units';

/** The lowest level the mode chart shows; quieter modes (and modes with no energy) sit on this floor. */
export const MODE_LEVEL_FLOOR_DB: Decibels = -80;

/**
 * The level of each mode relative to the loudest, from its energy: L_n = 10·log10(E_n / E_max) dB
 * (energy is a power-like quantity, hence 10 and not 20), floored at `floorDb`. When no mode has any
 * energy, every level is the floor.
 */
export function modeLevelsDb(energyJ: ArrayLike<Joules>, floorDb: Decibels = MODE_LEVEL_FLOOR_DB): Float64Array {
  const levelsDb = new Float64Array(energyJ.length);
  let maxEnergyJ = 0;
  for (let m = 0; m < energyJ.length; m++) if (energyJ[m] > maxEnergyJ) maxEnergyJ = energyJ[m];
  for (let m = 0; m < energyJ.length; m++) {
    const levelDb = maxEnergyJ > 0 && energyJ[m] > 0 ? 10 * Math.log10(energyJ[m] / maxEnergyJ) : -Infinity;
    levelsDb[m] = levelDb > floorDb ? levelDb : floorDb;
  }
  return levelsDb;
}
