import { describe, expect, it } from 'vitest';
import { createCanvasScale, niceTicks } from '../../../src/features/editor/geometry/canvas-scale';
import { asPixels } from '../../../src/features/editor/geometry/canvas-units';
import { seededRandom } from '../../../shared/random/seeded-random';

const L = 0.65;
const scale = createCanvasScale({ lengthM: L, widthPx: 800, heightPx: 400, marginPx: 20, displacementRangeM: 0.005 });

describe('canvas scale: string ↔ canvas', () => {
  // Expected pixels worked out by hand from x_px = m + (x/L)(W − 2m), y_px = H/2 − (y/r)(H/2 − m) (derived).
  it('puts the supports at the margins and x = L/2 on the centre pixel, exactly', () => {
    expect(scale.xToPx(0)).toBe(20);
    expect(scale.xToPx(L)).toBe(780);
    expect(scale.xToPx(L / 2)).toBe(400);
    expect(scale.pxToX(asPixels(20))).toBe(0);
    expect(scale.pxToX(asPixels(780))).toBe(L);
    expect(scale.pxToX(asPixels(400))).toBe(L / 2);
  });

  it('draws +y upward: y = 0 on the centre line, +range at the top margin, −range at the bottom one', () => {
    expect(scale.yToPx(0)).toBe(200);
    expect(scale.yToPx(0.005)).toBe(20);
    expect(scale.yToPx(-0.005)).toBe(380);
    expect(scale.yToPx(0.0025)).toBe(110);
    expect(scale.pxToY(asPixels(20))).toBe(0.005);
    expect(scale.pxToY(asPixels(380))).toBe(-0.005);
  });

  it('scales the axes separately: 760 px per 0.65 m across, 180 px per 5 mm up (derived)', () => {
    expect(scale.pixelsPerMetreX).toBeCloseTo(760 / 0.65, 9);
    expect(scale.pixelsPerMetreY).toBeCloseTo(180 / 0.005, 6);
  });

  it('round-trips metres → pixels → metres and back to within a few units in the last place', () => {
    const random = seededRandom(71);
    const eps = Number.EPSILON;
    for (let i = 0; i < 2000; i++) {
      const xM = (random() * 1.2 - 0.1) * L;
      const yM = (random() * 2.4 - 1.2) * 0.005;
      expect(Math.abs(scale.pxToX(scale.xToPx(xM)) - xM)).toBeLessThanOrEqual(4 * eps * L);
      expect(Math.abs(scale.pxToY(scale.yToPx(yM)) - yM)).toBeLessThanOrEqual(4 * eps * 0.005);
      const xPx = asPixels(random() * 800);
      const yPx = asPixels(random() * 400);
      expect(Math.abs(scale.xToPx(scale.pxToX(xPx)) - xPx)).toBeLessThanOrEqual(4 * eps * 800);
      expect(Math.abs(scale.yToPx(scale.pxToY(yPx)) - yPx)).toBeLessThanOrEqual(4 * eps * 400);
    }
  });

  it('refuses a canvas with no drawable area or a string with no length (a bug in the caller)', () => {
    const good = { lengthM: L, widthPx: 800, heightPx: 400, marginPx: 20, displacementRangeM: 0.005 };
    expect(() => createCanvasScale({ ...good, widthPx: 0 })).toThrow(/widthPx/);
    expect(() => createCanvasScale({ ...good, heightPx: 40 })).toThrow(/heightPx/);
    expect(() => createCanvasScale({ ...good, lengthM: 0 })).toThrow(/lengthM/);
    expect(() => createCanvasScale({ ...good, displacementRangeM: Number.NaN })).toThrow(/displacementRangeM/);
    expect(() => createCanvasScale({ ...good, marginPx: -1 })).toThrow(/marginPx/);
  });

  it('keeps metres and pixels apart in the types', () => {
    // These lines only compile because of the @ts-expect-error marks: `npm run typecheck` fails if a mix stops being an error.
    // @ts-expect-error a plain number (metres) is not pixels
    scale.pxToX(0.3);
    // @ts-expect-error pixels are not metres
    scale.xToPx(scale.xToPx(0.3));
    expect(scale.xToPx(scale.pxToX(scale.xToPx(0.3)))).toBeCloseTo(scale.xToPx(0.3), 9);
  });
});

describe('niceTicks: scale-bar ticks of 1, 2 or 5 × 10^k mm', () => {
  // Expected values worked out by hand from the rule in nice-ticks.ts (derived).
  it.each([
    [[-5, 5], 5, 2, [-4, -2, 0, 2, 4], 0],
    [[0, 1], 5, 0.2, [0, 0.2, 0.4, 0.6, 0.8, 1], 1],
    [[0, 3], 4, 1, [0, 1, 2, 3], 0],
    [[0, 7], 2, 5, [0, 5], 0],
    [[0, 250], 5, 50, [0, 50, 100, 150, 200, 250], 0],
    [[0, 0.035], 4, 0.01, [0, 0.01, 0.02, 0.03], 2],
    [[-0.3, 0.3], 6, 0.1, [-0.3, -0.2, -0.1, 0, 0.1, 0.2, 0.3], 1],
    [[1.3, 2.9], 4, 0.5, [1.5, 2, 2.5], 1],
  ] as const)('range %j, about %i ticks: step %d, ticks %j', (range, count, step, values, digits) => {
    const ticks = niceTicks(range, count);
    expect(ticks.stepMm).toBe(step);
    expect(ticks.valuesMm).toEqual(values);
    expect(ticks.fractionDigits).toBe(digits);
  });

  it('always steps by 1, 2 or 5 × 10^k, gives round decimals, no −0, and about the asked number of ticks', () => {
    const random = seededRandom(5);
    for (let i = 0; i < 500; i++) {
      const low = (random() - 0.5) * 10 ** (random() * 8 - 4);
      const high = low + 10 ** (random() * 8 - 4);
      const count = 1 + Math.floor(random() * 12);
      const { stepMm, valuesMm, fractionDigits } = niceTicks([low, high], count);
      const [mantissa] = stepMm.toExponential().split('e');
      expect(['1', '2', '5']).toContain(mantissa);
      // The step lies within (0.63, 1.59] of the raw step (span / count), so the count within these bounds (derived).
      expect(valuesMm.length).toBeGreaterThanOrEqual(Math.floor(count / 1.59));
      expect(valuesMm.length).toBeLessThanOrEqual(Math.ceil(count / 0.63) + 1);
      for (const value of valuesMm) {
        expect(value).toBeGreaterThanOrEqual(low - 1e-9 * stepMm);
        expect(value).toBeLessThanOrEqual(high + 1e-9 * stepMm);
        expect(Object.is(value, -0)).toBe(false);
        expect(Number(value.toFixed(fractionDigits))).toBe(value);
      }
    }
  });

  it('refuses an empty range or no ticks', () => {
    expect(() => niceTicks([1, 1], 5)).toThrow();
    expect(() => niceTicks([0, 1], 0)).toThrow();
  });
});
