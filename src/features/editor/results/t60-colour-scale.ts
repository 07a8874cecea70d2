import type { Seconds } from '../../../../shared/units';
import { oklabToCssHex, oklchInSrgbGamut } from './oklab-colour';

/** The decay times the colour scale spans; shorter and longer ones take its end colours. */
export const T60_SCALE_MIN_S: Seconds = 0.01;
export const T60_SCALE_MAX_S: Seconds = 30;

/**
 * Our decay-time ramp, computed in OKLCH: lightness rises evenly from dark to light (so the order
 * reads in grey too), while the hue turns from our ember towards our brass. Chroma is as much as
 * sRGB allows up to `RAMP_CHROMA`, found per step with the lightness and hue kept.
 */
const RAMP_LIGHTNESS_FROM = 0.4;
const RAMP_LIGHTNESS_TO = 0.9;
const RAMP_HUE_FROM_DEG = 28;
const RAMP_HUE_TO_DEG = 96;
const RAMP_CHROMA = 0.16;
const RAMP_STEPS = 256;

/** Lightness of the ramp at position 0…1 (linear, so strictly increasing). */
export function rampLightness(position: number): number {
  return RAMP_LIGHTNESS_FROM + (RAMP_LIGHTNESS_TO - RAMP_LIGHTNESS_FROM) * clampUnit(position);
}

function rampColour(position: number): string {
  const t = clampUnit(position);
  return oklabToCssHex(oklchInSrgbGamut(rampLightness(t), RAMP_CHROMA, RAMP_HUE_FROM_DEG + (RAMP_HUE_TO_DEG - RAMP_HUE_FROM_DEG) * t));
}

/** The ramp sampled once, at load: looking a colour up costs nothing per mode and per result. */
const RAMP: readonly string[] = Array.from({ length: RAMP_STEPS }, (_, step) => rampColour(step / (RAMP_STEPS - 1)));

function clampUnit(value: number): number {
  return value < 0 ? 0 : value > 1 ? 1 : value;
}

/**
 * Where a decay time sits on the scale, 0…1: log10(T60) between `T60_SCALE_MIN_S` and
 * `T60_SCALE_MAX_S`, clamped. A mode with no loss (T60 null or infinite) sits at 1.
 */
export function t60ScalePosition(t60S: Seconds | null): number {
  if (t60S === null || !(t60S < Infinity)) return 1;
  if (!(t60S > 0)) return 0;
  return clampUnit(Math.log(t60S / T60_SCALE_MIN_S) / Math.log(T60_SCALE_MAX_S / T60_SCALE_MIN_S));
}

/** The colour at a position 0…1 of the ramp, as a CSS colour (#rrggbb). */
export function rampColourAt(position: number): string {
  return RAMP[Math.round(clampUnit(position) * (RAMP_STEPS - 1))];
}

/** The colour of a decay time: short decays are dark ember, long ones light brass. */
export function t60Colour(t60S: Seconds | null): string {
  return rampColourAt(t60ScalePosition(t60S));
}
