import type { Decibels, Hertz, Seconds } from '../../../../shared/units';
import { formatSi, MINUS } from './si-prefix';

/** A frequency in hertz to 0.1 Hz, the way the results write it: "220.0 Hz", "4400.0 Hz". */
export function formatHz(frequencyHz: Hertz): string {
  return `${frequencyHz.toFixed(1)} Hz`;
}

/** A level in dB to 0.1 dB with a true minus sign: "−6.0 dB", "0.0 dB". */
export function formatDb(levelDb: Decibels): string {
  const text = Math.abs(levelDb).toFixed(1);
  return `${levelDb < 0 && text !== '0.0' ? MINUS : ''}${text} dB`;
}

/** A decay time: "2.10 s", "850 ms", "1230 s"; "no loss" for a mode that never decays. */
export function formatT60(t60S: Seconds | null): string {
  return t60S === null || !Number.isFinite(t60S) ? 'no loss' : formatSi(t60S, 's', { maxExponent: 0 });
}

/** A plain count with thousands separators: "4,096". */
export function formatCount(count: number): string {
  return count.toLocaleString('en');
}
