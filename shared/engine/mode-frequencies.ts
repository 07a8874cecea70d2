import type { Hertz, Inharmonicity, Metres, MetresPerSecond, Newtons, KilogramsPerMetre, RadiansPerMetre } from '../units';

export interface StringProperties {
  lengthM: Metres;
  tensionN: Newtons;
  linearDensityKgPerM: KilogramsPerMetre;
  inharmonicityB: Inharmonicity;
}

/** Transverse wave speed c = √(T/μ) (Mersenne; Fletcher & Rossing, The Physics of Musical Instruments, ch. 2). */
export function waveSpeedMPerS(string: Pick<StringProperties, 'tensionN' | 'linearDensityKgPerM'>): MetresPerSecond {
  return Math.sqrt(string.tensionN / string.linearDensityKgPerM);
}

/** Fundamental of the flexible string, f0 = c / (2L) (Mersenne's laws). */
export function fundamentalFrequencyHz(string: Pick<StringProperties, 'lengthM' | 'tensionN' | 'linearDensityKgPerM'>): Hertz {
  return waveSpeedMPerS(string) / (2 * string.lengthM);
}

/** Wavenumber of mode n on a string pinned at both ends: k_n = nπ/L. */
export function modeWavenumber(lengthM: Metres, n: number): RadiansPerMetre {
  return (n * Math.PI) / lengthM;
}

/**
 * Frequency of mode n of a stiff string with pinned ends: f_n = n·f0·√(1 + B n²)
 * (H. Fletcher, JASA 36(1), 1964). With B = 0 this is the harmonic series n·f0.
 */
export function modeFrequencyHz(string: StringProperties, n: number): Hertz {
  return n * fundamentalFrequencyHz(string) * Math.sqrt(1 + string.inharmonicityB * n * n);
}

/**
 * Number of modes kept for a render: every n ≤ maxModes whose frequency lies below half the
 * sample rate. f_n rises with n (B ≥ 0), so the kept modes are 1…count.
 */
export function keptModeCount(string: StringProperties, maxModes: number, sampleRateHz: Hertz): number {
  const nyquistHz = sampleRateHz / 2;
  let count = 0;
  while (count < maxModes && modeFrequencyHz(string, count + 1) < nyquistHz) count++;
  return count;
}
