import { assert } from '../../../../shared/assert';
import type { Metres } from '../../../../shared/units';
import { asPixels, type Pixels, type PlainMetres } from './canvas-units';

export { niceTicks, type NiceTicks } from './nice-ticks';

export interface CanvasScaleOptions {
  /** The string's length L: x runs from 0 (left support) to L (right support). */
  lengthM: Metres;
  /** The canvas's size in CSS pixels. */
  widthPx: number;
  heightPx: number;
  /** Empty border on every side; the string is drawn inside it. */
  marginPx: number;
  /** The displacement drawn at the top edge of the drawable area (and its negative at the bottom). */
  displacementRangeM: Metres;
}

/**
 * The mapping between the string and the canvas. Horizontally the string's length fills the
 * drawable width; vertically displacement has its own, exaggerated scale (a 3 mm pluck on a 650 mm
 * string would otherwise be a pixel high), with +y drawn upward.
 */
export interface CanvasScale {
  readonly lengthM: Metres;
  readonly widthPx: number;
  readonly heightPx: number;
  readonly marginPx: number;
  readonly displacementRangeM: Metres;
  /** Drawable width / L. */
  readonly pixelsPerMetreX: number;
  /** Drawable half-height / displacementRangeM; pixelsPerMetreY / pixelsPerMetreX is the exaggeration. */
  readonly pixelsPerMetreY: number;
  /** x_px = margin + (x / L) · (width − 2·margin). */
  xToPx(xM: PlainMetres): Pixels;
  /** x = ((x_px − margin) / (width − 2·margin)) · L, the inverse of xToPx. */
  pxToX(xPx: Pixels): Metres;
  /** y_px = height/2 − (y / range) · (height/2 − margin): y = +range at the top margin, −range at the bottom. */
  yToPx(yM: PlainMetres): Pixels;
  /** y = ((height/2 − y_px) / (height/2 − margin)) · range, the inverse of yToPx. */
  pxToY(yPx: Pixels): Metres;
}

/**
 * Builds the string ↔ canvas mapping. Each map is written as a fraction of its span times the
 * other span (x / L · drawable), so the ends and the middle land on exact pixels (x = L/2 gives
 * width/2 exactly for whole-pixel sizes) and a round trip differs from the start by a few units in
 * the last place only.
 *
 * A canvas that is not laid out yet (zero size, or smaller than its margins) has no scale: the
 * caller draws nothing until it has a size. Passing one is a bug and throws.
 */
export function createCanvasScale(options: CanvasScaleOptions): CanvasScale {
  const { lengthM, widthPx, heightPx, marginPx, displacementRangeM } = options;
  assert(Number.isFinite(lengthM) && lengthM > 0, 'canvas scale: lengthM must be finite and > 0');
  assert(Number.isFinite(displacementRangeM) && displacementRangeM > 0, 'canvas scale: displacementRangeM must be finite and > 0');
  assert(Number.isFinite(marginPx) && marginPx >= 0, 'canvas scale: marginPx must be finite and >= 0');
  assert(Number.isFinite(widthPx) && widthPx > 2 * marginPx, 'canvas scale: widthPx must be finite and > 2 · marginPx');
  assert(Number.isFinite(heightPx) && heightPx > 2 * marginPx, 'canvas scale: heightPx must be finite and > 2 · marginPx');

  const drawableWidthPx = widthPx - 2 * marginPx;
  const centreYPx = heightPx / 2;
  const halfHeightPx = centreYPx - marginPx;

  return {
    lengthM,
    widthPx,
    heightPx,
    marginPx,
    displacementRangeM,
    pixelsPerMetreX: drawableWidthPx / lengthM,
    pixelsPerMetreY: halfHeightPx / displacementRangeM,
    xToPx: (xM) => asPixels(marginPx + (xM / lengthM) * drawableWidthPx),
    pxToX: (xPx) => ((xPx - marginPx) / drawableWidthPx) * lengthM,
    yToPx: (yM) => asPixels(centreYPx - (yM / displacementRangeM) * halfHeightPx),
    pxToY: (yPx) => ((centreYPx - yPx) / halfHeightPx) * displacementRangeM,
  };
}
