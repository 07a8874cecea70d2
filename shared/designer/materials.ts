import type { KilogramsPerCubicMetre, Metres, Pascals } from '../units';

export type MaterialId = 'music-wire' | 'phosphor-bronze' | 'nylon' | 'wound';

export interface StringMaterial {
  id: MaterialId;
  label: string;
  densityKgPerM3: KilogramsPerCubicMetre;
  youngsModulusPa: Pascals;
  /** Minimum tensile strength for a given diameter, or null when only the maker's rating applies. */
  tensileStrengthPa: (diameterM: Metres) => Pascals | null;
  source: string;
}

const INCH_M = 0.0254;
const MPA = 1e6;

/** ASTM A228 music wire, minimum tensile strength by diameter (table as reproduced by wire makers). */
const MUSIC_WIRE_MIN_STRENGTH: ReadonlyArray<readonly [number, number]> = [
  [0.004 * INCH_M, 3027 * MPA],
  [0.01 * INCH_M, 2668 * MPA],
  [0.02 * INCH_M, 2413 * MPA],
  [0.04 * INCH_M, 2172 * MPA],
  [0.1 * INCH_M, 1868 * MPA],
  [0.25 * INCH_M, 1586 * MPA],
];

/** Interpolates the table on log–log axes, holding the end values outside its range. */
function musicWireStrengthPa(diameterM: Metres): Pascals {
  const table = MUSIC_WIRE_MIN_STRENGTH;
  if (diameterM <= table[0][0]) return table[0][1];
  const last = table[table.length - 1];
  if (diameterM >= last[0]) return last[1];
  let i = 1;
  while (table[i][0] < diameterM) i++;
  const [d0, s0] = table[i - 1];
  const [d1, s1] = table[i];
  const t = Math.log(diameterM / d0) / Math.log(d1 / d0);
  return Math.exp(Math.log(s0) + t * Math.log(s1 / s0));
}

/** String materials with the figures the designer helpers need. */
export const MATERIALS: Readonly<Record<MaterialId, StringMaterial>> = {
  'music-wire': {
    id: 'music-wire',
    label: 'Steel music wire',
    densityKgPerM3: 7850,
    youngsModulusPa: 203e9,
    tensileStrengthPa: musicWireStrengthPa,
    source: 'ASTM A228: density 7.85 g/cm³, E ≈ 203 GPa (fine wire), minimum tensile strength by diameter',
  },
  'phosphor-bronze': {
    id: 'phosphor-bronze',
    label: 'Phosphor bronze',
    densityKgPerM3: 8860,
    youngsModulusPa: 110e9,
    tensileStrengthPa: () => 1000 * MPA,
    source: 'C51000 spring-temper wire: 8.86 g/cm³, E ≈ 110 GPa, minimum tensile 1000 MPa up to 0.025″ (maker data sheets)',
  },
  nylon: {
    id: 'nylon',
    label: 'Nylon monofilament',
    densityKgPerM3: 1140,
    youngsModulusPa: 4.5e9,
    // Recalled from memory, not from a data sheet: drawn nylon monofilament breaks near 400 MPa.
    tensileStrengthPa: () => 400 * MPA,
    source: 'Nylon 6/6: 1.14 g/cm³; drawn string monofilament E about 4–5 GPa (memory); strength 400 MPa (memory)',
  },
  wound: {
    id: 'wound',
    label: 'Wound string',
    densityKgPerM3: 7850,
    youngsModulusPa: 203e9,
    tensileStrengthPa: () => null,
    // Figures of the steel core: compute a wound string's μ with woundLinearDensityKgPerM and its B from the core.
    source: 'Wound strings carry their load in the core: only the string maker’s rating applies',
  },
};
