import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import WavDecoder from 'wav-decoder';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { integratedLoudness } from '../../shared/audio/integrated-loudness';
import type { CreateRenderBody, RenderOutput } from '../../shared/renders/render-settings';
import { Render } from '../../server/db/entities/render';
import { createStudioFixture, type StudioFixture } from '../support/studio-fixture';
import { testPatch } from '../support/patches';
import { as, registerUser, rowCount, startTestServer, TEST_PASSWORD, type TestServer } from '../support/test-server';
import { binaryBody } from '../support/binary-body';

/**
 * Render jobs through the real API, on a real SQLite file and the real worker threads. Invented
 * scenario: Kestrel Lantern Audio exports the harbour bell-wire string for "Saltglass Reach"; the
 * rival studio Gannet Rock Sound must not reach its files.
 */

let server: TestServer;
let studio: StudioFixture;
let rival: StudioFixture;

const baseOutput: RenderOutput = {
  sampleRateHz: 48000,
  format: 'pcm24',
  channels: { kind: 'mono' },
  length: { kind: 'fixed', durationS: 0.5 },
  normalization: { kind: 'peak', ceilingDbfs: -1 },
};

beforeAll(async () => {
  server = await startTestServer();
  studio = await createStudioFixture(server, 'rnd');
  rival = await createStudioFixture(server, 'gannet');
  // A plain pluck with modest modes keeps each render quick.
  const patch = testPatch({ name: 'Harbour bell-wire', render: { sampleRateHz: 48000, durationS: 2, maxModes: 200 } });
  await as(server.app, studio.members.lead.token).patch(`/api/sessions/${studio.sessionId}`).send({ patch }).expect(200);
  await as(server.app, rival.members.lead.token).patch(`/api/sessions/${rival.sessionId}`).send({ patch }).expect(200);
}, 60_000);
afterAll(() => server.close());

function body(output: Partial<RenderOutput> = {}, extra: Partial<CreateRenderBody> = {}): CreateRenderBody {
  return { kind: 'single', source: { kind: 'session', sessionId: studio.sessionId }, output: { ...baseOutput, ...output }, ...extra } as CreateRenderBody;
}

async function download(token: string, renderId: string, query = ''): Promise<{ status: number; bytes: Buffer; type: string; disposition?: string }> {
  const response = await as(server.app, token)
    .get(`/api/renders/${renderId}/file${query}`)
    .buffer(true)
    .parse(binaryBody);
  return { status: response.status, bytes: response.body as Buffer, type: String(response.headers['content-type']), disposition: response.headers['content-disposition'] };
}

/** Starts a render as the producer and waits until it has finished one way or another. */
async function renderDone(request: CreateRenderBody, token = studio.members.producer.token) {
  const started = await as(server.app, token).post(`/api/studios/${studio.studioId}/renders`).send(request);
  expect(started.status, JSON.stringify(started.body)).toBe(202);
  await server.context.renders!.idle();
  const render = (await as(server.app, token).get(`/api/renders/${started.body.render.id}`)).body.render;
  expect(render.state, render.error).toBe('done');
  return render;
}

/** The fmt chunk read straight from the bytes (RIFF WAVE, IBM & Microsoft 1991): tag, channels, rate, bits. */
function fmtOf(bytes: Buffer) {
  let offset = 12;
  while (offset + 8 <= bytes.length) {
    const id = bytes.toString('ascii', offset, offset + 4);
    const size = bytes.readUInt32LE(offset + 4);
    if (id === 'fmt ') return { tag: bytes.readUInt16LE(offset + 8), channels: bytes.readUInt16LE(offset + 10), rate: bytes.readUInt32LE(offset + 12), bits: bytes.readUInt16LE(offset + 22) };
    offset += 8 + size + (size % 2);
  }
  throw new Error('no fmt chunk');
}

