import { useId, useState, type ChangeEvent, type FormEvent, type ReactNode } from 'react';
import { ACTION_REASONS } from '../../../../shared/access/roles';
import type { WavFormat } from '../../../../shared/audio/wav-format';
import { midiToNoteName } from '../../../../shared/designer/pitch';
import { LIMITS } from '../../../../shared/limits';
import type { RenderView } from '../../../../shared/renders/render-settings';
import { Button } from '../../../components/button';
import { Notice } from '../../../components/notice';
import { TextField } from '../../../components/text-field';
import { ApiRequestError } from '../../../lib/api-error';
import { useFieldErrors } from '../../../lib/use-field-errors';
import { createRenderInputSchema, useCreateRender } from '../api/create-render';
import { noteSetSize } from '../note-set-size';
import { DEFAULT_RENDER_FORM, numberFromText, renderBodyFromForm, type RenderFormValues } from '../render-form-values';
import { sampleRateText, signedNumber } from '../render-summary';
import { SelectField } from '../../../components/select-field';

type NumberKey = 'secondPickupMm' | 'durationS' | 'thresholdDb' | 'fadeMs' | 'maxDurationS' | 'ceilingDbfs' | 'targetLufs' | 'truePeakCeilingDbtp' | 'fromMidi' | 'toMidi' | 'stepSemitones' | 'strengths';

/** A session or preset the form offers as what to render. */
export interface RenderSourceOption {
  id: string;
  name: string;
}

export interface NewRenderFormProps {
  studioId: string;
  /** Leads and producers; everyone else sees the form locked, with the reason. */
  canExport: boolean;
  sessions: RenderSourceOption[];
  presets: RenderSourceOption[];
}

const SAMPLE_RATE_HINTS: Record<number, string> = {
  44100: 'The CD rate.',
  48000: 'The usual rate for game and film audio.',
  88200: 'Twice 44.1 kHz: room to pitch the file down later without a dull top.',
  96000: 'Twice 48 kHz: room to pitch the file down later without a dull top.',
};

const FORMAT_LABELS: Record<WavFormat, string> = { pcm16: '16-bit PCM with TPDF dither', pcm24: '24-bit PCM with TPDF dither', f32: '32-bit float' };
const FORMAT_HINTS: Record<WavFormat, string> = {
  pcm16: "TPDF dither: adds a little noise so quiet tails don't distort when cut to 16 bits.",
  pcm24: 'TPDF dither as for 16 bits, here far below hearing: the usual choice for delivery.',
  f32: 'No rounding and no dither; holds levels above full scale, and physical units when not levelled.',
};

const LEVEL_HINTS: Record<RenderFormValues['level'], string> = {
  none: "Leaves the pickup's physical units (metres, m/s or newtons); only a 32-bit float file can hold them.",
  peak: 'Scales the file so its highest sample reaches the ceiling.',
  loudness: 'LUFS per ITU-R BS.1770: how loud it sounds, measured with gating; the true peak ceiling keeps inter-sample peaks under it.',
};

/** Every field the form shows an error under; a problem anywhere else is listed in the notice. */
const PLACED_FIELDS = new Set([
  'source',
  'source.kind',
  'source.sessionId',
  'source.presetId',
  'name',
  'output.sampleRateHz',
  'output.format',
  'output.channels',
  'output.channels.kind',
  'output.channels.secondPickupPositionM',
  'output.length',
  'output.length.kind',
  'output.length.durationS',
  'output.length.thresholdDb',
  'output.length.fadeMs',
  'output.length.maxDurationS',
  'output.normalization',
  'output.normalization.kind',
  'output.normalization.ceilingDbfs',
  'output.normalization.targetLufs',
  'output.normalization.truePeakCeilingDbtp',
  'noteSet.fromMidi',
  'noteSet.toMidi',
  'noteSet.stepSemitones',
  'noteSet.strengths',
  'noteSet.retuneBy',
]);

const range = (bounds: { min: number; max: number }, unit: string) => `${signedNumber(bounds.min)} to ${signedNumber(bounds.max)} ${unit}`;

function noteHint(text: string): string {
  const note = numberFromText(text);
  return note !== undefined && Number.isInteger(note) && note >= 0 && note <= 127 ? `${note} = ${midiToNoteName(note)}` : 'A MIDI note number, 0–127 (60 = C4).';
}

