import { z } from 'zod';
import { WAV_FORMATS } from '../audio/wav-format';
import { LIMITS } from '../limits';
import type { PickupOutput } from '../patch/patch-schema';

/**
 * What a render job is asked to make: the request body of `POST /api/studios/:id/renders`, shared
 * by the server (which validates it) and the renders page (which builds its form from it). Every
 * field carries its unit; every bound comes from LIMITS.
 */

const finite = () => z.number('must be a number').refine(Number.isFinite, 'must be a finite number');
const between = (bounds: { min: number; max: number }) => finite().gte(bounds.min, `must be >= ${bounds.min}`).lte(bounds.max, `must be <= ${bounds.max}`);

/** What is rendered: a session's current patch or a preset (a snapshot is taken when the job starts). */
export const renderSource = z.discriminatedUnion(
  'kind',
  [z.object({ kind: z.literal('session'), sessionId: z.string().min(1, 'is required') }), z.object({ kind: z.literal('preset'), presetId: z.string().min(1, 'is required') })],
  'must be a session or a preset',
);

export const sampleRateHz = finite().refine((rate) => (LIMITS.sampleRatesHz as readonly number[]).includes(rate), `must be one of ${LIMITS.sampleRatesHz.join(', ')}`);

/** Mono from the patch's pickup, or stereo: left from the patch's pickup, right from a second position. */
export const renderChannels = z.discriminatedUnion(
  'kind',
  [z.object({ kind: z.literal('mono') }), z.object({ kind: z.literal('stereo'), secondPickupPositionM: finite().gt(0, 'must be > 0') })],
  'must be mono or stereo',
);

/** A fixed length, or until the tone has decayed below a threshold relative to its peak (then a short fade). */
export const renderLength = z.discriminatedUnion(
  'kind',
  [
    z.object({
      kind: z.literal('fixed'),
      durationS: finite().gte(LIMITS.renderMinDurationS, `must be >= ${LIMITS.renderMinDurationS}`).lte(LIMITS.renderMaxDurationS, `must be <= ${LIMITS.renderMaxDurationS}`),
      /** The fade that ends the file; LIMITS.renderFixedFadeMs when not given (older renders have none). */
      fadeMs: between(LIMITS.renderFadeMs).optional(),
    }),
    z.object({
      kind: z.literal('untilDecayed'),
      thresholdDb: between(LIMITS.renderDecayThresholdDb),
      fadeMs: between(LIMITS.renderFadeMs),
      maxDurationS: finite().gte(LIMITS.renderMinDurationS, `must be >= ${LIMITS.renderMinDurationS}`).lte(LIMITS.renderMaxDurationS, `must be <= ${LIMITS.renderMaxDurationS}`),
    }),
  ],
  'must be fixed or untilDecayed',
);

/** None (physical units, float files only make sense then), peak to a ceiling, or loudness to a target with a true-peak ceiling. */
export const renderNormalization = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('none') }),
    z.object({ kind: z.literal('peak'), ceilingDbfs: between(LIMITS.renderPeakCeilingDbfs) }),
    z.object({ kind: z.literal('loudness'), targetLufs: between(LIMITS.renderLoudnessTargetLufs), truePeakCeilingDbtp: between(LIMITS.renderTruePeakCeilingDbtp) }),
  ],
  'must be none, peak or loudness',
);

/** The unit a pickup's signal is in, as a render left unlevelled keeps it. */
export const PICKUP_UNITS: Record<PickupOutput, string> = { displacement: 'm', velocity: 'm/s', force: 'N' };

/** Why level "none" cannot go in a PCM file, in the pickup's own unit (or all three when the patch is not known yet). */
export function unlevelledPcmMessage(pickupOutput?: PickupOutput): string {
  const units = pickupOutput ? `the pickup's ${pickupOutput} in ${PICKUP_UNITS[pickupOutput]}` : 'physical units (m, m/s or N, as the pickup reads)';
  return `none keeps ${units}, which only a 32-bit float file can hold: choose peak or loudness for PCM`;
}

/** How a file is written: rate, sample format, channels, length and level; unchecked as a whole. */
const renderOutputFields = z.object({
  sampleRateHz,
  format: z.enum(WAV_FORMATS, `must be one of ${WAV_FORMATS.join(', ')}`),
  channels: renderChannels,
  length: renderLength,
  normalization: renderNormalization,
});

/**
 * How a file is written, checked as a whole: level "none" only in a float file. The browser checks
 * it with the generic message; the server, which knows the patch's pickup, names its unit.
 */
