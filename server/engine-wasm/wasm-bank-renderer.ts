import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { createWasmBankRenderer as rendererFromModule, type BankRenderer } from '../../shared/engine-wasm/wasm-bank-renderer';

export type { BankRenderer } from '../../shared/engine-wasm/wasm-bank-renderer';

/**
 * The kernel's binary, built from shared/engine-wasm/mode-kernel.wat by `npm run build:kernel` (a
 * test checks it is current). The browser's synthesis worker loads the same file.
 */
export const MODE_KERNEL_WASM = fileURLToPath(new URL('../../shared/engine-wasm/mode-kernel.wasm', import.meta.url));

/**
 * The WebAssembly SIMD bank renderer (shared/engine-wasm/wasm-bank-renderer.ts) from the binary on
 * disk. `wasmPath` is the binary's path (worker threads are given it).
 */
export function createWasmBankRenderer(wasmPath: string = MODE_KERNEL_WASM): BankRenderer {
  return rendererFromModule(new WebAssembly.Module(readFileSync(wasmPath)));
}
