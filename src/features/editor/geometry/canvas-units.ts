import type { Metres } from '../../../../shared/units';

declare const canvasUnit: unique symbol;

/**
 * A canvas coordinate in CSS pixels. Branded, so a metre value cannot be passed where pixels are
 * wanted without a visible `asPixels`. Arithmetic on it gives a plain number again.
 */
export type Pixels = number & { readonly [canvasUnit]: 'px' };

/**
 * A position or displacement in metres as the canvas functions take it: any plain number (patch
 * points and `Metres` values pass as they are), but never a `Pixels`, so a pixel coordinate cannot
 * slip in where metres are wanted either.
 */
export type PlainMetres = Metres & { readonly [canvasUnit]?: 'm' };

/** Marks a number read from the canvas (a pointer event, a layout size) as pixels. */
export function asPixels(value: number): Pixels {
  return value as Pixels;
}

/** One point on the canvas, [x, y] in pixels, y growing downward as on every canvas. */
export type PixelPoint = readonly [Pixels, Pixels];
