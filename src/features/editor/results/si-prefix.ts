/** The SI prefixes this app writes, by power of 1000. */
const PREFIXES: ReadonlyArray<{ exponent: number; symbol: string }> = [
  { exponent: -24, symbol: 'y' },
  { exponent: -21, symbol: 'z' },
  { exponent: -18, symbol: 'a' },
  { exponent: -15, symbol: 'f' },
  { exponent: -12, symbol: 'p' },
  { exponent: -9, symbol: 'n' },
  { exponent: -6, symbol: 'µ' },
  { exponent: -3, symbol: 'm' },
  { exponent: 0, symbol: '' },
  { exponent: 3, symbol: 'k' },
  { exponent: 6, symbol: 'M' },
  { exponent: 9, symbol: 'G' },
  { exponent: 12, symbol: 'T' },
];

export interface SiFormatOptions {
  /** Significant digits shown (default 3). */
  significantDigits?: number;
  /** The largest prefix exponent allowed, e.g. 0 to write 1230 s rather than 1.23 ks. */
  maxExponent?: number;
}

/** The typographic minus sign, which screen readers read as "minus". */
export const MINUS = '−';

/**
 * A quantity with the SI prefix that puts its mantissa in 1 ≤ |m| < 1000, to a fixed number of
 * significant digits: 0.0123 J → "12.3 mJ", 4.2e-7 J → "420 nJ", 0 → "0 J". The rounding is done
 * before the prefix is chosen, so 0.9996 J reads "1.00 J", not "1000 mJ".
 */
export function formatSi(value: number, unit: string, { significantDigits = 3, maxExponent = 12 }: SiFormatOptions = {}): string {
  if (Number.isNaN(value)) return `— ${unit}`;
  if (!Number.isFinite(value)) return `${value < 0 ? MINUS : ''}∞ ${unit}`;
  if (value === 0) return `0 ${unit}`;
  const rounded = Number(Math.abs(value).toPrecision(significantDigits));
  const allowed = PREFIXES.filter((prefix) => prefix.exponent <= maxExponent);
  let prefix = allowed[0];
  for (const candidate of allowed) if (rounded >= 10 ** candidate.exponent * (1 - 1e-12)) prefix = candidate;
  const mantissa = rounded / 10 ** prefix.exponent;
  const digitsBeforePoint = Math.max(1, Math.floor(Math.log10(mantissa * (1 + 1e-12))) + 1);
  const text = mantissa >= 10 ** significantDigits ? mantissa.toFixed(0) : mantissa.toFixed(Math.max(0, significantDigits - digitsBeforePoint));
  return `${value < 0 ? MINUS : ''}${text} ${prefix.symbol}${unit}`;
}
