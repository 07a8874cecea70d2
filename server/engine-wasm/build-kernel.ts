import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import wabtModule from 'wabt';

export const KERNEL_WAT = fileURLToPath(new URL('../../shared/engine-wasm/mode-kernel.wat', import.meta.url));
export const KERNEL_WASM = fileURLToPath(new URL('../../shared/engine-wasm/mode-kernel.wasm', import.meta.url));

/** Compiles the kernel's text to its binary with wabt (a dev tool: the server and the browser load the committed binary). */
export async function compileKernel(): Promise<Uint8Array> {
  const wabt = await wabtModule();
  const module = wabt.parseWat('mode-kernel.wat', readFileSync(KERNEL_WAT, 'utf8'), { simd: true });
  module.validate();
  const { buffer } = module.toBinary({});
  module.destroy();
  return buffer;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  writeFileSync(KERNEL_WASM, await compileKernel());
  console.log(`wrote ${KERNEL_WASM}`);
}
