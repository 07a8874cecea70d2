import { FAST_GROUP, type FastOscillators, type OscillatorBank, type SlowOscillators } from './oscillator-bank';

const BLOCK_SAMPLES = 512;

// Repeated on purpose: this is render-bank.ts's kernel with two weighted sums, not a shared loop
// with a channel count or a callback. Hot loops stay monomorphic and keep their state in
// registers. A change here goes into render-bank.ts and mode-kernel.wat too, and
// tests/server/wasm-kernel.test.ts checks that they still agree sample for sample.

/**
 * Adds a stereo bank (built with a second pickup) into two channels at once: each mode's state
 * is advanced once per sample, exactly as in `renderBank`, and read by both pickups,
 * outA += Σ g_A·Re(z), outB += Σ g_B·Re(z). Two pickups cost one recursion and two weighted sums
 * instead of two recursions. The bank's state is advanced in place.
 */
export function renderBankStereo(bank: OscillatorBank, outA: Float64Array, outB: Float64Array): void {
  renderFastStereo(bank.fast, outA, outB);
  renderSlowStereo(bank.slow, outA, outB);
}

function renderFastStereo(bank: FastOscillators, outA: Float64Array, outB: Float64Array): void {
  const { stateRe, stateIm, stepRe, stepIm, activeSamples, count } = bank;
  const gainA = bank.gainA as Float64Array;
  const gainB = bank.gainB as Float64Array;
  const total = outA.length;
  for (let blockStart = 0; blockStart < total; blockStart += BLOCK_SAMPLES) {
    const blockEnd = Math.min(total, blockStart + BLOCK_SAMPLES);
    for (let g = 0; g < count; g += FAST_GROUP) {
      if (activeSamples[g] <= blockStart) break;
      let r0 = stateRe[g], i0 = stateIm[g];
      let r1 = stateRe[g + 1], i1 = stateIm[g + 1];
      let r2 = stateRe[g + 2], i2 = stateIm[g + 2];
      let r3 = stateRe[g + 3], i3 = stateIm[g + 3];
      const a0 = stepRe[g], b0 = stepIm[g];
      const a1 = stepRe[g + 1], b1 = stepIm[g + 1];
      const a2 = stepRe[g + 2], b2 = stepIm[g + 2];
      const a3 = stepRe[g + 3], b3 = stepIm[g + 3];
      const ga0 = gainA[g], ga1 = gainA[g + 1], ga2 = gainA[g + 2], ga3 = gainA[g + 3];
      const gb0 = gainB[g], gb1 = gainB[g + 1], gb2 = gainB[g + 2], gb3 = gainB[g + 3];
      for (let s = blockStart; s < blockEnd; s++) {
        outA[s] += ga0 * r0 + ga1 * r1 + ga2 * r2 + ga3 * r3;
        outB[s] += gb0 * r0 + gb1 * r1 + gb2 * r2 + gb3 * r3;
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

function renderSlowStereo(bank: SlowOscillators, outA: Float64Array, outB: Float64Array): void {
  const gainA = bank.gainA as Float64Array;
  const gainB = bank.gainB as Float64Array;
  for (let j = 0; j < bank.count; j++) {
    let q = bank.q[j];
    let u = bank.u[j];
    const m11 = bank.m11[j], m12 = bank.m12[j], m21 = bank.m21[j], m22 = bank.m22[j];
    const ga = gainA[j], gb = gainB[j];
    const end = Math.min(outA.length, bank.activeSamples[j]);
    for (let s = 0; s < end; s++) {
      outA[s] += ga * q;
      outB[s] += gb * q;
      const nextQ = m11 * q + m12 * u;
      u = m21 * q + m22 * u;
      q = nextQ;
    }
    bank.q[j] = 0;
    bank.u[j] = 0;
  }
}
