import { mkdtempSync, existsSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import FFT from 'fft.js';
import WavDecoder from 'wav-decoder';
import { beforeAll, describe, expect, it } from 'vitest';
import { modeFrequencyHz } from '../../shared/engine/mode-frequencies';
import { renderPatch } from '../../shared/engine/render-patch';
import { validatePatch } from '../../shared/patch/validate-patch';
import { runCli } from '../support/run-cli';
import { testPatch } from '../support/patches';

const dir = mkdtempSync(join(tmpdir(), 'tautline-cli-'));
const patchInput = testPatch({
  string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 6e-4, inharmonicityB: 1e-4 },
  render: { sampleRateHz: 48000, durationS: 3, maxModes: 4096 },
});
const patchPath = join(dir, 'pluck.json');

function writePatch(name: string, content: unknown): string {
  const path = join(dir, name);
  writeFileSync(path, typeof content === 'string' ? content : JSON.stringify(content));
  return path;
}

/** Reads a WAV file with an independent decoder (wav-decoder from npm). */
function decode(path: string) {
  return WavDecoder.decode.sync(readFileSync(path));
}

beforeAll(() => {
  writeFileSync(patchPath, JSON.stringify(patchInput));
});

describe('cli modes', () => {
  it('prints the mode table as JSON with the documented fields', async () => {
    const { code, stdout, stderr } = await runCli(['modes', patchPath]);
    expect(stderr).toBe('');
    expect(code).toBe(0);
    const table = JSON.parse(stdout);
    expect(Object.keys(table)).toEqual(['f0Hz', 'waveSpeedMPerS', 'totalEnergyJ', 'modes']);
    expect(table.f0Hz).toBeCloseTo(Math.sqrt(70 / 6e-4) / 1.3, 9);
    expect(Object.keys(table.modes[0])).toEqual(['n', 'frequencyHz', 'aM', 'vMPerS', 'energyJ', 't60S']);
    expect(table.modes[0].n).toBe(1);
    expect(table.modes.at(-1).frequencyHz).toBeLessThan(24000);
    expect(table.modes[0].t60S).toBeCloseTo((3 * Math.LN10) / (0.5 + 1e-4 * (Math.PI / 0.65) ** 2), 9);
  });

  it('prints t60S as null for a lossless mode', async () => {
    const lossless = writePatch('lossless.json', { ...patchInput, damping: { b1PerS: 0, b2M2PerS: 0 } });
    const { stdout } = await runCli(['modes', lossless]);
    expect(JSON.parse(stdout).modes[3].t60S).toBeNull();
  });
});

describe('cli render', () => {
  it('writes a 24-bit WAV peaking at −1 dBFS whose fundamental an FFT (fft.js) finds within 0.1 Hz', async () => {
    const out = join(dir, 'pluck.wav');
    const { code, stderr } = await runCli(['render', patchPath, '--out', out]);
    expect(stderr).toBe('');
    expect(code).toBe(0);
    const wav = decode(out);
    expect(wav.sampleRate).toBe(48000);
    expect(wav.channelData.length).toBe(1);
    const samples = wav.channelData[0];
    expect(samples.length).toBe(144000);
    const peak = samples.reduce((max, value) => Math.max(max, Math.abs(value)), 0);
    expect(20 * Math.log10(peak)).toBeCloseTo(-1, 3);
    expect(readFileSync(out).readUInt16LE(34)).toBe(24); // bits per sample in the fmt chunk

    // Hann window, zero-padded to 2^20 points (0.046 Hz bins), parabolic interpolation of the peak.
    const size = 2 ** 20;
    const input = new Float64Array(size);
    for (let i = 0; i < samples.length; i++) input[i] = samples[i] * (0.5 - 0.5 * Math.cos((2 * Math.PI * i) / (samples.length - 1)));
    const fft = new FFT(size);
    const spectrum = fft.createComplexArray();
    fft.realTransform(spectrum, Array.from(input));
    const magnitude = (bin: number) => Math.hypot(spectrum[2 * bin], spectrum[2 * bin + 1]);
    const binHz = 48000 / size;
    let loudest = 0;
    for (let bin = Math.round(20 / binHz); bin < size / 2; bin++) loudest = Math.max(loudest, magnitude(bin));
    let bin = Math.round(20 / binHz);
    while (!(magnitude(bin) > 0.1 * loudest && magnitude(bin) >= magnitude(bin - 1) && magnitude(bin) >= magnitude(bin + 1))) bin++;
    const [left, centre, right] = [magnitude(bin - 1), magnitude(bin), magnitude(bin + 1)].map(Math.log);
    const foundHz = (bin + (0.5 * (left - right)) / (left - 2 * centre + right)) * binHz;
    const validated = validatePatch(patchInput);
    if (!validated.ok) throw new Error('test patch invalid');
    expect(Math.abs(foundHz - modeFrequencyHz(validated.value.string, 1))).toBeLessThan(0.1);
  });

  it('keeps physical units with --format f32 --normalize none', async () => {
    const out = join(dir, 'physical.wav');
    const { code } = await runCli(['render', patchPath, '--out', out, '--format', 'f32', '--normalize', 'none']);
    expect(code).toBe(0);
    const samples = decode(out).channelData[0];
    const validated = validatePatch(patchInput);
    if (!validated.ok) throw new Error('test patch invalid');
    const expected = renderPatch(validated.value);
    for (const i of [0, 100, 5000, 143999]) expect(samples[i]).toBeCloseTo(Math.fround(expected[i]), 12);
  });

  it('writes 16-bit PCM when asked', async () => {
    const out = join(dir, 'short.wav');
    const { code } = await runCli(['render', patchPath, '--out', out, '--format', 'pcm16']);
    expect(code).toBe(0);
    expect(readFileSync(out).readUInt16LE(34)).toBe(16);
    expect(decode(out).channelData[0].length).toBe(144000);
  });
});

