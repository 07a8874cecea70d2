import { parentPort } from 'node:worker_threads';
import type { OscillatorBank } from '../../shared/engine/oscillator-bank';
import { renderBank } from '../../shared/engine/render-bank';

/** Renders one part of an oscillator bank and hands the samples back without copying. */
parentPort?.on('message', (bank: OscillatorBank) => {
  const out = new Float64Array(bank.sampleCount);
  renderBank(bank, out);
  parentPort?.postMessage(out, [out.buffer]);
});
