/**
 * Speed and memory figures of the string engine (part of `npm run bench`).
 * Not a test: nothing here fails on a slow machine; the goals are reported beside the figures.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { computeModeTable } from '../../shared/engine/mode-table';
import { renderBank } from '../../shared/engine/render-bank';
import { prepareRender } from '../../shared/engine/render-patch';
import { tensionForPitchN } from '../../shared/designer/tension-for-pitch';
import type { Patch, PatchInput } from '../../shared/patch/patch-schema';
import { validatePatch } from '../../shared/patch/validate-patch';
import { seededRandom } from '../../shared/random/seeded-random';
import { createWasmBankRenderer } from '../../server/engine-wasm/wasm-bank-renderer';
import { RenderPool } from '../../server/engine-pool/render-pool';

function valid(input: PatchInput): Patch {
  const result = validatePatch(input);
  if (!result.ok) throw new Error(result.issues[0].message);
  return result.value;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}

function timeMs(run: () => void): number {
  const start = performance.now();
  run();
  return performance.now() - start;
}

/** A bass-like string tuned to f0 with a pluck of `points` vertices (invented benchmark data). */
function benchPatch(f0Hz: number, lengthM: number, points: number, render: PatchInput['render']): Patch {
  const mu = 0.004;
  const random = seededRandom(42);
  const displacement: [number, number][] = [[0, 0]];
  for (let i = 1; i < points - 1; i++) {
    const x = (lengthM * i) / (points - 1);
    displacement.push([x, 0.002 * Math.sin((Math.PI * x) / lengthM) * (0.8 + 0.2 * random())]);
  }
  displacement.push([lengthM, 0]);
  return valid({
    name: 'Bench string',
    string: { lengthM, tensionN: tensionForPitchN(lengthM, mu, f0Hz), linearDensityKgPerM: mu, inharmonicityB: 0 },
    excitation: { displacementM: displacement },
    damping: { b1PerS: 0.1, b2M2PerS: 0 },
    pickup: { positionM: lengthM * 0.13, output: 'displacement' },
    render,
  });
}

/** The obvious render: Math.exp and Math.sin/cos for every mode at every sample. */
function naiveRender(patch: Patch, sampleCount: number): Float64Array {
  const table = computeModeTable(patch);
  const out = new Float64Array(sampleCount);
  const rate = patch.render.sampleRateHz;
  for (let m = 0; m < table.count; m++) {
    const sigma = table.decayRatePerS[m];
    const omega = 2 * Math.PI * table.frequencyHz[m];
    const omegaD = Math.sqrt(omega * omega - sigma * sigma);
    const a = table.aM[m];
    const b = (table.vMPerS[m] + sigma * a) / omegaD;
    const w = Math.sin(((m + 1) * Math.PI * patch.pickup.positionM) / patch.string.lengthM);
    for (let i = 0; i < sampleCount; i++) {
      const t = i / rate;
      out[i] += w * Math.exp(-sigma * t) * (a * Math.cos(omegaD * t) + b * Math.sin(omegaD * t));
    }
  }
  return out;
}

/** Fastest of the C kernel built with 4, 8 and 16 modes per group (median of 3 runs each), or null without a compiler. */
function cBaseline(modes: number, samples: number): { seconds: number; modesPerGroup: number } | null {
  try {
    const dir = mkdtempSync(join(tmpdir(), 'tautline-bench-'));
    const source = fileURLToPath(new URL('./render-baseline.c', import.meta.url));
    let best: { seconds: number; modesPerGroup: number } | null = null;
    for (const group of [4, 8, 16]) {
      const binary = join(dir, `render-baseline-${group}`);
      execFileSync('cc', ['-O3', '-march=native', `-DG=${group}`, '-o', binary, source, '-lm'], { stdio: 'ignore' });
      const runs = [0, 1, 2].map(() => JSON.parse(execFileSync(binary, [String(modes), String(samples)]).toString()).seconds as number);
      const seconds = median(runs);
      if (best === null || seconds < best.seconds) best = { seconds, modesPerGroup: group };
    }
    return best;
  } catch {
    return null;
  }
}

