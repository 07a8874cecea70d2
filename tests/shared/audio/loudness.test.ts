import { describe, expect, it } from 'vitest';
import { gainFromDecibels } from '../../../shared/audio/decibels';
import { FRONT_CHANNEL_WEIGHT, integratedLoudness } from '../../../shared/audio/integrated-loudness';
import { type Biquad, kWeight, kWeightingCoefficients } from '../../../shared/audio/k-weighting';
import { loudnessGain } from '../../../shared/audio/normalize-loudness';
import { truePeak, truePeakOversampling } from '../../../shared/audio/true-peak';
import { seededRandom } from '../../../shared/random/seeded-random';

// Scenario: Kestrel Lantern Audio checks its render loudness before delivery.

/** A sine of `amplitudeDbfs` peak level (0 dBFS = amplitude 1). */
function sine(frequencyHz: number, amplitudeDbfs: number, seconds: number, sampleRateHz: number, phase = 0): Float64Array {
  const n = Math.round(seconds * sampleRateHz);
  const amplitude = gainFromDecibels(amplitudeDbfs);
  const out = new Float64Array(n);
  const step = (2 * Math.PI * frequencyHz) / sampleRateHz;
  for (let i = 0; i < n; i++) out[i] = amplitude * Math.sin(step * i + phase);
  return out;
}

/** A 1 kHz sine at each (seconds, dBFS) in turn, phase-continuous. */
function sineSegments(segments: ReadonlyArray<readonly [number, number]>, sampleRateHz: number): Float64Array {
  const total = segments.reduce((sum, [seconds]) => sum + Math.round(seconds * sampleRateHz), 0);
  const out = new Float64Array(total);
  const step = (2 * Math.PI * 1000) / sampleRateHz;
  let i = 0;
  for (const [seconds, dbfs] of segments) {
    const amplitude = gainFromDecibels(dbfs);
    const end = i + Math.round(seconds * sampleRateHz);
    for (; i < end; i++) out[i] = amplitude * Math.sin(step * i);
  }
  return out;
}

/** |H(e^{jω})| of a cascade of biquads, dB. */
function responseDb(stages: ReadonlyArray<Biquad>, frequencyHz: number, sampleRateHz: number): number {
  const w = (2 * Math.PI * frequencyHz) / sampleRateHz;
  let gain = 1;
  for (const { b, a } of stages) {
    const polynomial = (c: readonly number[]) =>
      Math.hypot(c[0] + c[1] * Math.cos(w) + c[2] * Math.cos(2 * w), -c[1] * Math.sin(w) - c[2] * Math.sin(2 * w));
    gain *= polynomial(b) / polynomial(a);
  }
  return 20 * Math.log10(gain);
}

function kResponseDb(frequencyHz: number, sampleRateHz: number): number {
  const { shelf, highPass } = kWeightingCoefficients(sampleRateHz);
  return responseDb([shelf, highPass], frequencyHz, sampleRateHz);
}

/**
 * Slow reference for BS.1770-4 Annex 1 gating, written straight from its formulas: every block sums its
 * own samples, and the gates are applied to per-channel means. Same block grid as the code under
 * test (block j from round(j·fs/10) to round((j + 4)·fs/10)).
 */
function slowIntegratedLoudness(channels: Float64Array[], sampleRateHz: number, weights: number[]) {
  const weighted = channels.map((channel) => kWeight(channel, sampleRateHz));
  const n = channels[0].length;
  const edge = (k: number) => Math.round((k * sampleRateHz) / 10);
  const z: number[][] = [];
  for (let j = 0; edge(j + 4) <= n; j++) {
    const start = edge(j);
    const end = edge(j + 4);
    z.push(
      weighted.map((y) => {
        let sum = 0;
        for (let i = start; i < end; i++) sum += y[i] * y[i];
        return sum / (end - start);
      }),
    );
  }
  const loudnessOf = (zs: number[]) => -0.691 + 10 * Math.log10(zs.reduce((sum, zi, i) => sum + weights[i] * zi, 0));
  const gatedMean = (blocks: number[][]) =>
    loudnessOf(weights.map((_, i) => blocks.reduce((sum, zj) => sum + zj[i], 0) / blocks.length));
  const absolute = z.filter((zj) => loudnessOf(zj) > -70);
  if (absolute.length === 0) return { integratedLufs: -Infinity, gatedBlockCount: 0, blockCount: z.length };
  const relativeGate = gatedMean(absolute) - 10;
  const both = z.filter((zj) => loudnessOf(zj) > -70 && loudnessOf(zj) > relativeGate);
  return { integratedLufs: gatedMean(both), gatedBlockCount: both.length, blockCount: z.length };
}

