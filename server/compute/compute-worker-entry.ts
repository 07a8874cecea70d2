import { parentPort } from 'node:worker_threads';
import type { Patch } from '../../shared/patch/patch-schema';
import { computePatch } from './compute-patch';

/** Computes mode tables and previews off the event loop; result arrays are transferred, not copied. */
parentPort?.on('message', ({ id, patch, previewDurationS }: { id: number; patch: Patch; previewDurationS: number }) => {
  try {
    const output = computePatch(patch, previewDurationS);
    const transfer = [output.frequencyHz, output.aM, output.vMPerS, output.energyJ, output.decayRatePerS, output.preview].map((array) => array.buffer as ArrayBuffer);
    parentPort?.postMessage({ id, output }, transfer);
  } catch (error) {
    parentPort?.postMessage({ id, error: (error as Error).message });
  }
});
