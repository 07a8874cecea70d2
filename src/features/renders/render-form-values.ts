import type { WavFormat } from '../../../shared/audio/wav-format';
import type { CreateRenderInput } from './api/create-render';

/**
 * The new-render form as typed: numbers stay text until sent, so a half-typed value is the
 * user's to finish. `renderBodyFromForm` turns it into the request body, which the shared
 * `createRenderBody` schema then checks, field by field.
 */
export interface RenderFormValues {
  /** `session:<id>` or `preset:<id>`; empty until chosen. */
  source: string;
  name: string;
  sampleRateHz: string;
  format: WavFormat;
  channels: 'mono' | 'stereo';
  /** The right channel's pickup, millimetres from the nut end (the body carries metres). */
  secondPickupMm: string;
  lengthKind: 'fixed' | 'untilDecayed';
  durationS: string;
  thresholdDb: string;
  fadeMs: string;
  maxDurationS: string;
  level: 'none' | 'peak' | 'loudness';
  ceilingDbfs: string;
  targetLufs: string;
  truePeakCeilingDbtp: string;
  noteSet: boolean;
  fromMidi: string;
  toMidi: string;
  stepSemitones: string;
  strengths: string;
  retuneBy: 'tension' | 'length';
}

export const DEFAULT_RENDER_FORM: RenderFormValues = {
  source: '',
  name: '',
  sampleRateHz: '48000',
  format: 'pcm24',
  channels: 'mono',
  secondPickupMm: '120',
  lengthKind: 'untilDecayed',
  durationS: '3',
  thresholdDb: '-90',
  fadeMs: '20',
  maxDurationS: '30',
  level: 'loudness',
  ceilingDbfs: '-1',
  targetLufs: '-18',
  truePeakCeilingDbtp: '-1',
  noteSet: false,
  fromMidi: '36',
  toMidi: '84',
  stepSemitones: '3',
  strengths: '3',
  retuneBy: 'tension',
};

/** Text to number; an empty field stays missing, so the schema says "is required" rather than "must be a number". */
export function numberFromText(text: string): number | undefined {
  const trimmed = text.trim().replace('−', '-');
  return trimmed === '' ? undefined : Number(trimmed);
}

function sourceFromValue(value: string): CreateRenderInput['source'] | undefined {
  const [kind, ...rest] = value.split(':');
  const id = rest.join(':');
  if (kind === 'session') return { kind: 'session', sessionId: id };
  if (kind === 'preset') return { kind: 'preset', presetId: id };
  return undefined;
}

/**
 * The request body the form describes, not yet checked (missing and malformed values are passed
 * on for the schema to name). The stereo pickup is typed in millimetres and sent in metres.
 */
export function renderBodyFromForm(values: RenderFormValues): unknown {
  const secondMm = numberFromText(values.secondPickupMm);
  const output = {
    sampleRateHz: numberFromText(values.sampleRateHz),
    format: values.format,
    channels: values.channels === 'stereo' ? { kind: 'stereo', secondPickupPositionM: secondMm === undefined ? undefined : secondMm / 1000 } : { kind: 'mono' },
    length:
      values.lengthKind === 'fixed'
        ? { kind: 'fixed', durationS: numberFromText(values.durationS), fadeMs: numberFromText(values.fadeMs) }
        : { kind: 'untilDecayed', thresholdDb: numberFromText(values.thresholdDb), fadeMs: numberFromText(values.fadeMs), maxDurationS: numberFromText(values.maxDurationS) },
    normalization:
      values.level === 'peak'
        ? { kind: 'peak', ceilingDbfs: numberFromText(values.ceilingDbfs) }
        : values.level === 'loudness'
          ? { kind: 'loudness', targetLufs: numberFromText(values.targetLufs), truePeakCeilingDbtp: numberFromText(values.truePeakCeilingDbtp) }
          : { kind: 'none' },
  };
  const common = { name: values.name.trim() || undefined, source: sourceFromValue(values.source), output };
  if (!values.noteSet) return { kind: 'single', ...common };
  return {
    kind: 'noteSet',
    ...common,
    noteSet: {
      fromMidi: numberFromText(values.fromMidi),
      toMidi: numberFromText(values.toMidi),
      stepSemitones: numberFromText(values.stepSemitones),
      strengths: numberFromText(values.strengths),
      retuneBy: values.retuneBy,
    },
  };
}