/** The bytes of the data chunk. */
function dataOf(bytes: Buffer): Buffer {
  let offset = 12;
  while (offset + 8 <= bytes.length) {
    const size = bytes.readUInt32LE(offset + 4);
    if (bytes.toString('ascii', offset, offset + 4) === 'data') return bytes.subarray(offset + 8, offset + 8 + size);
    offset += 8 + size + (size % 2);
  }
  throw new Error('no data chunk');
}

/** The RIFF INFO list's text fields. */
function infoOf(bytes: Buffer): Record<string, string> {
  const info: Record<string, string> = {};
  let offset = 12;
  while (offset + 8 <= bytes.length) {
    const id = bytes.toString('ascii', offset, offset + 4);
    const size = bytes.readUInt32LE(offset + 4);
    if (id === 'LIST' && bytes.toString('ascii', offset + 8, offset + 12) === 'INFO') {
      let at = offset + 12;
      while (at < offset + 8 + size) {
        const key = bytes.toString('ascii', at, at + 4);
        const length = bytes.readUInt32LE(at + 4);
        info[key] = bytes.toString('utf8', at + 8, at + 8 + length).replace(/\0+$/, '');
        at += 8 + length + (length % 2);
      }
    }
    offset += 8 + size + (size % 2);
  }
  return info;
}

const peakDb = (channels: Float32Array[]) => 20 * Math.log10(Math.max(...channels.map((channel) => channel.reduce((max, value) => Math.max(max, Math.abs(value)), 0))));

