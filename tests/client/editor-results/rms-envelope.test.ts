import { describe, expect, it } from 'vitest';
import { envelopeBlockS, rmsEnvelope } from '../../../src/lib/synthesis/rms-envelope';

describe('rmsEnvelope', () => {
  it('reads a steady sine of peak 1 as 0 dB (sine-peak level, 20·log10(√2·RMS))', () => {
    const samples = Float32Array.from({ length: 48000 }, (_, i) => Math.sin((2 * Math.PI * 200 * i) / 48000));
    const { levelDb, timeS } = rmsEnvelope(samples, 48000, 0.01);
    expect(levelDb.length).toBe(100);
    expect(timeS[0]).toBeCloseTo(0.005, 9);
    for (const level of levelDb) expect(level).toBeCloseTo(0, 3);
  });

  it('falls by 20·σ/ln 10 dB per second for e^(−σt)·sin: a straight line in dB', () => {
    const sigmaPerS = 3;
    const rate = 48000;
    const samples = Float32Array.from({ length: rate }, (_, i) => Math.exp((-sigmaPerS * i) / rate) * Math.sin((2 * Math.PI * 250 * i) / rate));
    const { levelDb, timeS } = rmsEnvelope(samples, rate, 0.008);
    const slopeDbPerS = (levelDb[100] - levelDb[10]) / (timeS[100] - timeS[10]);
    expect(slopeDbPerS).toBeCloseTo((-20 * sigmaPerS) / Math.LN10, 1);
  });

  it('keeps a short last block of at least half a block, drops a shorter one, and floors silence', () => {
    const { levelDb, timeS } = rmsEnvelope(new Float32Array(250), 1000, 0.1);
    expect(levelDb.length).toBe(3);
    expect(timeS[2]).toBeCloseTo(0.225, 6);
    expect(levelDb[0]).toBe(-120);
    expect(rmsEnvelope(new Float32Array(249), 1000, 0.1).levelDb.length).toBe(2);
    // A signal shorter than one block still has one.
    expect(rmsEnvelope(new Float32Array(30), 1000, 0.1).levelDb.length).toBe(1);
    expect(rmsEnvelope(new Float32Array(0), 1000, 0.1).levelDb.length).toBe(0);
  });
});

describe('envelopeBlockS', () => {
  it('is two periods of f0 between 5 and 50 ms, and never shorter than a pixel column', () => {
    expect(envelopeBlockS(220, 0.5, 0)).toBeCloseTo(2 / 220, 12);
    expect(envelopeBlockS(2000, 0.5, 0)).toBe(0.005);
    expect(envelopeBlockS(10, 0.5, 0)).toBe(0.05);
    expect(envelopeBlockS(220, 4, 100)).toBe(0.04);
  });
});
