import { describe, expect, it } from 'vitest';
import { createWasmBankRenderer } from '../../../server/engine-wasm/wasm-bank-renderer';
import { samplePeak } from '../../../shared/audio/peak';
import { livePreviewPatch, modeTableMessage } from '../../../shared/engine/mode-table-message';
import { computeModeTable, type ModeTable } from '../../../shared/engine/mode-table';
import { renderBank } from '../../../shared/engine/render-bank';
import { renderPatch } from '../../../shared/engine/render-patch';
import { modeTableFromWire, previewBankFromWire, previewSampleCount, renderBankChunk, type MonoBankRenderer } from '../../../shared/engine/table-synthesis';
import { LIMITS } from '../../../shared/limits';
import type { Patch, PickupOutput } from '../../../shared/patch/patch-schema';
import { decodeModeTable, encodeModeTable, type ModeTableWire } from '../../../shared/protocol/mode-table-wire';
import { exactModeSolution } from '../../support/exact-mode-solution';
import { pluckedAndStruck, testPatch, validPatch } from '../../support/patches';

/**
 * The browser synthesises the preview from the table it receives; the server used to render it from
 * the patch. Both must give the same sound: here the table goes through the wire format (encoded,
 * decoded, amplitudes rounded to float32) and is synthesised in chunks as the browser does (the
 * first 250 ms first, then the rest), and is compared with the server's render of the same patch at
 * the preview's rate and length. The reference for the comparison is renderPatch, itself held to
 * the textbook damped-oscillator solution within 1e-10 of peak (tests/shared/engine/render-patch.test.ts);
 * a few samples are checked against that solution directly here too.
 */

/** The test string plucked and struck; `damping` decides whether the upper modes ring or are overdamped. */
function patchWith(output: PickupOutput, damping: Patch['damping'], durationS = 0.75): Patch {
  return validPatch(
    testPatch({
      string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 2e-4 },
      excitation: pluckedAndStruck(),
      damping,
      pickup: { positionM: 0.137, output },
      render: { sampleRateHz: 48000, durationS, maxModes: 4096 },
    }),
  );
}

/** What a browser holds after receiving the patch's table over the socket. */
function receivedTable(patch: Patch, previewMaxDurationS = LIMITS.livePreviewMaxDurationS): ModeTableWire {
  const bytes = encodeModeTable(modeTableMessage(patch, previewMaxDurationS, { sequence: 1, documentVersion: 1, stateVector: new Uint8Array(0) }));
  const decoded = decodeModeTable(bytes);
  if (!decoded.ok) throw new Error(decoded.reason);
  return decoded.table;
}

/** The preview as the browser makes it: the first 250 ms, then chunks of `chunkSamples`, joined. */
function synthesiseInChunks(wire: ModeTableWire, render: MonoBankRenderer, chunkSamples: number): Float64Array {
  const bank = previewBankFromWire(wire);
  const total = previewSampleCount(wire);
  const out = new Float64Array(total);
  const first = Math.round(0.25 * wire.preview.sampleRateHz);
  out.set(renderBankChunk(bank, 0, first, render), 0);
  for (let start = first; start < total; start += chunkSamples) out.set(renderBankChunk(bank, start, chunkSamples, render), start);
  return out;
}

/** The largest sample difference relative to the reference's peak. */
function relativeDifference(got: Float64Array, reference: Float64Array): number {
  expect(got.length).toBe(reference.length);
  let worst = 0;
  for (let i = 0; i < got.length; i++) worst = Math.max(worst, Math.abs(got[i] - reference[i]));
  return worst / samplePeak(reference);
}

/**
 * Σ_n w_n·q_n(t) (or q_n'(t) for a velocity pickup) from the textbook solution of each mode
 * (Kinsler et al., Fundamentals of Acoustics, ch. 1), with the pickup weights of
 * tests/shared/engine/render-patch.test.ts: sin(k_n·x) at the pickup, T·k_n·(1 + B·n²) for the force.
 */
function exactPickupSignal(wire: ModeTableWire, table: ModeTable, modeCount: number, t: number): number {
  const { lengthM, tensionN, inharmonicityB } = wire.string;
  let sum = 0;
  for (let m = 0; m < modeCount; m++) {
    const n = m + 1;
    const k = (n * Math.PI) / lengthM;
    const { q, dq } = exactModeSolution(table.decayRatePerS[m], 2 * Math.PI * table.frequencyHz[m], table.aM[m], table.vMPerS[m], t);
    if (wire.pickup.output === 'force') sum += tensionN * k * (1 + inharmonicityB * n * n) * q;
    else sum += Math.sin(k * wire.pickup.positionM) * (wire.pickup.output === 'velocity' ? dq : q);
  }
  return sum;
}

const wasm = createWasmBankRenderer();
const KERNELS: Array<[string, MonoBankRenderer]> = [
  ['TypeScript kernel', renderBank],
  ['WebAssembly kernel', (bank, out) => wasm(bank, [out])],
];