describe('render jobs', () => {
  it.each([
    { sampleRateHz: 44100, format: 'pcm16', stereo: false, bits: 16, tag: 1 },
    { sampleRateHz: 48000, format: 'pcm24', stereo: true, bits: 24, tag: 1 },
    { sampleRateHz: 88200, format: 'f32', stereo: false, bits: 32, tag: 3 },
    { sampleRateHz: 96000, format: 'pcm24', stereo: false, bits: 24, tag: 1 },
  ] as const)('writes $format at $sampleRateHz Hz (stereo: $stereo), read back by an independent decoder (wav-decoder)', async ({ sampleRateHz, format, stereo, bits }) => {
    const channels = stereo ? { kind: 'stereo' as const, secondPickupPositionM: 0.41 } : { kind: 'mono' as const };
    const render = await renderDone(body({ sampleRateHz, format, channels }));
    const file = await download(studio.members.listener.token, render.id);
    expect(file.status).toBe(200);
    expect(file.type).toBe('audio/wav');
    expect(file.disposition).toMatch(/^attachment; filename="?[\w-]+\.wav"?$/);
    const fmt = fmtOf(file.bytes);
    expect(fmt.rate).toBe(sampleRateHz);
    expect(fmt.channels).toBe(stereo ? 2 : 1);
    expect(fmt.bits).toBe(bits);
    const decoded = WavDecoder.decode.sync(file.bytes);
    expect(decoded.sampleRate).toBe(sampleRateHz);
    expect(decoded.channelData).toHaveLength(stereo ? 2 : 1);
    expect(decoded.channelData[0].length).toBe(Math.round(0.5 * sampleRateHz));
    expect(render.sizeBytes).toBe(file.bytes.length);
    // Peak normalisation to −1 dBFS, within 0.1 dB (the tolerance).
    expect(Math.abs(peakDb(decoded.channelData) - -1)).toBeLessThan(0.1);
    if (stereo) expect(decoded.channelData[0]).not.toEqual(decoded.channelData[1]);
  }, 60_000);

  it('levels a render to a loudness target: it measures within 0.2 LU of it (ITU-R BS.1770), the true peak under its ceiling', async () => {
    const render = await renderDone(body({ length: { kind: 'fixed', durationS: 2 }, normalization: { kind: 'loudness', targetLufs: -20, truePeakCeilingDbtp: -1 } }));
    const decoded = WavDecoder.decode.sync((await download(studio.members.producer.token, render.id)).bytes);
    const measured = integratedLoudness(decoded.channelData, decoded.sampleRate).integratedLufs;
    expect(Math.abs(measured - -20)).toBeLessThan(0.2);
    expect(Math.abs(render.integratedLufs - -20)).toBeLessThan(0.2);
    expect(render.truePeakDbtp).toBeLessThanOrEqual(-1 + 0.05);
    expect(render.peakDbfs).toBeLessThanOrEqual(render.truePeakDbtp + 1e-9);
  }, 60_000);

  it('cuts a decaying tone where its envelope crosses the threshold: one mode with T60 = 1 s crosses −60 dB at 1 s (derived: T60 = 3 ln 10 / σ)', async () => {
    // The first mode alone (a sine-shaped initial displacement), losses from b1 only: σ = b1 for every mode.
    const points: [number, number][] = Array.from({ length: 401 }, (_, i) => [(0.65 * i) / 400, i === 0 || i === 400 ? 0 : 0.002 * Math.sin((Math.PI * i) / 400)]);
    const sigma = (3 * Math.log(10)) / 1; // T60 = 1 s
    const patch = testPatch({ name: 'One-mode wire', excitation: { displacementM: points }, damping: { b1PerS: sigma, b2M2PerS: 0 }, render: { sampleRateHz: 48000, durationS: 4, maxModes: 64 } });
    const preset = await as(server.app, studio.members.lead.token).post(`/api/studios/${studio.studioId}/presets`).send({ name: 'One-mode wire', patch });
    expect(preset.status, JSON.stringify(preset.body)).toBe(201);
    const render = await renderDone({
      kind: 'single',
      source: { kind: 'preset', presetId: preset.body.preset.id },
      output: { ...baseOutput, format: 'f32', length: { kind: 'untilDecayed', thresholdDb: -60, fadeMs: 0, maxDurationS: 5 }, normalization: { kind: 'peak', ceilingDbfs: -1 } },
    });
    const decoded = WavDecoder.decode.sync((await download(studio.members.producer.token, render.id)).bytes);
    const periodS = 1 / 196; // f0 of the test string is near 196 Hz (sqrt(70 / 6e-4) / 1.3)
    const lengthS = decoded.channelData[0].length / 48000;
    // The last sample at or above −60 dB of the peak lies within one period before 1 s.
    expect(lengthS).toBeGreaterThan(1 - periodS - 1e-3);
    expect(lengthS).toBeLessThan(1 + 1e-3);
    expect(render.durationS).toBeCloseTo(lengthS, 9);
  }, 60_000);

  it('16-bit files carry TPDF dither: the error against the float render is ½ LSB RMS (derived: LSB²/6 + LSB²/12 = LSB²/4)', async () => {
    const settings = { length: { kind: 'fixed' as const, durationS: 1 } };
    // The integers as stored (RIFF data chunk, signed 16-bit little-endian), not a decoder's rescaling.
    const pcm = dataOf((await download(studio.members.producer.token, (await renderDone(body({ ...settings, format: 'pcm16' }))).id)).bytes);
    const float = WavDecoder.decode.sync((await download(studio.members.producer.token, (await renderDone(body({ ...settings, format: 'f32' }))).id)).bytes).channelData[0];
    let sum = 0;
    for (let i = 0; i < float.length; i++) sum += (pcm.readInt16LE(2 * i) - float[i] * 32768) ** 2;
    const rmsLsb = Math.sqrt(sum / float.length);
    expect(rmsLsb).toBeGreaterThan(0.47);
    expect(rmsLsb).toBeLessThan(0.53);
  }, 60_000);

  it('keeps who, what and how inside the file (RIFF INFO: title, software, date, and the settings and patch as JSON) and beside it', async () => {
    const render = await renderDone(body({}, { name: 'Bell-wire for the quay cutscene' }));
    const info = infoOf((await download(studio.members.producer.token, render.id)).bytes);
    expect(info.INAM).toBe('Bell-wire for the quay cutscene');
    expect(info.ISFT).toBe('Tautline');
    expect(info.ICRD).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    const comment = JSON.parse(info.ICMT);
    expect(comment.patch.name).toBe('Harbour bell-wire');
    expect(comment.render.output).toEqual(baseOutput);
    const patch = await as(server.app, studio.members.listener.token).get(`/api/renders/${render.id}/patch.json`);
    expect(patch.status).toBe(200);
    expect(JSON.parse(patch.text).name).toBe('Harbour bell-wire');
    const listed = await as(server.app, studio.members.listener.token).get(`/api/studios/${studio.studioId}/renders?sessionId=${studio.sessionId}`);
    expect(listed.body.renders.some((row: { id: string }) => row.id === render.id)).toBe(true);
    expect(listed.body.storage.usedBytes).toBeGreaterThanOrEqual(render.sizeBytes);
  }, 60_000);

  it('cancelling leaves no file and no temporary file behind', async () => {
    const long = body({ sampleRateHz: 96000, channels: { kind: 'stereo', secondPickupPositionM: 0.3 }, length: { kind: 'fixed', durationS: 60 } });
    const started = await as(server.app, studio.members.producer.token).post(`/api/studios/${studio.studioId}/renders`).send(long);
    expect(started.status).toBe(202);
    const id = started.body.render.id as string;
    // Cancel mid-render: once the job has reported some progress, and before it is done.
    await new Promise<void>((resolve) => {
      const stop = server.context.renders!.onProgress((message) => {
        if (message.renderId === id && message.progressPercent >= 5) {
          stop();
          resolve();
        }
      });
    });
    const cancelled = await as(server.app, studio.members.producer.token).post(`/api/renders/${id}/cancel`);
    expect(cancelled.body.render.state).toBe('cancelled');
    await server.context.renders!.idle();
    expect(readdirSync(server.context.config.rendersDir).filter((name) => name.includes(id) || name.endsWith('.tmp'))).toEqual([]);
    expect((await download(studio.members.producer.token, id)).status).toBe(409);
    expect((await server.dataSource.getRepository(Render).findOneByOrFail({ id })).state).toBe('cancelled');
  }, 60_000);

  it('only leads and producers start exports (403 for a designer or listener, nothing saved); another studio’s render answers 404', async () => {
    const before = await rowCount(server.dataSource, 'renders');
    for (const role of ['designer', 'listener'] as const) {
      const refused = await as(server.app, studio.members[role].token).post(`/api/studios/${studio.studioId}/renders`).send(body());
      expect(refused.status).toBe(403);
      expect(refused.body.error.message).toMatch(/leads and producers/);
    }
    expect(await rowCount(server.dataSource, 'renders')).toBe(before);
    const render = await renderDone(body());
    const outsider = rival.members.lead.token;
    expect((await download(outsider, render.id)).status).toBe(404);
    expect((await as(server.app, outsider).get(`/api/renders/${render.id}`)).status).toBe(404);
    expect((await as(server.app, outsider).get(`/api/renders/${render.id}/patch.json`)).status).toBe(404);
    expect((await as(server.app, outsider).delete(`/api/renders/${render.id}`)).status).toBe(404);
    // Starting a render of another studio's session from one's own studio: 404 too.
    const foreignSource = await as(server.app, studio.members.producer.token).post(`/api/studios/${studio.studioId}/renders`).send({ ...body(), source: { kind: 'session', sessionId: rival.sessionId } });
    expect(foreignSource.status).toBe(404);
    // Only a lead deletes; the file goes with the row.
    expect((await as(server.app, studio.members.producer.token).delete(`/api/renders/${render.id}`)).status).toBe(403);
    expect((await as(server.app, studio.members.lead.token).delete(`/api/renders/${render.id}`)).status).toBe(204);
    expect(existsSync(join(server.context.config.rendersDir, `${render.id}.wav`))).toBe(false);
  }, 60_000);

  it('refuses bad settings with the field named, and saves nothing', async () => {
    const before = await rowCount(server.dataSource, 'renders');
    const cases: Array<[unknown, string]> = [
      [{ ...body(), output: { ...baseOutput, sampleRateHz: 22050 } }, 'output.sampleRateHz'],
      [{ ...body(), output: { ...baseOutput, format: 'pcm8' } }, 'output.format'],
      [{ ...body(), output: { ...baseOutput, normalization: { kind: 'none' } } }, 'output.normalization.kind'],
      [{ ...body(), output: { ...baseOutput, length: { kind: 'untilDecayed', thresholdDb: -200, fadeMs: 10, maxDurationS: 10 } } }, 'output.length.thresholdDb'],
      [{ ...body(), output: { ...baseOutput, channels: { kind: 'stereo', secondPickupPositionM: 2 } } }, 'output.channels.secondPickupPositionM'],
      [{ ...body(), kind: 'noteSet', noteSet: { fromMidi: 60, toMidi: 48, stepSemitones: 3, strengths: 3, retuneBy: 'tension' } }, 'noteSet.toMidi'],
      [{ ...body(), kind: 'noteSet', output: { ...baseOutput, length: { kind: 'fixed', durationS: 30 } }, noteSet: { fromMidi: 48, toMidi: 60, stepSemitones: 3, strengths: 3, retuneBy: 'tension' } }, 'output.length.durationS'],
    ];
    for (const [request, field] of cases) {
      const refused = await as(server.app, studio.members.producer.token).post(`/api/studios/${studio.studioId}/renders`).send(request as object);
      expect(refused.status, field).toBe(400);
      expect(refused.body.error.field, JSON.stringify(refused.body)).toBe(field);
    }
    expect(await rowCount(server.dataSource, 'renders')).toBe(before);
  });
});

