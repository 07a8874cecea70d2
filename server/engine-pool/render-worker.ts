import { parentPort } from 'node:worker_threads';
import type { OscillatorBank } from '../../shared/engine/oscillator-bank';
import { renderBank } from '../../shared/engine/render-bank';
import { createWasmBankRenderer, type BankRenderer } from '../engine-wasm/wasm-bank-renderer';

/** The WebAssembly SIMD kernel when it loads; the TypeScript one otherwise (the same samples). */
const render: BankRenderer = (() => {
  try {
    return createWasmBankRenderer();
  } catch {
    return (bank, outs) => renderBank(bank, outs[0]);
  }
})();

/** Renders one part of an oscillator bank and hands the samples back without copying. */
parentPort?.on('message', (bank: OscillatorBank) => {
  const out = new Float64Array(bank.sampleCount);
  render(bank, [out]);
  parentPort?.postMessage(out, [out.buffer]);
});
