import { describe, expect, it } from 'vitest';
import {
  cssHexToLinearSrgb,
  linearSrgbToOklab,
  oklabToCssHex,
  oklabToLinearSrgb,
  oklchInSrgbGamut,
} from '../../../src/features/editor/results/oklab-colour';
import { rampColourAt, t60Colour, t60ScalePosition, T60_SCALE_MAX_S, T60_SCALE_MIN_S } from '../../../src/features/editor/results/t60-colour-scale';

/** Relative luminance Y of linear sRGB (ITU-R BT.709 primaries, IEC 61966-2-1), an independent check of lightness order. */
function luminance({ r, g, b }: { r: number; g: number; b: number }): number {
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

describe('OKLab (Ottosson 2020, matrices transcribed from memory)', () => {
  it('maps white to L = 1 with no chroma and black to L = 0', () => {
    const white = linearSrgbToOklab({ r: 1, g: 1, b: 1 });
    expect(white.l).toBeCloseTo(1, 4);
    expect(white.a).toBeCloseTo(0, 4);
    expect(white.b).toBeCloseTo(0, 4);
    expect(linearSrgbToOklab({ r: 0, g: 0, b: 0 }).l).toBeCloseTo(0, 9);
  });

  it('round-trips: sRGB → OKLab → sRGB returns the colour within 1e-6', () => {
    for (const colour of [
      { r: 0.2, g: 0.5, b: 0.9 },
      { r: 0.9, g: 0.1, b: 0.05 },
      { r: 0.03, g: 0.7, b: 0.4 },
    ]) {
      const back = oklabToLinearSrgb(linearSrgbToOklab(colour));
      expect(back.r).toBeCloseTo(colour.r, 6);
      expect(back.g).toBeCloseTo(colour.g, 6);
      expect(back.b).toBeCloseTo(colour.b, 6);
    }
  });

  it('reduces chroma, keeping lightness, until the colour fits sRGB', () => {
    const mapped = oklchInSrgbGamut(0.9, 0.4, 30);
    expect(mapped.l).toBe(0.9);
    const { r, g, b } = oklabToLinearSrgb(mapped);
    for (const channel of [r, g, b]) {
      expect(channel).toBeGreaterThanOrEqual(-1e-6);
      expect(channel).toBeLessThanOrEqual(1 + 1e-6);
    }
    expect(Math.hypot(mapped.a, mapped.b)).toBeLessThan(0.4);
  });

  it('writes and reads #rrggbb', () => {
    expect(oklabToCssHex({ l: 1, a: 0, b: 0 })).toBe('#ffffff');
    expect(oklabToCssHex({ l: 0, a: 0, b: 0 })).toBe('#000000');
    expect(cssHexToLinearSrgb('#ffffff')).toEqual({ r: 1, g: 1, b: 1 });
    expect(() => cssHexToLinearSrgb('teal')).toThrow();
  });
});

describe('decay-time colour scale', () => {
  it('places T60 on a log scale from 10 ms to 30 s, clamped, with lossless modes at the long end', () => {
    expect(t60ScalePosition(T60_SCALE_MIN_S)).toBe(0);
    expect(t60ScalePosition(T60_SCALE_MAX_S)).toBeCloseTo(1, 12);
    expect(t60ScalePosition(Math.sqrt(T60_SCALE_MIN_S * T60_SCALE_MAX_S))).toBeCloseTo(0.5, 12);
    expect(t60ScalePosition(0.001)).toBe(0);
    expect(t60ScalePosition(1000)).toBe(1);
    expect(t60ScalePosition(null)).toBe(1);
    expect(t60ScalePosition(Infinity)).toBe(1);
    expect(t60Colour(null)).toBe(t60Colour(T60_SCALE_MAX_S));
  });

  it('returns CSS colours whose OKLab lightness, and luminance, rise strictly with decay time', () => {
    const t60s = Array.from({ length: 48 }, (_, i) => T60_SCALE_MIN_S * (T60_SCALE_MAX_S / T60_SCALE_MIN_S) ** (i / 47));
    const colours = t60s.map(t60Colour);
    for (const colour of colours) expect(colour).toMatch(/^#[0-9a-f]{6}$/);
    const lightness = colours.map((colour) => linearSrgbToOklab(cssHexToLinearSrgb(colour)).l);
    const luminances = colours.map((colour) => luminance(cssHexToLinearSrgb(colour)));
    for (let i = 1; i < colours.length; i++) {
      expect(lightness[i]).toBeGreaterThan(lightness[i - 1]);
      expect(luminances[i]).toBeGreaterThan(luminances[i - 1]);
    }
    // From dark to light, with a clear span: the order reads even without colour vision.
    expect(lightness[0]).toBeCloseTo(0.4, 1);
    expect(lightness[lightness.length - 1]).toBeCloseTo(0.9, 1);
  });

  it('keeps its lightness steps even: no step is more than twice the mean', () => {
    const lightness = Array.from({ length: 33 }, (_, i) => linearSrgbToOklab(cssHexToLinearSrgb(rampColourAt(i / 32))).l);
    const steps = lightness.slice(1).map((l, i) => l - lightness[i]);
    const mean = (lightness[32] - lightness[0]) / 32;
    for (const step of steps) {
      expect(step).toBeGreaterThan(0);
      expect(step).toBeLessThan(2 * mean);
    }
  });
});