export const renderOutput = renderOutputFields.refine((output) => output.normalization.kind !== 'none' || output.format === 'f32', {
  message: unlevelledPcmMessage(),
  path: ['normalization', 'kind'],
});
export type RenderOutput = z.infer<typeof renderOutput>;

/** A range of notes at several strengths, each note retuned by tension or by length. */
export const noteSetSpec = z
  .object({
    fromMidi: finite().int('must be a whole MIDI note').gte(0, 'must be >= 0').lte(127, 'must be <= 127'),
    toMidi: finite().int('must be a whole MIDI note').gte(0, 'must be >= 0').lte(127, 'must be <= 127'),
    stepSemitones: finite().int('must be a whole number of semitones').gte(1, 'must be >= 1').lte(24, 'must be <= 24'),
    strengths: finite().int('must be a whole number').gte(1, 'must be >= 1').lte(LIMITS.noteSetMaxStrengths, `must be <= ${LIMITS.noteSetMaxStrengths}`),
    retuneBy: z.enum(['tension', 'length'], 'must be tension or length'),
  })
  .refine((spec) => spec.toMidi >= spec.fromMidi, { message: 'must not be below fromMidi', path: ['toMidi'] })
  .refine((spec) => Math.floor((spec.toMidi - spec.fromMidi) / spec.stepSemitones) + 1 <= LIMITS.noteSetMaxNotes, { message: `gives more than ${LIMITS.noteSetMaxNotes} notes`, path: ['stepSemitones'] })
  .refine((spec) => (Math.floor((spec.toMidi - spec.fromMidi) / spec.stepSemitones) + 1) * spec.strengths <= LIMITS.noteSetMaxFiles, { message: `gives more than ${LIMITS.noteSetMaxFiles} files`, path: ['strengths'] });
export type NoteSetSpec = z.infer<typeof noteSetSpec>;

const renderName = z.string().trim().max(LIMITS.maxRenderNameLength, `must be at most ${LIMITS.maxRenderNameLength} characters`).optional();

/**
 * The body of a new render: one file, or a multi-note set delivered as a ZIP. `createRenderBody`
 * checks the output as a whole (the browser's form); the server parses `createRenderBodyFields`
 * and then checks level "none" against the patch's pickup, with `unlevelledPcmMessage`.
 */
// In zod 4 a refined object keeps its type, so both outputs fit one signature.
const renderBodyWith = (output: typeof renderOutputFields) =>
  z.discriminatedUnion(
    'kind',
    [
      z.object({ kind: z.literal('single'), name: renderName, source: renderSource, output }),
      z.object({ kind: z.literal('noteSet'), name: renderName, source: renderSource, output, noteSet: noteSetSpec }).superRefine((body, context) => {
        const { length } = body.output;
        const seconds = length.kind === 'fixed' ? length.durationS : length.maxDurationS;
        if (seconds > LIMITS.noteSetMaxDurationS) {
          context.addIssue({ code: 'custom', message: `must be <= ${LIMITS.noteSetMaxDurationS} for each note of a set`, path: ['output', 'length', length.kind === 'fixed' ? 'durationS' : 'maxDurationS'] });
        }
      }),
    ],
    'must be single or noteSet',
  );
export const createRenderBody = renderBodyWith(renderOutput);
export const createRenderBodyFields = renderBodyWith(renderOutputFields);
export type CreateRenderBody = z.infer<typeof createRenderBody>;

export const RENDER_STATES = ['queued', 'rendering', 'done', 'failed', 'cancelled'] as const;
export type RenderState = (typeof RENDER_STATES)[number];

/** A render as the API lists it. */
export interface RenderView {
  id: string;
  studioId: string;
  kind: 'single' | 'noteSet';
  name: string;
  state: RenderState;
  /** 0–100. */
  progressPercent: number;
  source: { kind: 'session' | 'preset'; id: string; name: string };
  output: RenderOutput;
  noteSet: NoteSetSpec | null;
  /** Set once done. */
  durationS: number | null;
  sizeBytes: number | null;
  peakDbfs: number | null;
  truePeakDbtp: number | null;
  integratedLufs: number | null;
  fileCount: number | null;
  /** Set when the level is not what the settings asked for: held below the loudness target by the true-peak ceiling, or too short for loudness. */
  levellingNote?: string | null;
  error: string | null;
  createdBy: { id: string; displayName: string | null } | null;
  createdAt: string;
  finishedAt: string | null;
}
