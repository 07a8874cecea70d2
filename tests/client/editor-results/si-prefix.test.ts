import { describe, expect, it } from 'vitest';
import { formatSi } from '../../../src/features/editor/results/si-prefix';

describe('formatSi', () => {
  it('picks the prefix that puts the mantissa in 1…999, to three significant digits', () => {
    expect(formatSi(0.0123, 'J')).toBe('12.3 mJ');
    expect(formatSi(2.9736e-4, 'J')).toBe('297 µJ');
    expect(formatSi(4.2e-7, 'J')).toBe('420 nJ');
    expect(formatSi(1.5e-12, 'J')).toBe('1.50 pJ');
    expect(formatSi(1, 'J')).toBe('1.00 J');
    expect(formatSi(12.5, 'N')).toBe('12.5 N');
    expect(formatSi(48000, 'Hz')).toBe('48.0 kHz');
    expect(formatSi(0.001, 'J')).toBe('1.00 mJ');
  });

  it('rounds before choosing the prefix: 0.9996 J is 1.00 J, not 1000 mJ', () => {
    expect(formatSi(0.9996, 'J')).toBe('1.00 J');
    expect(formatSi(999.6e-6, 'J')).toBe('1.00 mJ');
    expect(formatSi(0.0009994, 'J')).toBe('999 µJ');
  });

  it('writes zero, negatives (with a true minus), non-finite values and other precisions', () => {
    expect(formatSi(0, 'J')).toBe('0 J');
    expect(formatSi(-0.0025, 'J')).toBe('−2.50 mJ');
    expect(formatSi(Infinity, 's')).toBe('∞ s');
    expect(formatSi(NaN, 'J')).toBe('— J');
    expect(formatSi(0.012345, 'J', { significantDigits: 2 })).toBe('12 mJ');
    expect(formatSi(0.012345, 'J', { significantDigits: 4 })).toBe('12.35 mJ');
  });

  it('can stop at a largest prefix, so long times read in seconds', () => {
    expect(formatSi(1234, 's', { maxExponent: 0 })).toBe('1230 s');
    expect(formatSi(0.85, 's', { maxExponent: 0 })).toBe('850 ms');
    expect(formatSi(12.56, 's', { maxExponent: 0 })).toBe('12.6 s');
  });
});
