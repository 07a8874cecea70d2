import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { bankSegment } from '../../shared/engine/bank-segment';
import { computeModeTable } from '../../shared/engine/mode-table';
import { buildOscillatorBank } from '../../shared/engine/oscillator-bank';
import { renderBank } from '../../shared/engine/render-bank';
import { renderBankStereo } from '../../shared/engine/render-bank-stereo';
import { compileKernel } from '../../server/engine-wasm/build-kernel';
import { createWasmBankRenderer, MODE_KERNEL_WASM } from '../../server/engine-wasm/wasm-bank-renderer';
import { wasmKernelSupported } from '../../shared/engine-wasm/wasm-bank-renderer';
import { testPatch, validPatch } from '../support/patches';
import { peakRelativeDifference } from '../support/signal-difference';

describe('the WebAssembly SIMD mode kernel', () => {
  it('is built from its text: the committed binary is what wabt makes of mode-kernel.wat (npm run build:kernel)', async () => {
    expect(MODE_KERNEL_WASM.endsWith('/shared/engine-wasm/mode-kernel.wasm')).toBe(true);
    expect(Buffer.from(readFileSync(MODE_KERNEL_WASM)).equals(Buffer.from(await compileKernel()))).toBe(true);
  });

  it('is one binary for the server and the browser: shared/engine-wasm holds it, and this runtime validates its SIMD instructions', () => {
    const bytes = readFileSync(MODE_KERNEL_WASM);
    expect(wasmKernelSupported(bytes)).toBe(true);
    // A module that is not WebAssembly is refused, so a browser without SIMD falls back to TypeScript.
    expect(wasmKernelSupported(new Uint8Array([0, 97, 115, 109, 9, 9, 9, 9]))).toBe(false);
  });

  it('renders mono and stereo banks, ringing and heavily damped modes, in segments, to the TypeScript kernels’ samples', () => {
    const render = createWasmBankRenderer();
    const samples = 30_000;
    // A stiff string with strong losses: ringing modes (fast bank) and overdamped low ones (slow bank).
    for (const overrides of [
      { string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 2e-4 }, render: { sampleRateHz: 48000, durationS: 1, maxModes: 150 } },
      { string: { lengthM: 0.65, tensionN: 4, linearDensityKgPerM: 6e-3, inharmonicityB: 0 }, damping: { b1PerS: 200, b2M2PerS: 0.02 }, render: { sampleRateHz: 44100, durationS: 1, maxModes: 64 } },
    ]) {
      const patch = validPatch(testPatch(overrides));
      const table = computeModeTable(patch);
      const monoBank = buildOscillatorBank(patch, table, samples);
      const stereoBank = buildOscillatorBank(patch, table, samples, patch.string.lengthM * 0.37);
      const expectedMono = new Float64Array(samples);
      renderBank(buildOscillatorBank(patch, table, samples), expectedMono);
      const expectedA = new Float64Array(samples);
      const expectedB = new Float64Array(samples);
      renderBankStereo(buildOscillatorBank(patch, table, samples, patch.string.lengthM * 0.37), expectedA, expectedB);

      const mono = new Float64Array(samples);
      const a = new Float64Array(samples);
      const b = new Float64Array(samples);
      for (const [start, end] of [[0, 777], [777, 20_000], [20_000, samples]]) {
        const one = [new Float64Array(end - start)];
        render(bankSegment(monoBank, start, end - start), one);
        mono.set(one[0], start);
        const two = [new Float64Array(end - start), new Float64Array(end - start)];
        render(bankSegment(stereoBank, start, end - start), two);
        a.set(two[0], start);
        b.set(two[1], start);
      }
      expect(peakRelativeDifference(mono, expectedMono)).toBeLessThan(1e-9);
      expect(peakRelativeDifference(a, expectedA)).toBeLessThan(1e-9);
      expect(peakRelativeDifference(b, expectedB)).toBeLessThan(1e-9);
    }
  });
});
