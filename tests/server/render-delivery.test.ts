import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import JSZip from 'jszip';
import WavDecoder from 'wav-decoder';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { midiToFrequencyHz } from '../../shared/designer/pitch';
import { retunePatch } from '../../shared/designer/retune-patch';
import { truePeak } from '../../shared/audio/true-peak';
import type { NoteSetManifest } from '../../shared/renders/note-set-manifest';
import type { CreateRenderBody, RenderOutput } from '../../shared/renders/render-settings';
import { estimateFrequencyHz } from '../support/pitch-estimate';
import { createStudioFixture, type StudioFixture } from '../support/studio-fixture';
import { testPatch, validPatch } from '../support/patches';
import { as, startTestServer, type TestServer } from '../support/test-server';
import { binaryBody } from '../support/binary-body';

/**
 * Delivered files as a producer checks them with independent tools (wav-decoder, JSZip, an FFT
 * pitch estimate): short loudness renders, the fades, the levelling notes, stereo note sets retuned
 * by length, each note's own patch in its file, and plain error text. Invented scenario: Kestrel
 * Lantern Audio delivers the ferry-rope string for "Saltglass Reach".
 */

let server: TestServer;
let studio: StudioFixture;
const patch = testPatch({ name: 'Ferry rope', render: { sampleRateHz: 48000, durationS: 2, maxModes: 120 } });

const baseOutput: RenderOutput = {
  sampleRateHz: 48000,
  format: 'f32',
  channels: { kind: 'mono' },
  length: { kind: 'fixed', durationS: 0.5 },
  normalization: { kind: 'peak', ceilingDbfs: -1 },
};

beforeAll(async () => {
  server = await startTestServer();
  studio = await createStudioFixture(server, 'dlv');
  await as(server.app, studio.members.lead.token).patch(`/api/sessions/${studio.sessionId}`).send({ patch }).expect(200);
}, 60_000);
afterAll(() => server.close());

const single = (output: Partial<RenderOutput>): CreateRenderBody => ({ kind: 'single', source: { kind: 'session', sessionId: studio.sessionId }, output: { ...baseOutput, ...output } }) as CreateRenderBody;

async function bytesOf(renderId: string): Promise<Buffer> {
  const response = await as(server.app, studio.members.producer.token)
    .get(`/api/renders/${renderId}/file`)
    .buffer(true)
    .parse(binaryBody);
  expect(response.status).toBe(200);
  return response.body as Buffer;
}

async function finished(request: CreateRenderBody) {
  const started = await as(server.app, studio.members.producer.token).post(`/api/studios/${studio.studioId}/renders`).send(request);
  expect(started.status, JSON.stringify(started.body)).toBe(202);
  await server.context.renders!.idle();
  return (await as(server.app, studio.members.producer.token).get(`/api/renders/${started.body.render.id}`)).body.render;
}

/** The RIFF INFO comment (ICMT) of a WAV file, read straight from its bytes (RIFF WAVE, IBM & Microsoft 1991). */
function commentOf(bytes: Buffer): string {
  let offset = 12;
  while (offset + 8 <= bytes.length) {
    const size = bytes.readUInt32LE(offset + 4);
    if (bytes.toString('ascii', offset, offset + 4) === 'LIST' && bytes.toString('ascii', offset + 8, offset + 12) === 'INFO') {
      for (let at = offset + 12; at < offset + 8 + size; ) {
        const length = bytes.readUInt32LE(at + 4);
        if (bytes.toString('ascii', at, at + 4) === 'ICMT') return bytes.toString('utf8', at + 8, at + 8 + length).replace(/\0+$/, '');
        at += 8 + length + (length % 2);
      }
    }
    offset += 8 + size + (size % 2);
  }
  throw new Error('no ICMT');
}

const rms = (samples: Float32Array) => Math.sqrt(samples.reduce((sum, value) => sum + value * value, 0) / samples.length);

describe('loudness levelling as delivered', () => {
  it('levels a render shorter than one 400 ms block by its true peak to the ceiling, and says so in its row', async () => {
    const render = await finished(single({ format: 'pcm24', length: { kind: 'fixed', durationS: 0.18 }, normalization: { kind: 'loudness', targetLufs: -20, truePeakCeilingDbtp: -1 } }));
    expect(render.state, render.error).toBe('done');
    const decoded = WavDecoder.decode.sync(await bytesOf(render.id));
    // Read back with the meter (checked against an FFT upsampler in tests/shared/audio/true-peak.test.ts).
    const measured = truePeak(decoded.channelData, decoded.sampleRate);
    expect(measured.truePeakDbtp).toBeLessThanOrEqual(-1 + 0.02);
    expect(measured.truePeakDbtp).toBeGreaterThan(-1 - 0.1);
    expect(render.truePeakDbtp).toBeLessThanOrEqual(-1 + 1e-6);
    expect(render.integratedLufs).toBeNull();
    expect(render.levellingNote).toMatch(/Shorter than one 400 ms loudness block.*true peak to −1 dBTP instead of −20 LUFS/);
  }, 60_000);

  it('says in the row when the true-peak ceiling held a render below its loudness target', async () => {
    const render = await finished(single({ length: { kind: 'fixed', durationS: 1 }, normalization: { kind: 'loudness', targetLufs: -6, truePeakCeilingDbtp: -3 } }));
    expect(render.integratedLufs).toBeLessThan(-6.5);
    expect(render.levellingNote).toMatch(/^Held \d+\.\d LU below the −6 LUFS target by the −3 dBTP true-peak ceiling\.$/);
    const reached = await finished(single({ length: { kind: 'fixed', durationS: 1 }, normalization: { kind: 'loudness', targetLufs: -30, truePeakCeilingDbtp: -1 } }));
    expect(reached.levellingNote).toBeNull();
  }, 60_000);
});

