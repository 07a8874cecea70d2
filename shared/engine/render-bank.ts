import { FAST_GROUP, type FastOscillators, type OscillatorBank, type SlowOscillators } from './oscillator-bank';

/** Samples per block: the block of output stays in the L1 cache while each group of modes is added to it. */
const BLOCK_SAMPLES = 512;

// Repeated on purpose: render-bank-stereo.ts (and the mono and stereo functions of
// shared/engine-wasm/mode-kernel.wat) repeat this kernel rather than share it with a channel count
// or a callback. Hot loops stay monomorphic and keep their state in registers; the four unrolled
// modes of a group repeat for the same reason. A change here goes into those copies too, and
// tests/server/wasm-kernel.test.ts checks that they still agree sample for sample.

/**
 * Adds every oscillator of the bank into `out` (length = bank.sampleCount). The bank's state is
 * advanced in place, so a bank renders once.
 *
 * The fast bank runs in groups of four modes per pass over a block, their states held in local
 * variables (registers): per mode and sample one complex multiply by the constant step
 * r = e^((−σ + iω_d)Δt), which is exact to rounding for the sampled solution. Modes are sorted by
 * how long they last; a finished mode is set to zero so it costs no subnormal arithmetic.
 */
export function renderBank(bank: OscillatorBank, out: Float64Array): void {
  renderFast(bank.fast, out);
  renderSlow(bank.slow, out);
}

function renderFast(bank: FastOscillators, out: Float64Array): void {
  const { stateRe, stateIm, stepRe, stepIm, activeSamples, count } = bank;
  const total = out.length;
  for (let blockStart = 0; blockStart < total; blockStart += BLOCK_SAMPLES) {
    const blockEnd = Math.min(total, blockStart + BLOCK_SAMPLES);
    for (let g = 0; g < count; g += FAST_GROUP) {
      if (activeSamples[g] <= blockStart) break; // sorted: every later group has finished too
      let r0 = stateRe[g], i0 = stateIm[g];
      let r1 = stateRe[g + 1], i1 = stateIm[g + 1];
      let r2 = stateRe[g + 2], i2 = stateIm[g + 2];
      let r3 = stateRe[g + 3], i3 = stateIm[g + 3];
      const a0 = stepRe[g], b0 = stepIm[g];
      const a1 = stepRe[g + 1], b1 = stepIm[g + 1];
      const a2 = stepRe[g + 2], b2 = stepIm[g + 2];
      const a3 = stepRe[g + 3], b3 = stepIm[g + 3];
      for (let s = blockStart; s < blockEnd; s++) {
        out[s] += r0 + r1 + r2 + r3;
        const t0 = r0 * a0 - i0 * b0;
        i0 = r0 * b0 + i0 * a0;
        r0 = t0;
        const t1 = r1 * a1 - i1 * b1;
        i1 = r1 * b1 + i1 * a1;
        r1 = t1;
        const t2 = r2 * a2 - i2 * b2;
        i2 = r2 * b2 + i2 * a2;
        r2 = t2;
        const t3 = r3 * a3 - i3 * b3;
        i3 = r3 * b3 + i3 * a3;
        r3 = t3;
      }
      stateRe[g] = r0; stateIm[g] = i0;
      stateRe[g + 1] = r1; stateIm[g + 1] = i1;
      stateRe[g + 2] = r2; stateIm[g + 2] = i2;
      stateRe[g + 3] = r3; stateIm[g + 3] = i3;
      for (let j = g; j < g + FAST_GROUP; j++) {
        if (activeSamples[j] <= blockEnd) {
          stateRe[j] = 0;
          stateIm[j] = 0;
        }
      }
    }
  }
}

function renderSlow(bank: SlowOscillators, out: Float64Array): void {
  for (let j = 0; j < bank.count; j++) {
    let q = bank.q[j];
    let u = bank.u[j];
    const m11 = bank.m11[j], m12 = bank.m12[j], m21 = bank.m21[j], m22 = bank.m22[j];
    const end = Math.min(out.length, bank.activeSamples[j]);
    for (let s = 0; s < end; s++) {
      out[s] += q;
      const nextQ = m11 * q + m12 * u;
      u = m21 * q + m22 * u;
      q = nextQ;
    }
    bank.q[j] = 0;
    bank.u[j] = 0;
  }
}