describe('K-weighting (ITU-R BS.1770-4)', () => {
  it('derived 48 kHz coefficients equal the published ones within 1e-8 (ITU-R BS.1770-4, Tables 1 and 2)', () => {
    const { shelf, highPass } = kWeightingCoefficients(48000);
    const published = {
      shelf: { b: [1.53512485958697, -2.69169618940638, 1.19839281085285], a: [1, -1.69065929318241, 0.73248077421585] },
      highPass: { b: [1, -2, 1], a: [1, -1.99004745483398, 0.99007225036621] },
    };
    for (const [derived, table] of [
      [shelf, published.shelf],
      [highPass, published.highPass],
    ] as const) {
      for (let i = 0; i < 3; i++) {
        expect(Math.abs(derived.b[i] - table.b[i])).toBeLessThan(1e-8);
        expect(Math.abs(derived.a[i] - table.a[i])).toBeLessThan(1e-8);
      }
    }
  });

  it('gains ≈ +0.69 dB at 997 Hz and 1 kHz at 44.1 and 96 kHz, which the −0.691 offset cancels (derived)', () => {
    for (const rate of [44100, 48000, 96000]) {
      // 0.690 / 0.691 / 0.695 dB at 997 Hz, 0.697 / 0.698 / 0.702 dB at 1 kHz (derived).
      expect(Math.abs(kResponseDb(997, rate) - 0.691)).toBeLessThan(0.005);
      expect(Math.abs(kResponseDb(1000, rate) - 0.691)).toBeLessThan(0.015);
    }
  });

  it('has the 48 kHz response at 44.1 and 96 kHz within 0.05 dB at 100 Hz, 1 kHz and 10 kHz (derived: same analog prototype)', () => {
    for (const rate of [44100, 96000]) {
      for (const frequency of [100, 1000, 10000]) {
        expect(Math.abs(kResponseDb(frequency, rate) - kResponseDb(frequency, 48000))).toBeLessThan(0.05);
      }
    }
  });

  it('filters a sine to the response of its coefficients (derived)', () => {
    const rate = 48000;
    const weighted = kWeight(Float32Array.from(sine(100, 0, 2, rate)), rate);
    let peak = 0;
    for (let i = rate; i < weighted.length; i++) peak = Math.max(peak, Math.abs(weighted[i]));
    expect(20 * Math.log10(peak)).toBeCloseTo(kResponseDb(100, rate), 3);
  });
});