describe('the end of a fixed-length file', () => {
  it('fades to silence over the last samples (raised cosine, 10 ms unless the settings say)', async () => {
    const render = await finished(single({ length: { kind: 'fixed', durationS: 0.5 } }));
    const samples = WavDecoder.decode.sync(await bytesOf(render.id)).channelData[0];
    const peak = samples.reduce((max, value) => Math.max(max, Math.abs(value)), 0);
    expect(Math.abs(samples[samples.length - 1])).toBeLessThan(1e-6 * peak);
    expect(Math.max(...Array.from(samples.subarray(samples.length - 24)).map(Math.abs))).toBeLessThan(0.01 * peak);
    // 10 ms before the end the tone still plays (a 196 Hz pluck rings for seconds).
    expect(rms(samples.subarray(samples.length - 960 - 480, samples.length - 960))).toBeGreaterThan(0.05 * peak);
  }, 60_000);
});

describe('level "none" in a PCM file', () => {
  it.each([
    ['velocity', 'm/s'],
    ['force', 'N'],
    ['displacement', 'm'],
  ] as const)('is refused in the %s pickup’s own unit (%s)', async (output, unit) => {
    const created = await as(server.app, studio.members.lead.token)
      .post(`/api/studios/${studio.studioId}/presets`)
      .send({ name: `Ferry rope ${output}`, patch: { ...patch, pickup: { positionM: 0.1, output } } });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const refused = await as(server.app, studio.members.producer.token)
      .post(`/api/studios/${studio.studioId}/renders`)
      .send({ kind: 'single', source: { kind: 'preset', presetId: created.body.preset.id }, output: { ...baseOutput, format: 'pcm24', normalization: { kind: 'none' } } });
    expect(refused.status).toBe(400);
    expect(refused.body.error.field).toBe('output.normalization.kind');
    expect(refused.body.error.message).toContain(`the pickup's ${output} in ${unit},`);
    expect(refused.body.error.message).not.toMatch(/metres/);
  });
});

