import { samplePeak } from '../../../shared/audio/peak';
import { normalizePeak } from '../../../shared/audio/normalize-peak';
import { DEFAULT_PEAK_CEILING_DBFS, NORMALIZE_MODES, WAV_FORMATS, type NormalizeMode, type WavFormat } from '../../../shared/audio/wav-format';
import { prepareRender } from '../../../shared/engine/render-patch';
import { seededRandom } from '../../../shared/random/seeded-random';
import { encodeWav } from '../../audio/encode-wav';
import { RenderPool } from '../../engine-pool/render-pool';
import { writeFileAtomic } from '../../files/write-file-atomic';
import { CliError } from '../cli-error';
import { readPatchFile } from '../read-patch-file';

export const renderUsage = `render PATCH.json --out FILE.wav [--format ${WAV_FORMATS.join('|')}] [--normalize ${NORMALIZE_MODES.join('|')}]`;

export interface RenderOptions {
  out?: string;
  format?: string;
  normalize?: string;
}

function pick<T extends string>(value: string | undefined, allowed: readonly T[], fallback: T, flag: string): T {
  if (value === undefined) return fallback;
  if ((allowed as readonly string[]).includes(value)) return value as T;
  throw new CliError(`--${flag} must be one of ${allowed.join(', ')}, got ${JSON.stringify(value)}`);
}

/** `render PATCH.json --out FILE.wav`: renders the pickup signal to a mono WAV file. */
export async function renderCommand(positionals: string[], options: RenderOptions, warn: (line: string) => void, clock: () => Date): Promise<string> {
  if (positionals.length !== 1) throw new CliError(`usage: ${renderUsage}`);
  if (!options.out) throw new CliError(`--out is required: ${renderUsage}`);
  if (!options.out.toLowerCase().endsWith('.wav')) throw new CliError(`--out must name a .wav file, got ${JSON.stringify(options.out)}`);
  const format: WavFormat = pick(options.format, WAV_FORMATS, 'pcm24', 'format');
  const normalize: NormalizeMode = pick(options.normalize, NORMALIZE_MODES, 'peak', 'normalize');

  const patch = await readPatchFile(positionals[0]);
  const { table, bank } = prepareRender(patch);
  const pool = new RenderPool();
  let samples: Float64Array;
  try {
    samples = await pool.render(bank);
  } finally {
    await pool.close();
  }

  const physicalPeak = samplePeak(samples);
  if (physicalPeak === 0) warn('warning: the excitation puts no energy into any kept mode at this pickup; the file is silent');
  if (normalize === 'peak') normalizePeak(samples, DEFAULT_PEAK_CEILING_DBFS);

  const encoded = encodeWav(
    samples,
    patch.render.sampleRateHz,
    format,
    { title: patch.name, software: 'Tautline', date: clock().toISOString().slice(0, 10) },
    seededRandom(0x7a017),
  );
  if (encoded.clippedCount > 0) {
    warn(`warning: ${encoded.clippedCount} samples exceeded full scale and were clipped; use --normalize peak or --format f32`);
  }
  try {
    await writeFileAtomic(options.out, encoded.bytes);
  } catch (error) {
    throw new CliError(`cannot write ${options.out} (${(error as NodeJS.ErrnoException).code ?? 'unknown error'})`, 1);
  }
  return JSON.stringify({
    out: options.out,
    format,
    normalize,
    sampleRateHz: patch.render.sampleRateHz,
    samples: samples.length,
    modes: table.count,
    physicalPeak,
    bytes: encoded.bytes.length,
  });
}
