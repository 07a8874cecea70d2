/**
 * OKLab and OKLCH to and from sRGB, for colour scales computed in code. OKLab is Björn Ottosson's
 * perceptual colour space ("A perceptual color space for image processing", 2020); the matrices
 * below are the ones published there (transcribed from memory; the tests check that the two
 * directions invert each other and that white has L = 1 with no chroma).
 */

export interface Oklab {
  /** Perceived lightness, 0 (black) … 1 (white). */
  l: number;
  a: number;
  b: number;
}

/** Linear-light sRGB, each channel 0…1 when in gamut. */
export interface LinearRgb {
  r: number;
  g: number;
  b: number;
}

export function oklabToLinearSrgb({ l, a, b }: Oklab): LinearRgb {
  const lCone = (l + 0.3963377774 * a + 0.2158037573 * b) ** 3;
  const mCone = (l - 0.1055613458 * a - 0.0638541728 * b) ** 3;
  const sCone = (l - 0.0894841775 * a - 1.291485548 * b) ** 3;
  return {
    r: 4.0767416621 * lCone - 3.3077115913 * mCone + 0.2309699292 * sCone,
    g: -1.2684380046 * lCone + 2.6097574011 * mCone - 0.3413193965 * sCone,
    b: -0.0041960863 * lCone - 0.7034186147 * mCone + 1.707614701 * sCone,
  };
}

export function linearSrgbToOklab({ r, g, b }: LinearRgb): Oklab {
  const lCone = Math.cbrt(0.4122214708 * r + 0.5363325363 * g + 0.0514459929 * b);
  const mCone = Math.cbrt(0.2119034982 * r + 0.6806995451 * g + 0.1073969566 * b);
  const sCone = Math.cbrt(0.0883024619 * r + 0.2817188376 * g + 0.6299787005 * b);
  return {
    l: 0.2104542553 * lCone + 0.793617785 * mCone - 0.0040720468 * sCone,
    a: 1.9779984951 * lCone - 2.428592205 * mCone + 0.4505937099 * sCone,
    b: 0.0259040371 * lCone + 0.7827717662 * mCone - 0.808675766 * sCone,
  };
}

/** OKLCH (lightness, chroma, hue in degrees) as OKLab. */
export function oklchToOklab(l: number, chroma: number, hueDeg: number): Oklab {
  const hueRad = (hueDeg * Math.PI) / 180;
  return { l, a: chroma * Math.cos(hueRad), b: chroma * Math.sin(hueRad) };
}

const GAMUT_EPSILON = 1e-6;

function inSrgbGamut({ r, g, b }: LinearRgb): boolean {
  return [r, g, b].every((channel) => channel >= -GAMUT_EPSILON && channel <= 1 + GAMUT_EPSILON);
}

/**
 * The OKLCH colour nearest in chroma to the one asked for that sRGB can show: lightness and hue are
 * kept, chroma is reduced by bisection until every channel lies in 0…1. Keeping lightness is what
 * keeps a lightness ramp monotonic after gamut mapping.
 */
export function oklchInSrgbGamut(l: number, chroma: number, hueDeg: number): Oklab {
  if (inSrgbGamut(oklabToLinearSrgb(oklchToOklab(l, chroma, hueDeg)))) return oklchToOklab(l, chroma, hueDeg);
  let inside = 0;
  let outside = chroma;
  for (let step = 0; step < 24; step++) {
    const middle = (inside + outside) / 2;
    if (inSrgbGamut(oklabToLinearSrgb(oklchToOklab(l, middle, hueDeg)))) inside = middle;
    else outside = middle;
  }
  return oklchToOklab(l, inside, hueDeg);
}

/** The sRGB transfer function (IEC 61966-2-1): linear light to the encoded 0…1 value. */
function encodeSrgb(linear: number): number {
  const clamped = Math.min(1, Math.max(0, linear));
  return clamped <= 0.0031308 ? 12.92 * clamped : 1.055 * clamped ** (1 / 2.4) - 0.055;
}

/** Inverse of `encodeSrgb`. */
function decodeSrgb(encoded: number): number {
  return encoded <= 0.04045 ? encoded / 12.92 : ((encoded + 0.055) / 1.055) ** 2.4;
}

/** An OKLab colour as a CSS hex colour, #rrggbb (channels clamped to the sRGB gamut). */
export function oklabToCssHex(colour: Oklab): string {
  const { r, g, b } = oklabToLinearSrgb(colour);
  return `#${[r, g, b]
    .map((channel) =>
      Math.round(encodeSrgb(channel) * 255)
        .toString(16)
        .padStart(2, '0'),
    )
    .join('')}`;
}

/** A CSS hex colour (#rrggbb) as linear-light sRGB. */
export function cssHexToLinearSrgb(hex: string): LinearRgb {
  const match = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (!match) throw new Error(`not a #rrggbb colour: ${hex}`);
  const [r, g, b] = match.slice(1).map((pair) => decodeSrgb(parseInt(pair, 16) / 255));
  return { r, g, b };
}