describe('integrated loudness (ITU-R BS.1770-4 Annex 1, EBU Tech 3341)', () => {
  it('reads a 997 Hz sine at 0 dBFS in one channel as −3.01 LKFS (ITU-R BS.1770-4)', () => {
    const result = integratedLoudness([sine(997, 0, 5, 48000)], 48000);
    expect(Math.abs(result.integratedLufs - -3.01)).toBeLessThanOrEqual(0.01);
  });

  // EBU Tech 3341 minimum-requirement cases 1–5, ±0.1 LU. Signal definitions recalled from memory,
  // not re-read at the source: 1 kHz sines, the level given per channel as sine amplitude, stereo.
  const stereo = (mono: Float64Array) => [mono, mono.slice()];
  const cases: ReadonlyArray<{ name: string; segments: ReadonlyArray<readonly [number, number]>; expected: number }> = [
    { name: 'case 1: −23 dBFS, 20 s', segments: [[20, -23]], expected: -23 },
    { name: 'case 2: −33 dBFS, 20 s', segments: [[20, -33]], expected: -33 },
    {
      name: 'case 3: −36/−23/−36 dBFS, 10/60/10 s (relative gate)',
      segments: [
        [10, -36],
        [60, -23],
        [10, -36],
      ],
      expected: -23,
    },
    {
      name: 'case 4: −72/−36/−23/−36/−72 dBFS, 10/10/60/10/10 s (absolute gate)',
      segments: [
        [10, -72],
        [10, -36],
        [60, -23],
        [10, -36],
        [10, -72],
      ],
      expected: -23,
    },
    {
      name: 'case 5: −26/−20/−26 dBFS, 20/20.1/20 s',
      segments: [
        [20, -26],
        [20.1, -20],
        [20, -26],
      ],
      expected: -23,
    },
  ];
  for (const { name, segments, expected } of cases) {
    it(`EBU Tech 3341 ${name} → ${expected} LUFS ±0.1 at 48 kHz (memory)`, () => {
      const result = integratedLoudness(stereo(sineSegments(segments, 48000)), 48000);
      expect(Math.abs(result.integratedLufs - expected)).toBeLessThanOrEqual(0.1);
    });
  }

  it('EBU Tech 3341 case 1 also reads −23.0 ±0.1 LUFS at 44.1 and 96 kHz (memory)', () => {
    for (const rate of [44100, 96000]) {
      const result = integratedLoudness(stereo(sineSegments([[20, -23]], rate)), rate);
      expect(Math.abs(result.integratedLufs - -23)).toBeLessThanOrEqual(0.1);
    }
  });

  it('reads a 1 kHz sine at −20 dBFS as −23.0 LUFS in one front channel and −20.0 in two (derived)', () => {
    const tone = sine(1000, -20, 10, 48000);
    expect(integratedLoudness([tone], 48000).integratedLufs).toBeCloseTo(-23.0, 1);
    expect(integratedLoudness([tone, tone], 48000, [FRONT_CHANNEL_WEIGHT, FRONT_CHANNEL_WEIGHT]).integratedLufs).toBeCloseTo(-20.0, 1);
  });

  it('gives −Infinity, not NaN, for silence and for a signal shorter than one block', () => {
    const silence = integratedLoudness([new Float64Array(48000), new Float64Array(48000)], 48000);
    expect(silence.integratedLufs).toBe(-Infinity);
    expect(silence.blockCount).toBe(7);
    expect(silence.gatedBlockCount).toBe(0);
    const short = integratedLoudness([sine(1000, 0, 0.399, 48000)], 48000);
    expect(short).toEqual({ integratedLufs: -Infinity, blockCount: 0, gatedBlockCount: 0 });
    expect(integratedLoudness([new Float32Array(0)], 48000).integratedLufs).toBe(-Infinity);
  });

  it('counts blocks of 400 ms every 100 ms: 1 s holds 7 blocks, 0.4 s holds 1 (ITU-R BS.1770-4 Annex 1)', () => {
    expect(integratedLoudness([sine(1000, -20, 0.4, 48000)], 48000).blockCount).toBe(1);
    expect(integratedLoudness([sine(1000, -20, 1, 44100)], 44100).blockCount).toBe(7);
  });

  it('matches a slow per-block reference within 1e-9 LU on seeded multi-level noise (derived)', () => {
    const seed = 20240611;
    const random = seededRandom(seed);
    const levelsDbfs = [-20, -31, -75, -42, -18, -62, -95, -26, -35, -22];
    for (const rate of [48000, 44100, 11025]) {
      const segment = Math.round(0.5 * rate);
      const channels = [0, 1].map((c) => {
        const out = new Float64Array(levelsDbfs.length * segment);
        for (let i = 0; i < out.length; i++) {
          const level = levelsDbfs[(Math.floor(i / segment) + 3 * c) % levelsDbfs.length];
          out[i] = gainFromDecibels(level) * (2 * random() - 1);
        }
        return out;
      });
      const weights = [1.0, 1.41];
      const fast = integratedLoudness(channels, rate, weights);
      const slow = slowIntegratedLoudness(channels, rate, weights);
      expect(fast.blockCount, `seed ${seed}, ${rate} Hz`).toBe(slow.blockCount);
      expect(fast.gatedBlockCount, `seed ${seed}, ${rate} Hz`).toBe(slow.gatedBlockCount);
      expect(fast.gatedBlockCount).toBeLessThan(fast.blockCount);
      expect(Math.abs(fast.integratedLufs - slow.integratedLufs), `seed ${seed}, ${rate} Hz`).toBeLessThan(1e-9);
    }
  });
});