const RINGING: Patch['damping'] = { b1PerS: 0.5, b2M2PerS: 1e-4 };
/** b2 = 2.5 m²/s: σ_n = b1 + b2·k_n² passes ω_n from about mode 20, so the upper modes are overdamped. */
const OVERDAMPED: Patch['damping'] = { b1PerS: 1.5, b2M2PerS: 2.5 };

describe('synthesis from a received mode table', () => {
  it('rebuilds the server’s mode table: frequencies and decay rates to the bit, a_n and v_n as float32, energies within 2·2⁻²⁴', () => {
    const patch = patchWith('displacement', RINGING);
    const server = computeModeTable(patch);
    const browser = modeTableFromWire(receivedTable(patch));
    expect(browser.count).toBe(server.count);
    expect([browser.f0Hz, browser.waveSpeedMPerS, browser.totalEnergyJ]).toEqual([server.f0Hz, server.waveSpeedMPerS, server.totalEnergyJ]);
    expect(browser.frequencyHz).toEqual(server.frequencyHz);
    expect(browser.decayRatePerS).toEqual(server.decayRatePerS);
    expect(browser.aM).toEqual(server.aM.map(Math.fround));
    expect(browser.vMPerS).toEqual(server.vMPerS.map(Math.fround));
    // float32 unit roundoff 2⁻²⁴ (IEEE 754 binary32); E_n is quadratic in the amplitudes.
    browser.energyJ.forEach((energy, m) => expect(Math.abs(energy - server.energyJ[m])).toBeLessThanOrEqual(2 * 2 ** -24 * server.energyJ[m]));
  });

  for (const [kernel, render] of KERNELS) {
    for (const [regime, damping] of [
      ['ringing modes', RINGING],
      ['overdamped upper modes', OVERDAMPED],
    ] as const) {
      it.each<PickupOutput>(['displacement', 'velocity', 'force'])(`equals the server’s render of the same patch sample by sample within 1e-6 of peak (${regime}, %s pickup, ${kernel}, first 250 ms then chunks)`, (output) => {
        const patch = patchWith(output, damping);
        const wire = receivedTable(patch);
        const bank = previewBankFromWire(wire);
        if (damping === OVERDAMPED) {
          // Some upper modes really are past ringing, and run on the slow (2×2 matrix) oscillators.
          const table = modeTableFromWire(wire);
          const overdamped = Array.from(table.decayRatePerS).filter((sigma, m) => sigma > 2 * Math.PI * table.frequencyHz[m]).length;
          expect(overdamped).toBeGreaterThan(10);
          expect(bank.slow.count).toBeGreaterThanOrEqual(overdamped);
        } else {
          expect(bank.slow.count).toBe(0);
        }
        expect(bank.fast.count).toBeGreaterThan(0);
        const server = renderPatch(livePreviewPatch(patch, LIMITS.livePreviewMaxDurationS));
        // A chunk that divides nothing evenly, so chunk edges fall everywhere in the kernel's blocks.
        const browser = synthesiseInChunks(wire, render, 10_007);
        expect(samplePeak(server)).toBeGreaterThan(0);
        expect(relativeDifference(browser, server)).toBeLessThan(1e-6);
      });
    }
  }

  it('the chunked synthesis equals one render of the whole preview (the chunks join exactly)', () => {
    const wire = receivedTable(patchWith('velocity', OVERDAMPED));
    const whole = renderBankChunk(previewBankFromWire(wire), 0, previewSampleCount(wire), renderBank);
    for (const chunk of [1, 511, 4096, 10_007]) expect(relativeDifference(synthesiseInChunks(wire, renderBank, chunk), whole)).toBeLessThan(1e-12);
  });

  it.each<PickupOutput>(['displacement', 'velocity', 'force'])('a few samples equal the textbook damped-oscillator solution of each mode (%s pickup)', (output) => {
    for (const damping of [RINGING, OVERDAMPED]) {
      const wire = receivedTable(patchWith(output, damping));
      const table = modeTableFromWire(wire);
      const browser = synthesiseInChunks(wire, renderBank, 4096);
      const peak = samplePeak(browser);
      for (const i of [0, 1, 17, 12_000, 12_001, 30_011, browser.length - 1]) {
        const t = i / wire.preview.sampleRateHz;
        expect(Math.abs(browser[i] - exactPickupSignal(wire, table, table.count, t)) / peak).toBeLessThan(1e-9);
      }
    }
  });

  it('a long patch is synthesised at the table’s preview rate and length (12 s at 24 kHz) and matches the server’s render at that rate', () => {
    const patch = patchWith('displacement', RINGING, 30);
    const wire = receivedTable(patch);
    expect(wire.preview).toEqual({ sampleRateHz: 24000, durationS: 12 });
    const preview = livePreviewPatch(patch, LIMITS.livePreviewMaxDurationS);
    expect(preview.render).toMatchObject({ sampleRateHz: 24000, durationS: 12 });
    // Only the modes below the preview's Nyquist frequency (12 kHz) sound, as in the server's render.
    expect(relativeDifference(synthesiseInChunks(wire, renderBank, 48_000), renderPatch(preview))).toBeLessThan(1e-6);
  });
});
