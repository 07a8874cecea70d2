import type { KilogramsPerCubicMetre, Metres, Pascals } from '../units';

/**
 * The string materials a designer can pick. Plain (solid) strings are one material; wound strings
 * (`bronze-wound`, `nickel-wound`, and the generic steel-on-steel `wound` the factory presets use)
 * are a steel music-wire core carrying the load, close-wrapped with the named metal for mass.
 */
export type MaterialId = 'music-wire' | 'phosphor-bronze' | 'nylon' | 'fluorocarbon' | 'bronze-wound' | 'nickel-wound' | 'wound';

/** A solid string is one material; a wound one is a core (load and stiffness) plus a wrap (mass). */
export type StringConstruction = 'solid' | 'wound';

/** Where each figure of a material comes from; "(memory)" marks a value recalled, not re-read at its source. */
export interface MaterialSources {
  density: string;
  youngsModulus: string;
  tensileStrength: string;
}

export interface StringMaterial {
  id: MaterialId;
  label: string;
  construction: StringConstruction;
  /** Density of the material itself; for a wound string, of its wrap wire. */
  densityKgPerM3: KilogramsPerCubicMetre;
  /** Young's modulus of the part that bends: the material itself, or a wound string's core. */
  youngsModulusPa: Pascals;
  /**
   * Minimum (typical) tensile strength of the part that carries the tension, for a given diameter
   * of that part, or null when no figure is known here and only the maker's rating applies.
   */
  tensileStrengthPa: (diameterM: Metres) => Pascals | null;
  /** For wound strings: the material of the core (whose modulus and strength apply) and of the wrap. */
  core?: MaterialId;
  wrap?: MaterialId;
  sources: MaterialSources;
  /** All sources in one line, as shown beside the material. */
  source: string;
}

const INCH_M = 0.0254;
const MPA = 1e6;

/** ASTM A228 music wire, minimum tensile strength by diameter (table as reproduced by wire makers). */
export const MUSIC_WIRE_MIN_STRENGTH: ReadonlyArray<readonly [Metres, Pascals]> = [
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

const STEEL: MaterialSources = {
  density: 'ASTM A228 music wire: 7.85 g/cm³',
  youngsModulus: 'spring-design tables for ASTM A228: E ≈ 203 GPa for wire up to 0.032″',
  tensileStrength: 'ASTM A228 minimum tensile strength by diameter (0.004″ 3027 MPa … 0.250″ 1586 MPa), as reproduced by wire makers',
};

const PHOSPHOR_BRONZE: MaterialSources = {
  density: 'phosphor bronze C51000: 8.86 g/cm³ (maker data sheets)',
  youngsModulus: 'phosphor bronze C51000: E ≈ 110 GPa (maker data sheets)',
  tensileStrength: 'C51000 spring-temper wire: minimum 1000 MPa (145 ksi) up to 0.025″ (maker data sheets)',
};

const joined = (sources: MaterialSources) => `Density: ${sources.density}. Stiffness: ${sources.youngsModulus}. Strength: ${sources.tensileStrength}.`;

function material(entry: Omit<StringMaterial, 'source'>): StringMaterial {
  return { ...entry, source: joined(entry.sources) };
}

const wound = (wrapDensity: string): MaterialSources => ({
  density: `wrap wire: ${wrapDensity}`,
  youngsModulus: `steel core: ${STEEL.youngsModulus}; the wrap adds mass, not bending stiffness (common practice of string design)`,
  tensileStrength: `steel core: ${STEEL.tensileStrength}; the string maker's rating rules for the whole string`,
});

/** String materials with the figures the designer helpers need, each with its source. */
export const MATERIALS: Readonly<Record<MaterialId, StringMaterial>> = {
  'music-wire': material({
    id: 'music-wire',
    label: 'Steel music wire',
    construction: 'solid',
    densityKgPerM3: 7850,
    youngsModulusPa: 203e9,
    tensileStrengthPa: musicWireStrengthPa,
    sources: STEEL,
  }),
  'phosphor-bronze': material({
    id: 'phosphor-bronze',
    label: 'Phosphor bronze wire',
    construction: 'solid',
    densityKgPerM3: 8860,
    youngsModulusPa: 110e9,
    tensileStrengthPa: () => 1000 * MPA,
    sources: PHOSPHOR_BRONZE,
  }),
  nylon: material({
    id: 'nylon',
    label: 'Nylon monofilament',
    construction: 'solid',
    densityKgPerM3: 1140,
    youngsModulusPa: 4.5e9,
    tensileStrengthPa: () => 400 * MPA,
    sources: {
      density: 'nylon 6/6: 1.14 g/cm³',
      youngsModulus: 'nylon 6/6 1.5–3.8 GPa by moisture and grade; drawn string monofilament about 4–5 GPa (memory), 4.5 GPa used',
      tensileStrength: 'drawn nylon monofilament about 400 MPa (memory, not re-read at a data sheet)',
    },
  }),
  fluorocarbon: material({
    id: 'fluorocarbon',
    label: 'Fluorocarbon (PVDF) monofilament',
    construction: 'solid',
    densityKgPerM3: 1780,
    youngsModulusPa: 2.5e9,
    tensileStrengthPa: () => null,
    sources: {
      density: 'PVDF: 1.78 g/cm³ (memory)',
      youngsModulus: 'PVDF: about 2–3 GPa (memory), 2.5 GPa used; drawn strings may be stiffer',
      tensileStrength: 'no figure re-read here: only the string maker’s rating applies',
    },
  }),
  'bronze-wound': material({
    id: 'bronze-wound',
    label: 'Phosphor bronze wound on steel',
    construction: 'wound',
    densityKgPerM3: 8860,
    youngsModulusPa: 203e9,
    tensileStrengthPa: musicWireStrengthPa,
    core: 'music-wire',
    wrap: 'phosphor-bronze',
    sources: wound(PHOSPHOR_BRONZE.density),
  }),
  'nickel-wound': material({
    id: 'nickel-wound',
    label: 'Nickel-plated steel wound on steel',
    construction: 'wound',
    densityKgPerM3: 7850,
    youngsModulusPa: 203e9,
    tensileStrengthPa: musicWireStrengthPa,
    core: 'music-wire',
    wrap: 'music-wire',
    sources: wound('steel, 7.85 g/cm³ (ASTM A228); the thin nickel plating is neglected (our assumption)'),
  }),
  wound: material({
    id: 'wound',
    label: 'Wound string (maker’s figures)',
    construction: 'wound',
    densityKgPerM3: 7850,
    youngsModulusPa: 203e9,
    tensileStrengthPa: () => null,
    core: 'music-wire',
    wrap: 'music-wire',
    sources: {
      density: `steel wrap: ${STEEL.density}`,
      youngsModulus: `steel core: ${STEEL.youngsModulus}`,
      tensileStrength: 'wound strings carry their load in the core: only the string maker’s rating applies to the whole string',
    },
  }),
};

/** The materials offered in the string panel, in the order shown. */
export const MATERIAL_CHOICES: readonly MaterialId[] = ['music-wire', 'phosphor-bronze', 'nylon', 'fluorocarbon', 'bronze-wound', 'nickel-wound'];

export const isMaterialId = (value: unknown): value is MaterialId => typeof value === 'string' && Object.hasOwn(MATERIALS, value);