describe('a studio that goes with its last member', () => {
  it('takes its render files with it', async () => {
    const solo = await registerUser(server.app, 'solo-lead@kestrel-lantern.example', 'Solo lead');
    const studioId = (await as(server.app, solo.token).post('/api/studios').send({ name: 'Lantern annex' })).body.studio.id as string;
    const sessionId = (await as(server.app, solo.token).post(`/api/studios/${studioId}/sessions`).send({ name: 'Annex wire' })).body.session.id as string;
    const started = await as(server.app, solo.token).post(`/api/studios/${studioId}/renders`).send({ kind: 'single', source: { kind: 'session', sessionId }, output: baseOutput });
    expect(started.status).toBe(202);
    await server.context.renders!.idle();
    const file = join(server.context.config.rendersDir, `${started.body.render.id}.wav`);
    expect(existsSync(file)).toBe(true);
    expect((await as(server.app, solo.token).delete('/api/me').send({ password: TEST_PASSWORD })).status).toBe(204);
    expect(existsSync(file)).toBe(false);
  });
});

describe('render storage quota', () => {
  let small: TestServer;
  let kla: StudioFixture;
  beforeAll(async () => {
    small = await startTestServer({ renderQuotaBytes: 400_000 });
    kla = await createStudioFixture(small, 'quota');
  }, 60_000);
  afterAll(() => small.close());

  it('refuses a render that would not fit with a clear 409, and saves nothing', async () => {
    const request = { kind: 'single', source: { kind: 'session', sessionId: kla.sessionId }, output: { ...baseOutput, length: { kind: 'fixed', durationS: 10 } } };
    const refused = await as(small.app, kla.members.producer.token).post(`/api/studios/${kla.studioId}/renders`).send(request);
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('render_quota_full');
    expect(refused.body.error.message).toMatch(/render storage is full: 0\.0 MB of 0\.4 MB used/);
    expect(await rowCount(small.dataSource, 'renders')).toBe(0);
  });
});