describe('a stereo note set retuned by length', () => {
  it('moves the second pickup with the string: both channels carry each note, and each file embeds its own patch', async () => {
    const stiff = { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 1e-4 };
    const created = await as(server.app, studio.members.lead.token)
      .post(`/api/studios/${studio.studioId}/presets`)
      .send({ name: 'Ferry rope pair', patch: { ...patch, string: stiff } });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const render = await finished({
      kind: 'noteSet',
      name: 'Ferry rope pair',
      source: { kind: 'preset', presetId: created.body.preset.id },
      output: { ...baseOutput, channels: { kind: 'stereo', secondPickupPositionM: 0.5 }, length: { kind: 'fixed', durationS: 1 }, normalization: { kind: 'loudness', targetLufs: -6, truePeakCeilingDbtp: -12 } },
      noteSet: { fromMidi: 52, toMidi: 76, stepSemitones: 12, strengths: 1, retuneBy: 'length' },
    });
    expect(render.state, render.error).toBe('done');
    const zip = await JSZip.loadAsync(await bytesOf(render.id));
    const manifest = JSON.parse(await zip.file('manifest.json')!.async('string')) as NoteSetManifest;
    expect(manifest.files).toHaveLength(3);
    for (const entry of manifest.files) {
      const bytes = Buffer.from(await zip.file(entry.file)!.async('uint8array'));
      const [left, right] = WavDecoder.decode.sync(bytes).channelData;
      const ratioDb = 20 * Math.log10(rms(right) / rms(left));
      expect(Math.abs(ratioDb), `${entry.file}: right/left ${ratioDb.toFixed(1)} dB`).toBeLessThan(20);
      const expectedHz = midiToFrequencyHz(entry.rootMidi);
      for (const channel of [left, right]) {
        const cents = 1200 * Math.log2(estimateFrequencyHz(channel, 48000, expectedHz) / expectedHz);
        expect(Math.abs(cents), entry.file).toBeLessThan(1);
      }
      // The file's INFO comment carries the note's own retuned patch, not the set's.
      const embedded = JSON.parse(commentOf(bytes)).patch;
      const retuned = retunePatch(validPatch({ ...patch, string: stiff }), entry.rootMidi, 'length');
      expect(embedded.string.lengthM).toBeCloseTo(retuned.string.lengthM, 12);
      expect(embedded.pickup.positionM).toBeCloseTo(retuned.pickup.positionM, 12);
      if (entry.rootMidi === 76) expect(embedded.string.lengthM).toBeLessThan(0.3);
      // A −12 dBTP ceiling under a −6 LUFS target holds every note below it; the manifest says so per file.
      expect(entry.levelling).toBe('truePeakCeiling');
    }
    expect(render.levellingNote).toMatch(/^3 of 3 notes held below the −6 LUFS target by the −12 dBTP true-peak ceiling/);
  }, 120_000);

  it('refuses before the job runs when a note cannot be played, naming the field and the note', async () => {
    // β = B·T = 0.7 N of bending stiffness: by tension this string cannot come down to MIDI 0 (T' = μ(2Lf)² − β ≈ 0.068 − 0.7 N < 0).
    const created = await as(server.app, studio.members.lead.token)
      .post(`/api/studios/${studio.studioId}/presets`)
      .send({ name: 'Ferry rope bar', patch: { ...patch, string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 0.01 } } });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const before = (await as(server.app, studio.members.producer.token).get(`/api/studios/${studio.studioId}/renders`)).body.renders.length;
    const refused = await as(server.app, studio.members.producer.token)
      .post(`/api/studios/${studio.studioId}/renders`)
      .send({
        kind: 'noteSet',
        source: { kind: 'preset', presetId: created.body.preset.id },
        output: { ...baseOutput, length: { kind: 'fixed', durationS: 1 } },
        noteSet: { fromMidi: 0, toMidi: 12, stepSemitones: 12, strengths: 1, retuneBy: 'tension' },
      });
    expect(refused.status).toBe(400);
    expect(refused.body.error.field).toBe('noteSet');
    expect(refused.body.error.message).toMatch(/cannot play C-1 \(MIDI 0\) retuned by tension: string\.tensionN/);
    expect((await as(server.app, studio.members.producer.token).get(`/api/studios/${studio.studioId}/renders`)).body.renders).toHaveLength(before);
  }, 60_000);
});

describe('render storage that stops working', () => {
  let broken: TestServer;
  let kla: StudioFixture;
  beforeAll(async () => {
    broken = await startTestServer();
    kla = await createStudioFixture(broken, 'brk');
  }, 60_000);
  afterAll(() => broken.close());

  it('fails the job with plain words and no server path; the detail goes to the log', async () => {
    const logged: string[] = [];
    broken.context.log = (line) => logged.push(line);
    const dir = broken.context.config.rendersDir;
    // The folder is replaced by a file after start.
    rmSync(dir, { recursive: true, force: true });
    writeFileSync(dir, 'not a folder');
    const started = await as(broken.app, kla.members.producer.token)
      .post(`/api/studios/${kla.studioId}/renders`)
      .send({ kind: 'single', source: { kind: 'session', sessionId: kla.sessionId }, output: { ...baseOutput, length: { kind: 'fixed', durationS: 0.2 } } });
    expect(started.status).toBe(202);
    await broken.context.renders!.idle();
    const render = (await as(broken.app, kla.members.producer.token).get(`/api/renders/${started.body.render.id}`)).body.render;
    expect(render.state).toBe('failed');
    expect(render.error).toBe('the render could not be written to storage; an administrator has the details');
    expect(render.error).not.toContain('/');
    expect(logged.join('\n')).toMatch(/ENOTDIR/);
  }, 60_000);
});

describe('starting with an unusable RENDERS_DIR', () => {
  it('exits with code 1 and one line naming RENDERS_DIR and the reason, no stack trace', () => {
    const dir = mkdtempSync(join(tmpdir(), 'tautline-start-'));
    try {
      const notAFolder = join(dir, 'renders');
      writeFileSync(notAFolder, 'a file where a folder should be');
      const env: NodeJS.ProcessEnv = { ...process.env, RENDERS_DIR: notAFolder, DATABASE_PATH: join(dir, 'db.sqlite'), PORT: '0', HOST: '127.0.0.1' };
      delete env.SMTP_URL;
      const result = spawnSync('npx', ['tsx', 'server/main.ts'], {
        cwd: process.cwd(),
        env,
        encoding: 'utf8',
        timeout: 60_000,
      });
      expect(result.status, result.stderr).toBe(1);
      const stderrLines = result.stderr.split('\n').filter((line) => line.trim() !== '');
      expect(stderrLines).toEqual([`Tautline cannot start: RENDERS_DIR ${notAFolder} cannot hold render files: it is a file, not a folder`]);
      expect(result.stdout + result.stderr).not.toMatch(/\bat .+:\d+:\d+/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  }, 90_000);
});
