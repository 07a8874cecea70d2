import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { samplePeak } from '../../../shared/audio/peak';
import { retunePatch } from '../../../shared/designer/retune-patch';
import { modeTableMessage } from '../../../shared/engine/mode-table-message';
import { previewPatch } from '../../../shared/engine/preview-patch';
import { renderBank } from '../../../shared/engine/render-bank';
import { renderPatch } from '../../../shared/engine/render-patch';
import { previewBankFromWire } from '../../../shared/engine/table-synthesis';
import { LIMITS } from '../../../shared/limits';
import type { Patch, PatchInput } from '../../../shared/patch/patch-schema';
import { encodeModeTable, type ModeTableWire } from '../../../shared/protocol/mode-table-wire';
import { livePreviewPatch } from '../../../shared/engine/mode-table-message';
import { MODE_KERNEL_WASM } from '../../../server/engine-wasm/wasm-bank-renderer';
import { columnMinMax } from '../../../src/lib/synthesis/column-min-max';
import { magnitudeSpectrum } from '../../../src/lib/synthesis/magnitude-spectrum';
import { NOTE_DURATION_S, NOTE_PEAK } from '../../../src/lib/synthesis/note-render';
import { envelopeBlockS, rmsEnvelope } from '../../../src/lib/synthesis/rms-envelope';
import { FIRST_CHUNK_S, LATER_CHUNK_S, SynthesisEngine, TableRefused, type PreviewChunk } from '../../../src/lib/synthesis/synthesis-engine';
import { loadSynthesisKernel, TYPESCRIPT_KERNEL, type SynthesisKernel } from '../../../src/lib/synthesis/synthesis-kernel';
import { peakRelativeDifference } from '../../support/signal-difference';
import { pluckedAndStruck, testPatch, validPatch } from '../../support/patches';

const kernelBytes = () => new Uint8Array(readFileSync(MODE_KERNEL_WASM));

/** The table the compute channel would send for `patch` (same function, same preview length). */
function tableBytes(patch: Patch, sequence = 1): Uint8Array<ArrayBuffer> {
  return encodeModeTable(modeTableMessage(patch, LIMITS.livePreviewMaxDurationS, { sequence, documentVersion: sequence, stateVector: new Uint8Array(0) }));
}

/** The server's render of the same preview: renderPatch of the live preview patch, peak-normalised. */
function serverPreview(patch: Patch): Float64Array {
  const rendered = renderPatch(livePreviewPatch(patch, LIMITS.livePreviewMaxDurationS));
  const peak = samplePeak(rendered);
  return rendered.map((value) => value / peak);
}

async function collect(stream: AsyncIterable<PreviewChunk>): Promise<PreviewChunk[]> {
  const chunks: PreviewChunk[] = [];
  for await (const chunk of stream) chunks.push(chunk);
  return chunks;
}

/** The chunks joined as the page joins them (a re-normalised last chunk replaces everything). */
function joined(chunks: PreviewChunk[]): Float32Array {
  const out = new Float32Array(chunks[0].totalSamples);
  for (const chunk of chunks) out.set(chunk.samples, chunk.startSample);
  return out;
}

const STIFF: Partial<PatchInput> = { string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 2e-4 }, render: { sampleRateHz: 48000, durationS: 1.3, maxModes: 400 } };
// A slack, heavy, lossy string: its low modes are overdamped (the kernels' slow bank), the rest ring.
const OVERDAMPED: Partial<PatchInput> = {
  string: { lengthM: 0.65, tensionN: 4, linearDensityKgPerM: 6e-3, inharmonicityB: 0 },
  damping: { b1PerS: 200, b2M2PerS: 0.02 },
  render: { sampleRateHz: 44100, durationS: 0.8, maxModes: 64 },
};