describe('true peak (ITU-R BS.1770-4 Annex 2)', () => {
  it('oversamples 8× at 44.1 and 48 kHz, 4× at 88.2 and 96 kHz, 2× at 192 kHz (at least 352.8 kHz)', () => {
    expect([44100, 48000, 88200, 96000, 192000].map(truePeakOversampling)).toEqual([8, 8, 4, 4, 2]);
  });

  it('finds the peak of an fs/4 sine at 45° between samples that sit 3.01 dB lower (derived)', () => {
    for (const rate of [48000, 96000]) {
      const tone = sine(rate / 4, -6, 1, rate, Math.PI / 4);
      const result = truePeak([tone], rate);
      expect(result.samplePeakDbfs).toBeCloseTo(-6 - 3.0103, 3);
      // Reads about −5.92 dBTP: the step from silence into the tone overshoots as it is reconstructed.
      expect(Math.abs(result.truePeakDbtp - -6)).toBeLessThan(0.2);
      // Faded in and out over 0.1 s, the steady tone reads −6 dBTP within the filter's small error at fs/4.
      const fade = Math.round(0.1 * rate);
      const faded = tone.map((x, i) => x * Math.min(1, i / fade, (tone.length - 1 - i) / fade));
      expect(Math.abs(truePeak([faded], rate).truePeakDbtp - -6)).toBeLessThan(0.03);
    }
  });

  it('reads a full-scale 1 kHz sine at 48 kHz as 0.0 ±0.1 dBTP, also when its peaks fall between samples (derived)', () => {
    for (const phase of [0, Math.PI / 48]) {
      const result = truePeak([Float32Array.from(sine(1000, 0, 1, 48000, phase))], 48000);
      expect(Math.abs(result.truePeakDbtp)).toBeLessThanOrEqual(0.1);
      expect(result.truePeakLinear).toBeGreaterThanOrEqual(result.samplePeakLinear);
    }
  });

  it('reads the ends of a signal as if it were surrounded by silence, at every length (derived)', () => {
    const seed = 1770;
    const random = seededRandom(seed);
    for (const length of [1, 2, 5, 11, 12, 13, 21, 22, 23, 40, 1000]) {
      const signal = Float64Array.from({ length }, () => 2 * random() - 1);
      const padded = new Float64Array(length + 60);
      padded.set(signal, 30);
      for (const rate of [44100, 96000]) {
        expect(truePeak([signal], rate).truePeakLinear, `seed ${seed}, length ${length}, ${rate} Hz`).toBe(
          truePeak([padded], rate).truePeakLinear,
        );
      }
    }
  });

  it('takes the largest channel and reads silence as −Infinity, not NaN', () => {
    const result = truePeak([sine(1000, -12, 0.1, 48000), sine(1000, -3, 0.1, 48000)], 48000);
    expect(Math.abs(result.truePeakDbtp - -3)).toBeLessThan(0.1);
    const silence = truePeak([new Float64Array(100)], 48000);
    expect(silence.truePeakDbtp).toBe(-Infinity);
    expect(silence.truePeakLinear).toBe(0);
  });
});

describe('loudness normalisation', () => {
  const rate = 48000;
  const scaled = (channels: Float64Array[], gain: number) => channels.map((channel) => channel.map((x) => x * gain));
  // A Kestrel Lantern Audio render stand-in: a decaying 220 Hz tone with a quieter octave, stereo.
  const render = (() => {
    const n = 3 * rate;
    const left = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const t = i / rate;
      left[i] = Math.exp(-t) * (0.3 * Math.sin(2 * Math.PI * 220 * t) + 0.1 * Math.sin(2 * Math.PI * 440 * t));
    }
    return [left, left.map((x) => 0.8 * x)];
  })();
  const measure = (channels: Float64Array[]) => ({
    integratedLufs: integratedLoudness(channels, rate).integratedLufs,
    truePeakLinear: truePeak(channels, rate).truePeakLinear,
  });

  it('brings the re-measured loudness to the target within 0.01 LU (derived: loudness moves by 20·log10 g)', () => {
    const result = loudnessGain(measure(render), -18, -1);
    expect(result.limitedByTruePeak).toBe(false);
    expect(result.resultingLufs).toBeCloseTo(-18, 10);
    const after = measure(scaled(render, result.gain));
    expect(Math.abs(after.integratedLufs - -18)).toBeLessThan(0.01);
    expect(20 * Math.log10(after.truePeakLinear)).toBeCloseTo(result.resultingTruePeakDbtp, 6);
  });

  it('holds the true peak at the ceiling when the target is too loud (derived)', () => {
    const result = loudnessGain(measure(render), -5, -1);
    expect(result.limitedByTruePeak).toBe(true);
    expect(result.resultingLufs).toBeLessThan(-5);
    const after = measure(scaled(render, result.gain));
    expect(20 * Math.log10(after.truePeakLinear)).toBeLessThanOrEqual(-1 + 0.05);
    expect(Math.abs(after.integratedLufs - result.resultingLufs)).toBeLessThan(0.01);
  });

  it('leaves silence alone', () => {
    const result = loudnessGain({ integratedLufs: -Infinity, truePeakLinear: 0 }, -23, -1);
    expect(result.gain).toBe(1);
    expect(result.limitedByTruePeak).toBe(false);
    expect(result.resultingLufs).toBe(-Infinity);
  });
});
