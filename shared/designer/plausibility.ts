import type { Patch } from '../patch/patch-schema';

/**
 * The model's own limit and the range of real strings, for cautions on numbers that are valid but
 * unlikely to mean what the designer wants. These are our own rough bounds (common practice, not a
 * published standard):
 * - the wave equation assumes small slopes (|∂y/∂x| ≪ 1, Fletcher & Rossing ch. 2); past a slope of
 *   0.1 the tension change from stretching is no longer negligible (0.1 recalled from common practice);
 * - speaking lengths from 20 mm (small bells and music-box tines excepted) to 3 m (the longest
 *   piano and harp strings are about 2–2.5 m; 3 m leaves room for installations);
 * - linear densities from 0.01 g/m (thin monofilament) to 200 g/m (heavy wound bass strings).
 */
export const PLAUSIBLE = {
  maxSlope: 0.1,
  lengthM: { min: 0.02, max: 3 },
  linearDensityKgPerM: { min: 1e-5, max: 0.2 },
} as const;

/** The steepest part of a polyline, max |Δy/Δx| over its segments (for a velocity layer: 1/s, not a slope). */
export function steepestSlope(polyline: ReadonlyArray<readonly [number, number]>): number {
  let steepest = 0;
  for (let i = 1; i < polyline.length; i++) {
    const dx = polyline[i][0] - polyline[i - 1][0];
    if (dx > 0) steepest = Math.max(steepest, Math.abs(polyline[i][1] - polyline[i - 1][1]) / dx);
  }
  return steepest;
}

/** A number to three significant figures, written plainly (12.0 → "12", 2000 → "2000"). */
const plain = (value: number) => String(Number(value.toPrecision(3)));

/** Plain-words cautions for a valid patch whose numbers are outside what the model or real strings cover. */
export function plausibilityCautions(patch: Patch): string[] {
  const cautions: string[] = [];
  const slope = steepestSlope(patch.excitation.displacementM);
  if (slope > PLAUSIBLE.maxSlope) {
    cautions.push(
      `The shape's steepest part rises ${slope.toFixed(2)} mm per mm (1 in ${plain(1 / slope)}). The model assumes slopes well below ${PLAUSIBLE.maxSlope}: a displacement this large against the string's length makes the real string stiffer and sharper than you will hear here.`,
    );
  }
  const { lengthM, linearDensityKgPerM } = patch.string;
  if (lengthM < PLAUSIBLE.lengthM.min || lengthM > PLAUSIBLE.lengthM.max) {
    const length = lengthM >= 1 ? `${plain(lengthM)} m` : `${plain(lengthM * 1000)} mm`;
    cautions.push(`A length of ${length} is outside real strings (about ${PLAUSIBLE.lengthM.min * 1000} mm to ${PLAUSIBLE.lengthM.max} m).`);
  }
  if (linearDensityKgPerM < PLAUSIBLE.linearDensityKgPerM.min || linearDensityKgPerM > PLAUSIBLE.linearDensityKgPerM.max) {
    cautions.push(
      `A linear density of ${plain(linearDensityKgPerM * 1000)} g/m is outside real strings (about ${PLAUSIBLE.linearDensityKgPerM.min * 1000} to ${PLAUSIBLE.linearDensityKgPerM.max * 1000} g/m).`,
    );
  }
  return cautions;
}
