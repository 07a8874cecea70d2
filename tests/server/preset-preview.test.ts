import WavDecoder from 'wav-decoder';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AUDITION_PEAK_DBFS } from '../../shared/audio/wav-format';
import { LIMITS } from '../../shared/limits';
import { testPatch } from '../support/patches';
import { as, registerUser, startTestServer, type TestServer } from '../support/test-server';
import { binaryBody } from '../support/binary-body';

let server: TestServer;
let lead: { token: string };
let presetId: string;

beforeAll(async () => {
  server = await startTestServer();
  lead = await registerUser(server.app, 'preview-lead@kestrel-lantern.example', 'Lead');
  const studioId = (await as(server.app, lead.token).post('/api/studios').send({ name: 'Preview studio' })).body.studio.id;
  const patch = testPatch({ render: { sampleRateHz: 96000, durationS: 10, maxModes: 512 } });
  presetId = (await as(server.app, lead.token).post(`/api/studios/${studioId}/presets`).send({ name: 'Quay lamp wire', patch })).body.preset.id;
});
afterAll(() => server.close());

describe('preset audition preview', () => {
  it('is a short 16-bit WAV at no more than 48 kHz, peaking at the audition level', async () => {
    const response = await as(server.app, lead.token).get(`/api/presets/${presetId}/preview.wav`).buffer(true).parse(binaryBody);
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toBe('audio/wav');
    const bytes = response.body as Buffer;
    expect(bytes.readUInt16LE(34)).toBe(16);
    const decoded = WavDecoder.decode.sync(bytes);
    expect(decoded.sampleRate).toBe(LIMITS.previewMaxSampleRateHz);
    expect(decoded.channelData[0].length).toBe(LIMITS.previewMaxDurationS * LIMITS.previewMaxSampleRateHz);
    const peak = decoded.channelData[0].reduce((max, value) => Math.max(max, Math.abs(value)), 0);
    expect(20 * Math.log10(peak)).toBeCloseTo(AUDITION_PEAK_DBFS, 1);
  });

  it('renders off the event loop: while six 4,096-mode auditions render, /api/health answers first; a second request of the same version comes from the cache', async () => {
    const studioId = (await as(server.app, lead.token).post('/api/studios').send({ name: 'Audition rush' })).body.studio.id;
    // A slack string (f0 ≈ 4.4 Hz) keeps all 4,096 modes below 24 kHz.
    const heavy = testPatch({ string: { lengthM: 0.65, tensionN: 0.02, linearDensityKgPerM: 6e-4, inharmonicityB: 0 }, render: { sampleRateHz: 48000, durationS: 4, maxModes: 4096 } });
    const ids: string[] = [];
    for (let i = 0; i < 6; i++) {
      const created = await as(server.app, lead.token).post(`/api/studios/${studioId}/presets`).send({ name: `Ferry bell ${i + 1}`, patch: heavy });
      expect(created.status, JSON.stringify(created.body)).toBe(201);
      ids.push(created.body.preset.id);
    }
    const previews = server.context.renders!.previews;
    const renderedBefore = previews.renderedCount;
    const finished: string[] = [];
    const wav = (id: string) =>
      as(server.app, lead.token)
        .get(`/api/presets/${id}/preview.wav`)
        .buffer(true)
        .parse(binaryBody);
    const auditions = ids.map((id) => wav(id).then((response) => (finished.push(`preview ${id}`), response)));
    // Give the requests a moment to reach the server and start rendering.
    await new Promise((resolve) => setTimeout(resolve, 50));
    const health = await as(server.app, lead.token).get('/api/health');
    finished.push('health');
    expect(health.status).toBe(200);
    const responses = await Promise.all(auditions);
    // Ordering, not a duration: health was answered before any audition finished.
    expect(finished[0]).toBe('health');
    for (const response of responses) expect(response.status).toBe(200);
    expect(previews.renderedCount - renderedBefore).toBe(6);
    // The same version again: the same bytes, and no render.
    const again = await wav(ids[0]);
    expect(Buffer.compare(again.body as Buffer, responses[0].body as Buffer)).toBe(0);
    expect(previews.renderedCount - renderedBefore).toBe(6);
    // A new version of the sound is rendered again.
    const changed = await as(server.app, lead.token).patch(`/api/presets/${ids[0]}`).send({ patch: { ...heavy, render: { ...heavy.render, maxModes: 4000 } } });
    expect(changed.body.preset.version).toBe(2);
    expect((await wav(ids[0])).status).toBe(200);
    expect(previews.renderedCount - renderedBefore).toBe(7);
  }, 120_000);

  it('answers 404 to someone outside the studio', async () => {
    const outsider = await registerUser(server.app, 'preview-outsider@gannet-rock.example', 'Outsider');
    expect((await as(server.app, outsider.token).get(`/api/presets/${presetId}/preview.wav`)).status).toBe(404);
  });
});