describe('cli bad input', () => {
  const cases: Array<[string, () => string[], RegExp]> = [
    ['a negative tension', () => ['render', writePatch('neg.json', { ...patchInput, string: { ...patchInput.string, tensionN: -5 } }), '--out', join(dir, 'neg.wav')], /^error: string\.tensionN must be > 0, got -5$/],
    ['unreadable JSON', () => ['render', writePatch('broken.json', '{"name": "x",'), '--out', join(dir, 'broken.wav')], /^error: .*broken\.json is not valid JSON: /],
    ['a missing file', () => ['modes', join(dir, 'nowhere.json')], /^error: .*nowhere\.json does not exist$/],
    ['a wrong type', () => ['modes', writePatch('type.json', { ...patchInput, render: { ...patchInput.render, durationS: 'long' } })], /^error: render\.durationS must be a number, got "long"$/],
    ['too many points', () => ['modes', writePatch('many.json', { ...patchInput, excitation: { displacementM: Array.from({ length: 10_001 }, (_, i) => [i === 10_000 ? 0.65 : (0.65 * i) / 10_000, 0]) } })], /^error: excitation\.displacementM must have at most 10000 points, got an array of 10001 items$/],
    ['a polyline that breaks the rules', () => ['modes', writePatch('order.json', { ...patchInput, excitation: { displacementM: [[0, 0], [0.4, 0.001], [0.3, 0.001], [0.65, 0]] } })], /^error: excitation\.displacementM\[2\]\[0\] must be > the previous point's x \(0\.4\)/],
    ['an unknown format', () => ['render', patchPath, '--out', join(dir, 'fmt.wav'), '--format', 'mp3'], /^error: --format must be one of pcm16, pcm24, f32, got "mp3"$/],
    ['an unknown flag', () => ['render', patchPath, '--out', join(dir, 'flag.wav'), '--loud'], /^error: Unknown option '--loud'/],
    ['no --out', () => ['render', patchPath], /^error: --out is required/],
    ['an unknown command', () => ['play', patchPath], /^error: unknown command "play"/],
    ['an output folder that does not exist', () => ['render', patchPath, '--out', join(dir, 'no', 'such', 'x.wav')], /^error: cannot write .*x\.wav \(ENOENT\)$/],
  ];

  it.each(cases)('refuses %s with one line naming the problem, no stack trace, no file', async (_label, args, pattern) => {
    const before = readdirSync(dir).filter((name) => name.endsWith('.wav')).sort();
    const { code, stdout, stderr } = await runCli(args());
    expect(code).not.toBe(0);
    expect(stdout).toBe('');
    const lines = stderr.trimEnd().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(pattern);
    expect(stderr).not.toMatch(/\n\s+at /);
    const after = readdirSync(dir).filter((name) => name.endsWith('.wav') || name.endsWith('.tmp')).sort();
    expect(after).toEqual(before);
  });

  it('writes nothing when validation fails', async () => {
    const out = join(dir, 'never.wav');
    await runCli(['render', writePatch('bad-rate.json', { ...patchInput, render: { ...patchInput.render, sampleRateHz: 1000 } }), '--out', out]);
    expect(existsSync(out)).toBe(false);
  });
});
