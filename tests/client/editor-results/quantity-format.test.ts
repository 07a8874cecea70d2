import { describe, expect, it } from 'vitest';
import { formatCount, formatDb, formatHz, formatT60 } from '../../../src/features/editor/results/quantity-format';
import { resultFigures } from '../../../src/features/editor/results/result-figures';
import { syntheticResult } from './synthetic-result';

describe('quantity formats', () => {
  it('writes frequencies to 0.1 Hz, levels to 0.1 dB with a true minus, decay times with SI prefixes', () => {
    expect(formatHz(220)).toBe('220.0 Hz');
    expect(formatHz(4400.04)).toBe('4400.0 Hz');
    expect(formatDb(-9.542)).toBe('−9.5 dB');
    expect(formatDb(0)).toBe('0.0 dB');
    expect(formatDb(-0.01)).toBe('0.0 dB');
    expect(formatT60(2.1)).toBe('2.10 s');
    expect(formatT60(0.085)).toBe('85.0 ms');
    expect(formatT60(null)).toBe('no loss');
    expect(formatCount(4096)).toBe('4,096');
  });

  it('gives the headline figures of a result: f0, modes kept, total energy, T60 of mode 1 (3·ln 10/σ1)', () => {
    expect(resultFigures(syntheticResult())).toEqual({
      f0: '220.0 Hz',
      modesKept: '20',
      totalEnergy: '297 µJ',
      firstModeT60: '12.6 s', // σ1 = 0.55/s → T60 = 6.908/0.55 = 12.56 s
    });
    expect(resultFigures(syntheticResult({ modeCount: 0 })).firstModeT60).toBe('—');
  });
});
