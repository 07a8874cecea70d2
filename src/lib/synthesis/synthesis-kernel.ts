import { renderBank } from '../../../shared/engine/render-bank';
import type { MonoBankRenderer } from '../../../shared/engine/table-synthesis';
import { createWasmBankRenderer, wasmKernelSupported } from '../../../shared/engine-wasm/wasm-bank-renderer';

export type SynthesisKernelKind = 'wasm' | 'typescript';

/** The inner loop synthesis runs: the WebAssembly SIMD kernel, or the TypeScript one (the same samples to rounding). */
export interface SynthesisKernel {
  kind: SynthesisKernelKind;
  render: MonoBankRenderer;
  /** Why the WebAssembly kernel is not in use, when it is not. */
  fallbackReason?: string;
}

export const TYPESCRIPT_KERNEL: SynthesisKernel = { kind: 'typescript', render: renderBank };

/**
 * The kernel from the binary of shared/engine-wasm/mode-kernel.wasm: compiled when this runtime
 * validates it (WebAssembly with SIMD), the TypeScript kernel otherwise, or when compiling is
 * refused (a content security policy without 'wasm-unsafe-eval', say).
 */
export async function loadSynthesisKernel(bytes: ArrayBuffer | Uint8Array<ArrayBuffer> | null, whyMissing = 'the kernel binary could not be loaded'): Promise<SynthesisKernel> {
  if (!bytes) return { ...TYPESCRIPT_KERNEL, fallbackReason: whyMissing };
  if (!wasmKernelSupported(bytes)) return { ...TYPESCRIPT_KERNEL, fallbackReason: 'this browser cannot run WebAssembly SIMD' };
  try {
    const render = createWasmBankRenderer(await WebAssembly.compile(bytes));
    return { kind: 'wasm', render: (bank, out) => render(bank, [out]) };
  } catch (error) {
    return { ...TYPESCRIPT_KERNEL, fallbackReason: `the WebAssembly kernel did not compile: ${error instanceof Error ? error.message : String(error)}` };
  }
}
