import type { Hertz, Inharmonicity, KilogramsPerMetre, Metres, Newtons } from '../units';
import { inharmonicityFromMaterial } from './inharmonicity';
import { linearDensityFromMaterial, woundLinearDensityKgPerM } from './linear-density';
import { MATERIALS, type MaterialId } from './materials';
import { tensionForStiffPitchN } from './tension-for-pitch';

/**
 * The core's share of a wound string's overall diameter when the maker's construction is not
 * known: our own assumption, between the factory presets' 0.36 (bass) and 0.46 (baritone). The
 * maker's core diameter wins; the string panel lets it be typed.
 */
export const DEFAULT_CORE_FRACTION = 0.45;

/** A string in the trade's words: what it is made of, how thick, how long, and the note it sounds. */
export interface StringDesignInput {
  materialId: MaterialId;
  /** The gauge: the overall diameter (a wound string's outside diameter). */
  diameterM: Metres;
  /** A wound string's core diameter; `DEFAULT_CORE_FRACTION` of the gauge when absent. */
  coreDiameterM?: Metres;
  /** The speaking (scale) length. */
  lengthM: Metres;
  /** The pitch of the first partial, stiffness included. */
  frequencyHz: Hertz;
}

/** The patch's string numbers for a design, with the part that bends and carries the load. */
export interface StringDesign {
  linearDensityKgPerM: KilogramsPerMetre;
  tensionN: Newtons;
  inharmonicityB: Inharmonicity;
  /** The solid string, or a wound string's core: what the stiffness and the tension caution are figured on. */
  loadBearing: { materialId: MaterialId; diameterM: Metres };
  /** A wound string's core and wrap, as the design record keeps them. */
  core?: { material: MaterialId; diameterM: Metres };
  wrap?: { material: MaterialId; diameterM: Metres };
}

export type StringDesignResult = { ok: true; value: StringDesign } | { ok: false; field: 'gauge' | 'core' | 'pitch'; message: string };

/**
 * μ, T and B of a string from its material, gauge, length and note, with the designer helpers:
 * - solid: μ = ρπd²/4 (`linearDensityFromMaterial`); wound: core plus one close-wound wrap of
 *   diameter (D − d_core)/2 (`woundLinearDensityKgPerM`);
 * - T = μ(2L·f)² − π³E d⁴/(64L²), which puts the first partial f1 = f0·√(1 + B) exactly on f
 *   (`tensionForStiffPitchN`, Mersenne's law with H. Fletcher's stiffness term, JASA 36(1), 1964);
 * - B = π³E d⁴/(64 T L²) (`inharmonicityFromMaterial`), d and E of the solid string or the core.
 * Refuses a string too stiff to come down to the note (T ≤ 0) and a core as thick as the gauge.
 */
export function designString(input: StringDesignInput): StringDesignResult {
  const material = MATERIALS[input.materialId];
  const { diameterM, lengthM, frequencyHz } = input;
  let linearDensityKgPerM: KilogramsPerMetre;
  let loadBearing: StringDesign['loadBearing'];
  let core: StringDesign['core'];
  let wrap: StringDesign['wrap'];
  if (material.construction === 'wound') {
    const coreDiameterM = input.coreDiameterM ?? diameterM * DEFAULT_CORE_FRACTION;
    const wrapDiameterM = (diameterM - coreDiameterM) / 2;
    if (!(coreDiameterM > 0) || !(wrapDiameterM > 0)) {
      return { ok: false, field: 'core', message: `Core diameter must be more than 0 and less than the gauge (${(diameterM * 1000).toPrecision(3)} mm)` };
    }
    const coreMaterial = MATERIALS[material.core ?? 'music-wire'];
    const wrapMaterial = MATERIALS[material.wrap ?? 'music-wire'];
    linearDensityKgPerM = woundLinearDensityKgPerM(
      { densityKgPerM3: coreMaterial.densityKgPerM3, diameterM: coreDiameterM },
      { densityKgPerM3: wrapMaterial.densityKgPerM3, diameterM: wrapDiameterM },
    );
    loadBearing = { materialId: coreMaterial.id, diameterM: coreDiameterM };
    core = { material: coreMaterial.id, diameterM: coreDiameterM };
    wrap = { material: wrapMaterial.id, diameterM: wrapDiameterM };
  } else {
    linearDensityKgPerM = linearDensityFromMaterial(material.densityKgPerM3, diameterM);
    loadBearing = { materialId: material.id, diameterM };
  }
  const bending = MATERIALS[loadBearing.materialId].youngsModulusPa;
  const tensionN = tensionForStiffPitchN(lengthM, linearDensityKgPerM, frequencyHz, bending, loadBearing.diameterM);
  if (!(tensionN > 0)) {
    return {
      ok: false,
      field: 'pitch',
      message: `This string is too stiff to sound ${frequencyHz.toPrecision(4)} Hz at this length: choose a higher note, a thinner gauge or a longer scale`,
    };
  }
  const inharmonicityB = inharmonicityFromMaterial(bending, loadBearing.diameterM, tensionN, lengthM);
  return { ok: true, value: { linearDensityKgPerM, tensionN, inharmonicityB, loadBearing, core, wrap } };
}