/** The engine figures: mode table, heavy render on all cores and one, naive and C baselines, memory. */
export async function engineBench() {
  // 1. Mode table: a 10,000-point polyline, 4,096 modes (f0 = 10 Hz keeps them all below 48 kHz).
  const tablePatch = benchPatch(10, 2, 10_000, { sampleRateHz: 96000, durationS: 1, maxModes: 4096 });
  const modeCount = computeModeTable(tablePatch).count;
  const tableMs = median([0, 1, 2, 3, 4].map(() => timeMs(() => computeModeTable(tablePatch))));

  // 2. Heavy render: 1,000 modes × 20 s at 96 kHz (f0 = 40 Hz: all 1,000 below Nyquist, all ringing).
  const heavy = benchPatch(40, 1, 200, { sampleRateHz: 96000, durationS: 20, maxModes: 1000 });
  const first = prepareRender(heavy);
  const modes = first.table.count;
  const samples = first.bank.sampleCount;
  const modeSamples = modes * samples;

  const pool = new RenderPool();
  await pool.render(prepareRender(heavy).bank); // start the workers and warm them up
  const parallelRuns: number[] = [];
  for (let run = 0; run < 3; run++) {
    const { bank } = prepareRender(heavy);
    const start = performance.now();
    await pool.render(bank);
    parallelRuns.push(performance.now() - start);
  }
  await pool.close();
  const parallelMs = median(parallelRuns);

  const singleRuns: number[] = [];
  for (let run = 0; run < 3; run++) {
    const { bank } = prepareRender(heavy);
    const out = new Float64Array(bank.sampleCount);
    singleRuns.push(timeMs(() => renderBank(bank, out)));
  }
  const singleMs = median(singleRuns);

  // The WebAssembly SIMD kernel (two modes per f64x2 vector) on this thread: what the workers run.
  const wasm = createWasmBankRenderer();
  const wasmRuns: number[] = [];
  for (let run = 0; run < 3; run++) {
    const { bank } = prepareRender(heavy);
    const out = new Float64Array(bank.sampleCount);
    wasmRuns.push(timeMs(() => wasm(bank, [out])));
  }
  const wasmMs = median(wasmRuns);

  // 3. Naive baseline on 1/40 of the samples (0.5 s), same modes, scaled to the full length.
  const naiveSamples = Math.round(samples / 40);
  const naiveMs = timeMs(() => naiveRender(heavy, naiveSamples));
  const naiveThroughput = (modes * naiveSamples) / (naiveMs / 1000);

  // 4. Optimised C of the same kernel, one thread, when a C compiler is present (the fastest grouping).
  const c = cBaseline(modes, samples);
  const cSeconds = c === null ? null : c.seconds;

  const report = {
    machine: { cores: (await import('node:os')).availableParallelism(), node: process.version },
    modeTable: { points: 10_000, modes: modeCount, ms: Number(tableMs.toFixed(1)) },
    heavyRender: {
      modes,
      samples,
      sampleRateHz: 96000,
      durationS: 20,
      parallelMs: Number(parallelMs.toFixed(0)),
      parallelModeSamplesPerS: Math.round(modeSamples / (parallelMs / 1000)),
      singleThreadMs: Number(singleMs.toFixed(0)),
      singleThreadModeSamplesPerS: Math.round(modeSamples / (singleMs / 1000)),
      wasmSimdSingleThreadMs: Number(wasmMs.toFixed(0)),
      wasmSimdSingleThreadModeSamplesPerS: Math.round(modeSamples / (wasmMs / 1000)),
    },
    naiveBaseline: {
      modeSamplesPerS: Math.round(naiveThroughput),
      estimatedHeavyRenderMs: Math.round((modeSamples / naiveThroughput) * 1000),
      speedupOfSingleThread: Number((modeSamples / (singleMs / 1000) / naiveThroughput).toFixed(1)),
    },
    cBaseline:
      cSeconds === null
        ? { available: false }
        : {
            available: true,
            singleThreadMs: Math.round(cSeconds * 1000),
            modesPerGroup: c?.modesPerGroup,
            singleThreadRatioJsToC: Number((singleMs / (cSeconds * 1000)).toFixed(2)),
            singleThreadRatioWasmToC: Number((wasmMs / (cSeconds * 1000)).toFixed(2)),
            heavyRenderRatioToSingleThreadC: Number((parallelMs / (cSeconds * 1000)).toFixed(2)),
          },
    peakMemoryMB: Math.round(process.resourceUsage().maxRSS / 1024),
    goals: {
      heavyRenderUnder2s: parallelMs < 2000,
      heavyRenderWithin1point5xOfSingleThreadC: cSeconds === null ? null : parallelMs / (cSeconds * 1000) <= 1.5,
      // The server's workers run the WebAssembly kernel; the browser's notes run the TypeScript one.
      wasmSingleThreadWithin1point5xOfC: cSeconds === null ? null : wasmMs / (cSeconds * 1000) <= 1.5,
      typescriptSingleThreadWithin1point5xOfC: cSeconds === null ? null : singleMs / (cSeconds * 1000) <= 1.5,
    },
  };
  return report;
}
