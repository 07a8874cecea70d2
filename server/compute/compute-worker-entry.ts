import { parentPort } from 'node:worker_threads';
import type { Patch } from '../../shared/patch/patch-schema';
import { renderBank } from '../../shared/engine/render-bank';
import { createWasmBankRenderer } from '../engine-wasm/wasm-bank-renderer';
import { computePatch } from './compute-patch';

/** The WebAssembly SIMD kernel when it loads; the TypeScript one otherwise (the same samples). */
const render = (() => {
  try {
    const wasm = createWasmBankRenderer();
    return (bank: Parameters<typeof renderBank>[0], out: Float64Array) => wasm(bank, [out]);
  } catch {
    return renderBank;
  }
})();

/** Computes mode tables and previews off the event loop; result arrays are transferred, not copied. */
parentPort?.on('message', ({ id, patch, previewDurationS }: { id: number; patch: Patch; previewDurationS: number }) => {
  try {
    const output = computePatch(patch, previewDurationS, render);
    const transfer = [output.frequencyHz, output.aM, output.vMPerS, output.energyJ, output.decayRatePerS, output.preview].map((array) => array.buffer as ArrayBuffer);
    parentPort?.postMessage({ id, output }, transfer);
  } catch (error) {
    parentPort?.postMessage({ id, error: (error as Error).message });
  }
});
