import WavDecoder from 'wav-decoder';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AUDITION_PEAK_DBFS } from '../../shared/audio/wav-format';
import { LIMITS } from '../../shared/limits';
import { testPatch } from '../support/patches';
import { as, registerUser, startTestServer, type TestServer } from '../support/test-server';

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
    const response = await as(server.app, lead.token).get(`/api/presets/${presetId}/preview.wav`).buffer(true).parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
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

  it('answers 404 to someone outside the studio', async () => {
    const outsider = await registerUser(server.app, 'preview-outsider@gannet-rock.example', 'Outsider');
    expect((await as(server.app, outsider.token).get(`/api/presets/${presetId}/preview.wav`)).status).toBe(404);
  });
});