/** How many files the note set makes, or null while its numbers are not whole and in order. */
function noteSetCount(values: RenderFormValues): { notes: number; files: number; strengths: number } | null {
  const [fromMidi, toMidi, stepSemitones, strengths] = [values.fromMidi, values.toMidi, values.stepSemitones, values.strengths].map(numberFromText);
  const whole = [fromMidi, toMidi, stepSemitones, strengths].every((value) => value !== undefined && Number.isInteger(value));
  if (!whole || (toMidi as number) < (fromMidi as number) || (stepSemitones as number) < 1 || (strengths as number) < 1) return null;
  const spec = { fromMidi: fromMidi as number, toMidi: toMidi as number, stepSemitones: stepSemitones as number, strengths: strengths as number };
  return { ...noteSetSize(spec), strengths: spec.strengths };
}

/** A titled group of fields; `wide` groups take the form's full width on large screens, with three columns. */
function Group({ title, wide = false, children }: { title: string; wide?: boolean; children: ReactNode }) {
  return (
    <fieldset className={`rounded-md border border-slate-700/15 p-3 dark:border-slate-300/10 ${wide ? 'lg:col-span-2' : ''}`}>
      <legend className="px-1 text-sm font-semibold text-brass-600 dark:text-brass-400">{title}</legend>
      <div className={`grid gap-x-4 gap-y-1 sm:grid-cols-2 ${wide ? 'lg:grid-cols-3' : ''}`}>{children}</div>
    </fieldset>
  );
}

/**
 * Asks the server for a render: what to render, the file's rate, format and channels, its length
 * and level, and optionally a set of notes. The input is checked with the server's own schema
 * before sending; the server's field problems land under the same fields.
 */
