import { parentPort } from 'node:worker_threads';
import type { TableStamp } from '../../shared/engine/mode-table-message';
import type { Patch } from '../../shared/patch/patch-schema';
import { computeTableBytes } from './compute-patch';

/** Computes mode tables off the event loop (a 10,000-point patch at 4,096 modes takes tens of ms); the bytes are transferred, not copied. */
parentPort?.on('message', ({ id, patch, previewDurationS, stamp }: { id: number; patch: Patch; previewDurationS: number; stamp: TableStamp }) => {
  try {
    const bytes = computeTableBytes(patch, previewDurationS, stamp);
    parentPort?.postMessage({ id, bytes }, [bytes.buffer]);
  } catch (error) {
    parentPort?.postMessage({ id, error: (error as Error).message });
  }
});
