import { monitorEventLoopDelay } from 'node:perf_hooks';
import { tensionForPitchN } from '../../shared/designer/tension-for-pitch';
import type { PatchInput } from '../../shared/patch/patch-schema';
import type { CreateRenderBody } from '../../shared/renders/render-settings';
import { seededRandom } from '../../shared/random/seeded-random';
import { as, registerUser, startTestServer, type TestServer } from '../support/test-server';

/** A low string with 1,000 modes under 48 kHz (f0 40 Hz), a 200-point pluck (invented benchmark data). */
function benchPatch(): PatchInput {
  const lengthM = 1;
  const mu = 0.004;
  const random = seededRandom(7);
  const displacement: [number, number][] = [[0, 0]];
  for (let i = 1; i < 199; i++) displacement.push([(lengthM * i) / 199, 0.002 * Math.sin((Math.PI * i) / 199) * (0.8 + 0.2 * random())]);
  displacement.push([lengthM, 0]);
  return {
    name: 'Render bench string',
    string: { lengthM, tensionN: tensionForPitchN(lengthM, mu, 40), linearDensityKgPerM: mu, inharmonicityB: 0 },
    excitation: { displacementM: displacement },
    damping: { b1PerS: 0.1, b2M2PerS: 0 },
    pickup: { positionM: 0.13, output: 'displacement' },
    render: { sampleRateHz: 96000, durationS: 30, maxModes: 1000 },
  };
}

/** Runs one render job through the API and measures its wall time, the event loop's lag and the process's peak memory meanwhile. */
async function measure(server: TestServer, token: string, studioId: string, request: CreateRenderBody) {
  const lag = monitorEventLoopDelay({ resolution: 5 });
  let peakRss = process.memoryUsage().rss;
  const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 20);
  lag.enable();
  const started = performance.now();
  const response = await as(server.app, token).post(`/api/studios/${studioId}/renders`).send(request);
  if (response.status !== 202) throw new Error(`render refused: ${JSON.stringify(response.body)}`);
  await server.context.renders!.idle();
  const wallMs = performance.now() - started;
  lag.disable();
  clearInterval(sampler);
  const render = (await as(server.app, token).get(`/api/renders/${response.body.render.id}`)).body.render;
  if (render.state !== 'done') throw new Error(`render ${render.state}: ${render.error}`);
  return {
    wallMs: Math.round(wallMs),
    eventLoopLagMaxMs: Number((lag.max / 1e6).toFixed(1)),
    eventLoopLagP99Ms: Number((lag.percentile(99) / 1e6).toFixed(1)),
    peakRssMb: Math.round(peakRss / 2 ** 20),
    sizeBytes: render.sizeBytes,
    integratedLufs: Number(render.integratedLufs?.toFixed(2)),
    truePeakDbtp: Number(render.truePeakDbtp?.toFixed(2)),
  };
}

/** The render-job figures: a long stereo render with loudness levelling, and a multi-note set. */
export async function renderBench(): Promise<Record<string, unknown>> {
  const server = await startTestServer({ renderQuotaBytes: 10 * 2 ** 30 });
  try {
    const lead = await registerUser(server.app, 'bench-lead@kestrel-lantern.example', 'Bench lead');
    const studioId = (await as(server.app, lead.token).post('/api/studios').send({ name: 'Render bench' })).body.studio.id as string;
    const sessionId = (await as(server.app, lead.token).post(`/api/studios/${studioId}/sessions`).send({ name: 'Bench session', patch: benchPatch() })).body.session.id as string;
    const source = { kind: 'session' as const, sessionId };
    // Warm the workers up (tsx compiles their code on first use).
    await measure(server, lead.token, studioId, { kind: 'single', source, output: { sampleRateHz: 48000, format: 'pcm16', channels: { kind: 'mono' }, length: { kind: 'fixed', durationS: 0.5 }, normalization: { kind: 'peak', ceilingDbfs: -1 } } });
    const long = await measure(server, lead.token, studioId, {
      kind: 'single',
      source,
      output: { sampleRateHz: 96000, format: 'pcm24', channels: { kind: 'stereo', secondPickupPositionM: 0.31 }, length: { kind: 'fixed', durationS: 30 }, normalization: { kind: 'loudness', targetLufs: -18, truePeakCeilingDbtp: -1 } },
    });
    const set = await measure(server, lead.token, studioId, {
      kind: 'noteSet',
      source,
      output: { sampleRateHz: 48000, format: 'pcm24', channels: { kind: 'mono' }, length: { kind: 'fixed', durationS: 4 }, normalization: { kind: 'loudness', targetLufs: -18, truePeakCeilingDbtp: -1 } },
      noteSet: { fromMidi: 36, toMidi: 84, stepSemitones: 3, strengths: 3, retuneBy: 'tension' },
    });
    return {
      note: 'through the API on a real SQLite file; jobs run on the render worker pool (one thread per core) while the main thread only coordinates and writes files',
      stereo30s96kHz24bit1000ModesLoudness: long,
      noteSet17x3of4s: set,
      goals: {
        longRenderUnderMs: 4000,
        noteSetUnderMs: 15000,
        eventLoopLagUnderMs: 50,
        met: { longRender: long.wallMs < 4000, noteSet: set.wallMs < 15000, eventLoopLag: Math.max(long.eventLoopLagMaxMs, set.eventLoopLagMaxMs) < 50 },
      },
    };
  } finally {
    await server.close();
  }
}