export function NewRenderForm({ studioId, canExport, sessions, presets }: NewRenderFormProps) {
  const create = useCreateRender(studioId);
  const fields = useFieldErrors();
  const [values, setValues] = useState<RenderFormValues>(DEFAULT_RENDER_FORM);
  const [queued, setQueued] = useState<RenderView | null>(null);
  const id = useId();
  const locked = !canExport;
  const reason = canExport ? undefined : ACTION_REASONS.exportRenders;

  const set =
    <K extends keyof RenderFormValues>(key: K) =>
    (value: RenderFormValues[K]) =>
      setValues((current) => ({ ...current, [key]: value }));
  /** The props of a number typed as text: the form keeps what was typed until it is sent. */
  const text = (key: NumberKey) => ({
    value: values[key],
    onChange: (event: ChangeEvent<HTMLInputElement>) => set(key)(event.target.value),
    disabled: locked,
    inputMode: 'decimal' as const,
    autoComplete: 'off',
  });
  const error = (...keys: string[]) => keys.map((key) => fields.errors[key]).find(Boolean);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setQueued(null);
    create.reset();
    const body = fields.check(createRenderInputSchema, renderBodyFromForm(values));
    if (!body) return;
    create.mutate(body, {
      onSuccess: (render) => {
        setQueued(render);
        setValues((current) => ({ ...current, name: '' }));
      },
      onError: fields.fromServer,
    });
  };

  const count = values.noteSet ? noteSetCount(values) : null;
  const unplaced = Object.entries(fields.errors).filter(([key]) => !PLACED_FIELDS.has(key));
  const serverError = create.error;
  const allPlaced = serverError instanceof ApiRequestError && serverError.issues.length > 0 && serverError.issues.every((issue) => PLACED_FIELDS.has(issue.field));
  const showServerError = create.isError && !allPlaced;
  const noSources = sessions.length === 0 && presets.length === 0;

  return (
    <section aria-labelledby={`${id}-title`} className="mb-8 rounded-lg border border-slate-700/15 p-4 dark:border-slate-300/10">
      <h2 id={`${id}-title`} className="font-semibold">
        New render
      </h2>
      <p className="mt-1 text-sm text-slate-700 dark:text-slate-300">
        {canExport ? 'Render a session or preset to a WAV file, or to a set of notes in one ZIP. The patch is kept with the render.' : `You can play and download the studio's renders; ${reason}.`}
      </p>
      <form onSubmit={submit} noValidate aria-labelledby={`${id}-title`} className="mt-3 grid gap-3 lg:grid-cols-2">
        <Group title="What to render" wide>
          <SelectField
            label="Source"
            value={values.source}
            onChange={(event) => set('source')(event.target.value)}
            disabled={locked}
            error={error('source', 'source.kind', 'source.sessionId', 'source.presetId')}
            hint={noSources ? 'The studio has no session or preset yet.' : 'A session renders its string as it is now; a preset as it was saved.'}
          >
            <option value="">Choose a session or preset…</option>
            {sessions.length > 0 && (
              <optgroup label="Sessions">
                {sessions.map((session) => (
                  <option key={session.id} value={`session:${session.id}`}>
                    {session.name}
                  </option>
                ))}
              </optgroup>
            )}
            {presets.length > 0 && (
              <optgroup label="Presets">
                {presets.map((preset) => (
                  <option key={preset.id} value={`preset:${preset.id}`}>
                    {preset.name}
                  </option>
                ))}
              </optgroup>
            )}
          </SelectField>
          <TextField label="Name (optional)" value={values.name} onChange={(event) => set('name')(event.target.value)} disabled={locked} maxLength={LIMITS.maxRenderNameLength} error={error('name')} hint="Empty: named after the source." />
        </Group>

        <Group title="File" wide>
          <SelectField label="Sample rate" value={values.sampleRateHz} onChange={(event) => set('sampleRateHz')(event.target.value)} disabled={locked} error={error('output.sampleRateHz')} hint={SAMPLE_RATE_HINTS[Number(values.sampleRateHz)]}>
            {LIMITS.sampleRatesHz.map((rate) => (
              <option key={rate} value={String(rate)}>
                {sampleRateText(rate)}
              </option>
            ))}
          </SelectField>
          <SelectField label="Format" value={values.format} onChange={(event) => set('format')(event.target.value as WavFormat)} disabled={locked} error={error('output.format')} hint={FORMAT_HINTS[values.format]}>
            {(Object.keys(FORMAT_LABELS) as WavFormat[]).map((format) => (
              <option key={format} value={format}>
                {FORMAT_LABELS[format]}
              </option>
            ))}
          </SelectField>
          <SelectField
            label="Channels"
            value={values.channels}
            onChange={(event) => set('channels')(event.target.value as RenderFormValues['channels'])}
            disabled={locked}
            error={error('output.channels', 'output.channels.kind')}
            hint={values.channels === 'mono' ? "One channel, heard at the patch's pickup." : "Left at the patch's pickup, right at a second point on the string: two views of one string."}
          >
            <option value="mono">Mono (from the pickup)</option>
            <option value="stereo">Stereo (from two pickup positions)</option>
          </SelectField>
          {values.channels === 'stereo' && (
            <TextField label="Second pickup position (mm)" {...text('secondPickupMm')} error={error('output.channels.secondPickupPositionM')} hint="Where the right channel listens, measured along the string like the patch's pickup." />
          )}
        </Group>

        <Group title="Length">
          <SelectField
            label="Length"
            value={values.lengthKind}
            onChange={(event) => set('lengthKind')(event.target.value as RenderFormValues['lengthKind'])}
            disabled={locked}
            error={error('output.length', 'output.length.kind')}
            hint={values.lengthKind === 'fixed' ? 'Every file lasts exactly this long.' : 'Cut once the tone falls below the threshold, with a short fade so the cut makes no click.'}
          >
            <option value="fixed">Fixed length</option>
            <option value="untilDecayed">Until decayed</option>
          </SelectField>
          {values.lengthKind === 'fixed' ? (
            <>
              <TextField
                label="Duration (s)"
                {...text('durationS')}
                error={error('output.length.durationS')}
                hint={`${LIMITS.renderMinDurationS} to ${LIMITS.renderMaxDurationS} s${values.noteSet ? `; each note of a set lasts at most ${LIMITS.noteSetMaxDurationS} s` : ''}.`}
              />
              <TextField label="Fade (ms)" {...text('fadeMs')} error={error('output.length.fadeMs')} hint={`A smooth fade ending the file, ${LIMITS.renderFadeMs.min} to ${LIMITS.renderFadeMs.max} ms.`} />
            </>
          ) : (
            <>
              <TextField label="Decay threshold (dB)" {...text('thresholdDb')} error={error('output.length.thresholdDb')} hint={`Below the tone's peak, ${range(LIMITS.renderDecayThresholdDb, 'dB')}.`} />
              <TextField label="Fade (ms)" {...text('fadeMs')} error={error('output.length.fadeMs')} hint={`A smooth fade ending at the cut, ${LIMITS.renderFadeMs.min} to ${LIMITS.renderFadeMs.max} ms.`} />
              <TextField
                label="Maximum length (s)"
                {...text('maxDurationS')}
                error={error('output.length.maxDurationS')}
                hint={`The file stops here even if still ringing, at most ${LIMITS.renderMaxDurationS} s${values.noteSet ? `; each note of a set at most ${LIMITS.noteSetMaxDurationS} s` : ''}.`}
              />
            </>
          )}
        </Group>

        <Group title="Level">
          <SelectField label="Level" value={values.level} onChange={(event) => set('level')(event.target.value as RenderFormValues['level'])} disabled={locked} error={error('output.normalization', 'output.normalization.kind')} hint={LEVEL_HINTS[values.level]}>
            <option value="none">None (physical units)</option>
            <option value="peak">Peak to a ceiling</option>
            <option value="loudness">Loudness to a target</option>
          </SelectField>
          {values.level === 'peak' && <TextField label="Peak ceiling (dBFS)" {...text('ceilingDbfs')} error={error('output.normalization.ceilingDbfs')} hint={`The highest sample, ${range(LIMITS.renderPeakCeilingDbfs, 'dBFS')}.`} />}
          {values.level === 'loudness' && (
            <>
              <TextField label="Loudness target (LUFS)" {...text('targetLufs')} error={error('output.normalization.targetLufs')} hint={`Integrated loudness, ${range(LIMITS.renderLoudnessTargetLufs, 'LUFS')}.`} />
              <TextField
                label="True peak ceiling (dBTP)"
                {...text('truePeakCeilingDbtp')}
                error={error('output.normalization.truePeakCeilingDbtp')}
                hint={`${range(LIMITS.renderTruePeakCeilingDbtp, 'dBTP')}; the level is lowered rather than let a peak pass it.`}
              />
            </>
          )}
        </Group>

        <fieldset className="rounded-md border border-slate-700/15 p-3 lg:col-span-2 dark:border-slate-300/10">
          <legend className="px-1 text-sm font-semibold text-brass-600 dark:text-brass-400">Notes</legend>
          <label className="flex items-center gap-2 text-sm font-semibold">
            <input type="checkbox" checked={values.noteSet} onChange={(event) => set('noteSet')(event.target.checked)} disabled={locked} aria-describedby={`${id}-note-set-hint`} className="size-4 accent-brass-500" />
            Multi-note set
          </label>
          <p id={`${id}-note-set-hint`} className="mt-1 text-xs text-slate-600 dark:text-slate-300">
            The string played at a range of notes and strengths, one WAV each, delivered in one ZIP.
          </p>
          {values.noteSet && (
            <div className="mt-3 grid gap-x-4 gap-y-1 sm:grid-cols-2 lg:grid-cols-3">
              <TextField label="From note (MIDI)" {...text('fromMidi')} inputMode="numeric" error={error('noteSet.fromMidi')} hint={noteHint(values.fromMidi)} />
              <TextField label="To note (MIDI)" {...text('toMidi')} inputMode="numeric" error={error('noteSet.toMidi')} hint={noteHint(values.toMidi)} />
              <TextField label="Every (semitones)" {...text('stepSemitones')} inputMode="numeric" error={error('noteSet.stepSemitones')} hint="From the lowest note up: 1 for every note, 12 for octaves." />
              <TextField label="Strengths" {...text('strengths')} inputMode="numeric" error={error('noteSet.strengths')} hint={`Each note at 1 to ${LIMITS.noteSetMaxStrengths} strengths; a harder one is a larger, narrower pluck.`} />
              <SelectField
                label="Retune"
                value={values.retuneBy}
                onChange={(event) => set('retuneBy')(event.target.value as RenderFormValues['retuneBy'])}
                disabled={locked}
                error={error('noteSet.retuneBy')}
                hint={values.retuneBy === 'tension' ? 'Keeps the length and changes the tension for each note, as a tuning peg does.' : 'Keeps the tension and changes the sounding length for each note, as a fret does.'}
              >
                <option value="tension">By tension</option>
                <option value="length">By length</option>
              </SelectField>
              <p role="status" className="self-center text-sm font-semibold">
                {count
                  ? `Makes ${count.files} file${count.files === 1 ? '' : 's'}: ${count.notes} note${count.notes === 1 ? '' : 's'} × ${count.strengths} strength${count.strengths === 1 ? '' : 's'} (at most ${LIMITS.noteSetMaxFiles}).`
                  : 'Enter whole numbers, lowest note first, to see how many files it makes.'}
              </p>
            </div>
          )}
        </fieldset>

        <div className="flex flex-wrap items-center gap-3 lg:col-span-2">
          <Button type="submit" busy={create.isPending} disabledReason={reason}>
            Start render
          </Button>
        </div>
      </form>

      <div className="mt-3 flex flex-col gap-2">
        {queued && (
          <Notice tone="success" title="Render queued">
            “{queued.name}” is waiting for its turn; its progress shows in the list below.
          </Notice>
        )}
        {showServerError && (
          <Notice tone="error" title="The render was not started">
            {serverError?.message}
          </Notice>
        )}
        {!create.isError && unplaced.length > 0 && (
          <Notice tone="error" title="The render was not started">
            <ul className="list-disc pl-5">
              {unplaced.map(([field, problem]) => (
                <li key={field}>
                  {field}: {problem}
                </li>
              ))}
            </ul>
          </Notice>
        )}
      </div>
    </section>
  );
}
