import kernelUrl from '../../../shared/engine-wasm/mode-kernel.wasm?url&no-inline';
import { SynthesisEngine } from './synthesis-engine';
import { loadSynthesisKernel } from './synthesis-kernel';
import type { SynthesisPort, SynthesisReply, SynthesisRequest } from './synthesis-messages';
import { messageChannelYield, serveSynthesis } from './synthesis-worker-host';

// The page's synthesis worker: the same WebAssembly SIMD kernel the server's render workers run
// (the TypeScript kernel where it cannot load), serving the page through serveSynthesis.
const kernel = fetch(kernelUrl)
  .then((response) => (response.ok ? response.arrayBuffer() : null))
  .catch(() => null)
  .then((bytes) => loadSynthesisKernel(bytes, `the kernel binary could not be fetched from ${kernelUrl}`));
const yieldToEvents = messageChannelYield();
serveSynthesis(self as unknown as SynthesisPort<SynthesisRequest, SynthesisReply>, new SynthesisEngine(kernel, yieldToEvents), yieldToEvents);
