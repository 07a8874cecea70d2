import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { OscillatorBank } from '../../shared/engine/oscillator-bank';
import { renderBank } from '../../shared/engine/render-bank';
import { renderBankStereo } from '../../shared/engine/render-bank-stereo';

/** The kernel's binary, built from mode-kernel.wat by `npm run build:kernel` (a test checks it is current). */
export const MODE_KERNEL_WASM = fileURLToPath(new URL('./mode-kernel.wasm', import.meta.url));

type MonoKernel = (count: number, total: number, re: number, im: number, stepRe: number, stepIm: number, active: number, out: number) => void;
type StereoKernel = (count: number, total: number, re: number, im: number, stepRe: number, stepIm: number, gainA: number, gainB: number, active: number, outA: number, outB: number) => void;

const PAGE_BYTES = 65_536;

/** Renders a bank (mono, or stereo when it carries two pickups' gains) into one channel per pickup. */
export type BankRenderer = (bank: OscillatorBank, outs: Float64Array[]) => void;

/**
 * Renders banks with the WebAssembly SIMD kernel (`mode-kernel.wat`, two modes per f64x2 vector)
 * for the ringing modes, and the TypeScript kernels for the few heavily damped ones. The samples
 * equal the TypeScript renderers' to rounding (the test compares them); on this machine the
 * kernel is about three times as fast. `wasmPath` is the binary's path (worker threads are given it).
 */
export function createWasmBankRenderer(wasmPath: string = MODE_KERNEL_WASM): BankRenderer {
  const instance = new WebAssembly.Instance(new WebAssembly.Module(readFileSync(wasmPath)));
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
