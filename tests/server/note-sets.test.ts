import JSZip from 'jszip';
import WavDecoder from 'wav-decoder';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { midiToFrequencyHz } from '../../shared/designer/pitch';
import type { NoteSetManifest } from '../../shared/renders/note-set-manifest';
import { estimateFrequencyHz } from '../support/pitch-estimate';
import { createStudioFixture, type StudioFixture } from '../support/studio-fixture';
import { testPatch } from '../support/patches';
import { as, startTestServer, type TestServer } from '../support/test-server';
import { binaryBody } from '../support/binary-body';

/**
 * A multi-note set through the real API and worker threads: Kestrel Lantern Audio turns the
 * harbour bell-wire string into an instrument for "Saltglass Reach".
 */

let server: TestServer;
let studio: StudioFixture;

beforeAll(async () => {
  server = await startTestServer();
  studio = await createStudioFixture(server, 'set');
  // A stiff string, so that tuning the first partial (not f0) is what is checked.
  const patch = testPatch({ name: 'Bell-wire instrument', string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 3e-4 }, render: { sampleRateHz: 48000, durationS: 2, maxModes: 64 } });
  await as(server.app, studio.members.lead.token).patch(`/api/sessions/${studio.sessionId}`).send({ patch }).expect(200);
}, 60_000);
afterAll(() => server.close());

async function zipOf(renderId: string): Promise<JSZip> {
  const response = await as(server.app, studio.members.producer.token)
    .get(`/api/renders/${renderId}/file`)
    .buffer(true)
    .parse(binaryBody);
  expect(response.status).toBe(200);
  expect(response.headers['content-type']).toBe('application/zip');
  return JSZip.loadAsync(response.body as Buffer);
}

describe('multi-note sets', () => {
  it.each(['tension', 'length'] as const)('renders every note and strength retuned by %s into one ZIP whose manifest lists each file; each fundamental is within 1 cent of its note (MIDI Tuning Standard)', async (retuneBy) => {
    const progress: number[] = [];
    const stop = server.context.renders!.onProgress((message) => progress.push(message.progressPercent));
    const started = await as(server.app, studio.members.producer.token)
      .post(`/api/studios/${studio.studioId}/renders`)
      .send({
        kind: 'noteSet',
        name: `Bell-wire by ${retuneBy}`,
        source: { kind: 'session', sessionId: studio.sessionId },
        output: { sampleRateHz: 48000, format: 'pcm24', channels: { kind: 'mono' }, length: { kind: 'fixed', durationS: 1.5 }, normalization: { kind: 'loudness', targetLufs: -20, truePeakCeilingDbtp: -1 } },
        noteSet: { fromMidi: 40, toMidi: 64, stepSemitones: 12, strengths: 2, retuneBy },
      });
    expect(started.status, JSON.stringify(started.body)).toBe(202);
    await server.context.renders!.idle();
    stop();
    const render = (await as(server.app, studio.members.producer.token).get(`/api/renders/${started.body.render.id}`)).body.render;
    expect(render.state, render.error).toBe('done');
    expect(render.fileCount).toBe(6);
    // One job with overall progress: it only rises, and ends at 100.
    expect(progress.length).toBeGreaterThan(3);
    for (let i = 1; i < progress.length; i++) expect(progress[i]).toBeGreaterThanOrEqual(progress[i - 1]);
    expect(progress.at(-1)).toBe(100);

    const zip = await zipOf(render.id);
    const manifest = JSON.parse(await zip.file('manifest.json')!.async('string')) as NoteSetManifest;
    const wavNames = Object.keys(zip.files).filter((name) => name.endsWith('.wav')).sort();
    expect(manifest.files.map((file) => file.file).sort()).toEqual(wavNames);
    expect(Object.keys(zip.files).sort()).toEqual([...wavNames, 'manifest.json', 'patch.json'].sort());
    expect([...new Set(manifest.files.map((file) => file.rootMidi))]).toEqual([40, 52, 64]);
    for (const entry of manifest.files) {
      const decoded = WavDecoder.decode.sync(await zip.file(entry.file)!.async('arraybuffer'));
      expect(decoded.sampleRate).toBe(48000);
      const expectedHz = midiToFrequencyHz(entry.rootMidi);
      const measuredHz = estimateFrequencyHz(decoded.channelData[0], decoded.sampleRate, expectedHz);
      const cents = 1200 * Math.log2(measuredHz / expectedHz);
      expect(Math.abs(cents), `${entry.file}: ${measuredHz} Hz`).toBeLessThan(1);
    }
    // Levelling brings each note's hardest strength to the target; the softer one keeps its level below.
    for (const root of [40, 52, 64]) {
      const [soft, hard] = [1, 2].map((strength) => manifest.files.find((file) => file.rootMidi === root && file.strength === strength)!);
      expect(Math.abs((hard.integratedLufs as number) - -20)).toBeLessThan(0.2);
      // Strength 1 of 2 is the excitation at 0.3 of its size: about 10.5 dB softer (widths differ a little).
      expect((hard.integratedLufs as number) - (soft.integratedLufs as number)).toBeGreaterThan(8);
      expect((hard.integratedLufs as number) - (soft.integratedLufs as number)).toBeLessThan(13);
    }
  }, 120_000);
});
