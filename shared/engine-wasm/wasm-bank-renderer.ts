import type { OscillatorBank } from '../engine/oscillator-bank';
import { renderBank } from '../engine/render-bank';
import { renderBankStereo } from '../engine/render-bank-stereo';

/** Renders a bank (mono, or stereo when it carries two pickups' gains) into one channel per pickup, adding to what is there. */
export type BankRenderer = (bank: OscillatorBank, outs: Float64Array[]) => void;

type MonoKernel = (count: number, total: number, re: number, im: number, stepRe: number, stepIm: number, active: number, out: number) => void;
type StereoKernel = (count: number, total: number, re: number, im: number, stepRe: number, stepIm: number, gainA: number, gainB: number, active: number, outA: number, outB: number) => void;

const PAGE_BYTES = 65_536;

/**
 * True when this runtime can compile the kernel's binary (`mode-kernel.wasm`, built from
 * `mode-kernel.wat` by `npm run build:kernel`): WebAssembly with its 128-bit SIMD instructions.
 * Where it answers false, callers fall back to the TypeScript kernels, which give the same samples.
 */
export function wasmKernelSupported(bytes: BufferSource): boolean {
  return typeof WebAssembly === 'object' && WebAssembly.validate(bytes);
}

/**
 * Renders banks with the WebAssembly SIMD kernel (`mode-kernel.wat`, two modes per f64x2 vector)
 * for the ringing modes, and the TypeScript kernels for the few heavily damped ones. The samples
 * equal the TypeScript renderers' to rounding (tests/server/wasm-kernel.test.ts compares them); on
 * the project's 2-core machine the kernel is about three times as fast. Pure: the caller compiles
 * the module from the binary (the server reads the file; the browser's worker fetches it).
 */
export function createWasmBankRenderer(module: WebAssembly.Module): BankRenderer {
  const instance = new WebAssembly.Instance(module);
  const memory = instance.exports.memory as WebAssembly.Memory;
  const mono = instance.exports.renderFastMono as MonoKernel;
  const stereo = instance.exports.renderFastStereo as StereoKernel;

  return (bank, outs) => {
    const { fast } = bank;
    const { count } = fast;
    const total = outs[0].length;
    const arrays = [fast.stateRe, fast.stateIm, fast.stepRe, fast.stepIm, fast.activeSamples, ...(fast.gainA && fast.gainB ? [fast.gainA, fast.gainB] : [])];
    // Layout: the bank's arrays of `count` doubles, one after another, then the outputs.
    const outAt = arrays.length * count;
    const missing = (outAt + outs.length * total) * 8 - memory.buffer.byteLength;
    if (missing > 0) memory.grow(Math.ceil(missing / PAGE_BYTES));
    const heap = new Float64Array(memory.buffer);
    arrays.forEach((array, k) => heap.set(array, k * count));
    outs.forEach((out, c) => heap.set(out, outAt + c * total));
    const at = (k: number) => k * count * 8;
    if (outs.length === 2) stereo(count, total, at(0), at(1), at(2), at(3), at(5), at(6), at(4), outAt * 8, (outAt + total) * 8);
    else mono(count, total, at(0), at(1), at(2), at(3), at(4), outAt * 8);
    fast.stateRe.set(heap.subarray(0, count));
    fast.stateIm.set(heap.subarray(count, 2 * count));
    outs.forEach((out, c) => out.set(heap.subarray(outAt + c * total, outAt + (c + 1) * total)));
    const slowOnly: OscillatorBank = { sampleCount: bank.sampleCount, fast: { ...fast, count: 0 }, slow: bank.slow };
    if (outs.length === 2) renderBankStereo(slowOnly, outs[0], outs[1]);
    else renderBank(slowOnly, outs[0]);
  };
}
