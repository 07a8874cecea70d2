import { describe, expect, it } from 'vitest';
import { buildNoteSetManifest, NOTE_SET_MANIFEST_FORMAT, NOTE_SET_MANIFEST_VERSION, type RenderedNoteFigures } from '../../../shared/renders/note-set-manifest';
import { noteSetPlan, type NoteSetFile } from '../../../shared/renders/note-set-plan';
import { renderOutput } from '../../../shared/renders/render-settings';

const plan = noteSetPlan({ fromMidi: 36, toMidi: 84, stepSemitones: 3, strengths: 3, retuneBy: 'length' }, 'Harbour Harp');

const output = renderOutput.parse({
  sampleRateHz: 48000,
  format: 'pcm24',
  channels: { kind: 'mono' },
  length: { kind: 'untilDecayed', thresholdDb: -90, fadeMs: 50, maxDurationS: 8 },
  normalization: { kind: 'loudness', targetLufs: -18, truePeakCeilingDbtp: -1 },
});

/** Invented figures for a file: what the runner would measure after finishing it. */
const figures = (file: NoteSetFile, index: number): RenderedNoteFigures & { bytes: Uint8Array; gain: number } => ({
  fundamentalHz: 440 * 2 ** ((file.rootMidi - 69) / 12),
  durationS: 4 + index / 100,
  peakDbfs: -3 - file.strength,
  truePeakDbtp: -2.5 - file.strength,
  integratedLufs: -30 + 4 * file.strength,
  levelling: file.strength === file.strengthCount ? 'truePeakCeiling' : 'strengthGain',
  bytes: new Uint8Array(4),
  gain: 0.5,
});

const set = {
  name: 'Saltglass Reach — Harbour Harp',
  createdAt: '2025-03-14T09:26:53.000Z',
  source: { kind: 'preset' as const, name: 'Harbour Harp (Kestrel Lantern Audio)' },
  retuneBy: 'length' as const,
  output,
  files: plan.map((planned, index) => ({ planned, rendered: figures(planned, index) })),
};

describe('buildNoteSetManifest', () => {
  it('lists every file of the plan, in order, with its keys, velocities and figures', () => {
    const manifest = buildNoteSetManifest(set);
    expect(manifest.files).toHaveLength(51);
    expect(manifest.files.map((file) => file.file)).toEqual(plan.map((file) => file.fileName));
    expect(manifest.files[4]).toEqual({
      file: 'harbour-harp_Ds2_039_s2of3.wav',
      rootMidi: 39,
      rootName: 'D#2',
      keyLowMidi: 38,
      keyHighMidi: 40,
      strength: 2,
      strengthCount: 3,
      velocityLow: 43,
      velocityHigh: 84,
      // Strength 2 of 3: 0.3^(1/2) of the excitation, the contact at 1 − 0.4·½ of its width (NOTE_SET_STRENGTHS).
      displacementScale: Math.sqrt(0.3),
      widthFactor: 0.8,
      fundamentalHz: 440 * 2 ** ((39 - 69) / 12),
      durationS: 4.04,
      peakDbfs: -5,
      truePeakDbtp: -4.5,
      integratedLufs: -22,
      levelling: 'strengthGain',
    });
  });

  it('carries its format, version and how the set was made, and nothing from the figures beyond the manifest fields', () => {
    const manifest = buildNoteSetManifest(set);
    expect(manifest).toMatchObject({
      format: NOTE_SET_MANIFEST_FORMAT,
      version: NOTE_SET_MANIFEST_VERSION,
      name: 'Saltglass Reach — Harbour Harp',
      createdAt: '2025-03-14T09:26:53.000Z',
      software: 'Tautline',
      source: { kind: 'preset', name: 'Harbour Harp (Kestrel Lantern Audio)' },
      retuneBy: 'length',
      sampleRateHz: 48000,
      sampleFormat: 'pcm24',
      channels: 1,
    });
    expect(manifest.format).toBe('tautline-note-set');
    expect(manifest.version).toBe(1);
    expect(Object.keys(manifest.files[0])).not.toContain('bytes');
    expect(Object.keys(manifest.files[0])).not.toContain('gain');
    expect(buildNoteSetManifest({ ...set, software: 'Tautline 0.1.0', output: { ...output, channels: { kind: 'stereo', secondPickupPositionM: 0.3 } } })).toMatchObject({ software: 'Tautline 0.1.0', channels: 2 });
  });

  it('survives JSON unchanged, writing the levels of a silent file as null', () => {
    const silent = { ...set, files: set.files.map((file, index) => (index === 0 ? { ...file, rendered: { ...file.rendered, peakDbfs: -Infinity, truePeakDbtp: -Infinity, integratedLufs: -Infinity } } : file)) };
    const manifest = buildNoteSetManifest(silent);
    expect(JSON.parse(JSON.stringify(manifest))).toEqual(manifest);
    expect(manifest.files[0]).toMatchObject({ peakDbfs: null, truePeakDbtp: null, integratedLufs: null });
  });

  it('refuses a time that is not an ISO 8601 instant and two files of one name', () => {
    expect(() => buildNoteSetManifest({ ...set, createdAt: '14/03/2025' })).toThrow(/Assertion failed/);
    expect(() => buildNoteSetManifest({ ...set, files: [set.files[0], set.files[0]] })).toThrow(/Assertion failed/);
  });
});
