import { assert } from '../../../../shared/assert';

/** Tick marks for a scale bar: the step, the tick values, and how many decimals label them exactly. */
export interface NiceTicks {
  stepMm: number;
  /** Every multiple of the step inside the range (ends included within 10⁻⁹ of a step), ascending. */
  valuesMm: number[];
  /** Decimals that print every tick exactly: max(0, −k) for a step of m·10^k. */
  fractionDigits: number;
}

/** 10^k as the nearest double, read from its decimal literal (exact for |k| ≤ 22, unlike repeated multiplication). */
function powerOfTen(k: number): number {
  return Number(`1e${k}`);
}

/** m·10^k·i as the double nearest the decimal value, so 0.2 comes out as the literal 0.2, not 0.20000000000000004. */
function decimalMultiple(i: number, m: number, k: number): number {
  return (k >= 0 ? i * m * powerOfTen(k) : (i * m) / powerOfTen(-k)) + 0; // + 0 turns −0 into 0
}

/**
 * Round tick values for a scale bar in millimetres: steps of 1, 2 or 5 × 10^k.
 *
 * The raw step is s = (high − low) / approxCount. Written as s = f·10^k with 1 ≤ f < 10, the nice
 * multiple m is the one of 1, 2, 5, 10 nearest to f on a log scale (thresholds at the geometric
 * means √2, √10 and √50), so the tick count lands within about √2.5 of approxCount + 1.
 */
export function niceTicks(rangeMm: readonly [lowMm: number, highMm: number], approxCount: number): NiceTicks {
  const [lowMm, highMm] = rangeMm;
  assert(Number.isFinite(lowMm) && Number.isFinite(highMm) && lowMm < highMm, 'niceTicks needs a finite range with low < high');
  assert(Number.isFinite(approxCount) && approxCount >= 1, 'niceTicks needs approxCount >= 1');

  const rawStep = (highMm - lowMm) / approxCount;
  // toExponential gives the decade and mantissa from one correctly rounded decimal, so no log10 edge cases.
  const [mantissaText, exponentText] = rawStep.toExponential().split('e');
  const fraction = Number(mantissaText);
  let k = Number(exponentText);
  let m: number;
  if (fraction < Math.SQRT2) m = 1;
  else if (fraction < Math.sqrt(10)) m = 2;
  else if (fraction < Math.sqrt(50)) m = 5;
  else {
    m = 1;
    k += 1;
  }

  const stepMm = decimalMultiple(1, m, k);
  const first = Math.ceil(lowMm / stepMm - 1e-9);
  const last = Math.floor(highMm / stepMm + 1e-9);
  const valuesMm: number[] = [];
  for (let i = first; i <= last; i++) valuesMm.push(decimalMultiple(i, m, k));
  return { stepMm, valuesMm, fractionDigits: Math.max(0, -k) };
}