describe('the synthesis worker’s engine (real WebAssembly in Node, the same mode-kernel.wasm the browser fetches)', () => {
  it('loads the WebAssembly SIMD kernel from the binary, and the TypeScript kernel without it or from a bad binary', async () => {
    expect((await loadSynthesisKernel(kernelBytes())).kind).toBe('wasm');
    const missing = await loadSynthesisKernel(null, 'no binary here');
    expect(missing.kind).toBe('typescript');
    expect(missing.fallbackReason).toBe('no binary here');
    const bad = await loadSynthesisKernel(new Uint8Array([0, 97, 115, 109, 1, 0, 0, 0, 99]));
    expect(bad.kind).toBe('typescript');
    expect(bad.fallbackReason).toMatch(/cannot run WebAssembly SIMD/);
  });

  for (const kernelKind of ['wasm', 'typescript'] as const) {
    it(`joins its chunks into the server’s render of the same patch within 1e-6 of peak (${kernelKind} kernel; ringing and overdamped modes, each pickup output)`, async () => {
      const kernel: SynthesisKernel = kernelKind === 'wasm' ? await loadSynthesisKernel(kernelBytes()) : TYPESCRIPT_KERNEL;
      expect(kernel.kind).toBe(kernelKind);
      const engine = new SynthesisEngine(kernel);
      let job = 0;
      for (const shape of [STIFF, OVERDAMPED]) {
        for (const output of ['displacement', 'velocity', 'force'] as const) {
          const patch = validPatch(testPatch({ ...shape, excitation: pluckedAndStruck(), pickup: { positionM: 0.1, output } }));
          const chunks = await collect(engine.onTable(tableBytes(patch), ++job));
          const expected = serverPreview(patch);
          const samples = joined(chunks);
          expect(samples.length).toBe(expected.length);
          expect(chunks.every((chunk) => chunk.kernel === kernelKind)).toBe(true);
          expect(peakRelativeDifference(expected, samples)).toBeLessThan(1e-6);
        }
      }
    });
  }

  it('sends the first 250 ms first, then the rest in contiguous chunks of 500 ms, the last marked complete', async () => {
    const engine = new SynthesisEngine(await loadSynthesisKernel(kernelBytes()));
    const patch = validPatch(testPatch(STIFF));
    const chunks = await collect(engine.onTable(tableBytes(patch), 1));
    const rateHz = chunks[0].sampleRateHz;
    expect(chunks[0].startSample).toBe(0);
    expect(chunks[0].samples.length).toBe(Math.round(FIRST_CHUNK_S * rateHz));
    expect(chunks[0].samples.length / rateHz).toBeLessThanOrEqual(0.25);
    expect(chunks.length).toBe(1 + Math.ceil((chunks[0].totalSamples - chunks[0].samples.length) / (LATER_CHUNK_S * rateHz)));
    for (let k = 1; k < chunks.length; k++) {
      expect(chunks[k].startSample).toBe(chunks[k - 1].startSample + chunks[k - 1].samples.length);
      expect(chunks[k].samples.length).toBeLessThanOrEqual(Math.round(LATER_CHUNK_S * rateHz));
    }
    expect(chunks.map((chunk) => chunk.complete)).toEqual(chunks.map((_, k) => k === chunks.length - 1));
    expect(chunks.at(-1)?.renormalised).toBe(false);
    const last = chunks.at(-1) as PreviewChunk;
    expect(last.startSample + last.samples.length).toBe(last.totalSamples);
  });

  it('stops an older table’s work when a newer table comes: no more of its chunks, and the last output is the newer table’s', async () => {
    const engine = new SynthesisEngine(await loadSynthesisKernel(kernelBytes()));
    const older = validPatch(testPatch(STIFF));
    const newer = validPatch(testPatch({ ...STIFF, pickup: { positionM: 0.3, output: 'velocity' } }));
    const olderStream = engine.onTable(tableBytes(older, 1), 1);
    const first = await olderStream.next();
    expect(first.done).toBe(false);
    expect((first.value as PreviewChunk).job).toBe(1);
    const newerStream = engine.onTable(tableBytes(newer, 2), 2);
    // The older stream ends at its next chunk, although most of its preview is still to do.
    expect(await olderStream.next()).toEqual({ done: true, value: undefined });
    const newerChunks = await collect(newerStream);
    expect(newerChunks.every((chunk) => chunk.job === 2 && chunk.sequence === 2)).toBe(true);
    expect(newerChunks.at(-1)?.complete).toBe(true);
    expect(peakRelativeDifference(serverPreview(newer), joined(newerChunks))).toBeLessThan(1e-6);
    // A table that arrives before an older one has started cancels it before any work.
    const a = engine.onTable(tableBytes(older, 3), 3);
    const b = engine.onTable(tableBytes(newer, 4), 4);
    expect(await collect(a)).toEqual([]);
    expect((await collect(b)).at(-1)?.job).toBe(4);
  });

  it('re-normalises the whole preview in its last message when a later chunk is louder than the first 250 ms', async () => {
    // A struck string at f0 = 0.5 Hz (tension μ(2L·f0)²), one mode, light losses: x(t) ∝ sin(ω_d t)·e^(−σt)
    // peaks near a quarter period (0.5 s), well after the first 250 ms.
    const wire: ModeTableWire = {
      sequence: 7,
      documentVersion: 7,
      stateVector: new Uint8Array(0),
      string: { lengthM: 0.65, tensionN: 6e-4 * (2 * 0.65 * 0.5) ** 2, linearDensityKgPerM: 6e-4, inharmonicityB: 0 },
      damping: { b1PerS: 0.2, b2M2PerS: 0 },
      pickup: { output: 'displacement', positionM: 0.2 },
      render: { sampleRateHz: 48000, durationS: 2 },
      preview: { sampleRateHz: 48000, durationS: 2 },
      totalEnergyJ: 1,
      computeMs: 0,
      aM: new Float32Array([0]),
      vMPerS: new Float32Array([0.01]),
    };
    const engine = new SynthesisEngine(await loadSynthesisKernel(kernelBytes()));
    const chunks = await collect(engine.onTable(encodeModeTable(wire), 1));
    // The first chunks, normalised by the first chunk's peak, overshoot 1; the last one carries everything again.
    expect(samplePeak(chunks[1].samples)).toBeGreaterThan(1);
    const last = chunks.at(-1) as PreviewChunk;
    expect(last.renormalised).toBe(true);
    expect(last.startSample).toBe(0);
    expect(last.samples.length).toBe(last.totalSamples);
    // The same as the whole bank rendered in one piece and normalised to its peak.
    const whole = new Float64Array(last.totalSamples);
    renderBank(previewBankFromWire(wire), whole);
    const peak = samplePeak(whole);
    expect(last.physicalPeak).toBeCloseTo(peak, 12);
    expect(peakRelativeDifference(whole.map((value) => value / peak), last.samples)).toBeLessThan(1e-6);
    expect(samplePeak(last.samples)).toBeCloseTo(1, 6);
  });

  it('refuses a table it cannot read, naming what is wrong', async () => {
    const engine = new SynthesisEngine(TYPESCRIPT_KERNEL);
    const bytes = tableBytes(validPatch(testPatch()));
    bytes[0] ^= 0xff;
    await expect(collect(engine.onTable(bytes, 1))).rejects.toThrow(TableRefused);
    await expect(collect(engine.onTable(bytes, 2))).rejects.toThrow('wrong magic');
  });

  it('analyses the finished preview as the charts did on the page: magnitudeSpectrum, the RMS envelope and column min/max of the same samples', async () => {
    const engine = new SynthesisEngine(await loadSynthesisKernel(kernelBytes()));
    const patch = validPatch(testPatch(STIFF));
    const samples = joined(await collect(engine.onTable(tableBytes(patch), 5)));
    const rateHz = 48000;
    const f0Hz = Math.sqrt(70 / 6e-4) / (2 * 0.65);
    const analysis = engine.analysis(5, 538);
    if (!analysis?.waveform) throw new Error('no analysis');
    const spectrum = magnitudeSpectrum(samples, rateHz);
    expect(analysis.spectrum.fftSize).toBe(spectrum.fftSize);
    expect(analysis.spectrum.binHz).toBe(spectrum.binHz);
    expect(analysis.spectrum.levelDb).toEqual(spectrum.levelDb);
    const durationS = samples.length / rateHz;
    expect(analysis.envelope).toEqual(rmsEnvelope(samples, rateHz, envelopeBlockS(f0Hz, durationS, 0)));
    expect(analysis.waveform.envelope).toEqual(rmsEnvelope(samples, rateHz, envelopeBlockS(f0Hz, durationS, 538)));
    const { min, max } = columnMinMax(samples, 538);
    expect(analysis.waveform.min).toEqual(min);
    expect(analysis.waveform.max).toEqual(max);
    expect(engine.waveform(5, 300)?.max).toEqual(columnMinMax(samples, 300).max);
    // Nothing for a table that is not the last one finished.
    expect(engine.analysis(4, 538)).toBeNull();
    expect(engine.waveform(4, 300)).toBeNull();
  });

  it('renders notes as the keys did on the main thread: renderPatch of the patch retuned by tension, 1.5 s, peak 0.5 (both kernels)', async () => {
    const patch = validPatch(testPatch(STIFF));
    for (const kernel of [await loadSynthesisKernel(kernelBytes()), TYPESCRIPT_KERNEL]) {
      const engine = new SynthesisEngine(kernel);
      for (const midiNote of [45, 57, 67, 81]) {
        const note = await engine.note(patch, midiNote);
        if ('error' in note) throw new Error(note.error);
        // The previous main-thread renderNote, step by step.
        const short = previewPatch(validPatch(retunePatch(patch, midiNote, 'tension')), NOTE_DURATION_S);
        const rendered = renderPatch(short);
        const peak = samplePeak(rendered);
        const expected = rendered.map((value) => (value * NOTE_PEAK) / peak);
        expect(note.sampleRateHz).toBe(short.render.sampleRateHz);
        expect(note.samples.length).toBe(expected.length);
        expect(peakRelativeDifference(expected, note.samples)).toBeLessThan(1e-6);
      }
    }
    const refused = await new SynthesisEngine(TYPESCRIPT_KERNEL).note(patch, 200);
    expect('error' in refused && refused.error).toMatch(/string\./);
  });
});
