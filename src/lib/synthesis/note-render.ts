import { samplePeak } from '../../../shared/audio/peak';
import { retunePatch } from '../../../shared/designer/retune-patch';
import { previewPatch } from '../../../shared/engine/preview-patch';
import { prepareRender } from '../../../shared/engine/render-patch';
import { renderBank } from '../../../shared/engine/render-bank';
import type { MonoBankRenderer } from '../../../shared/engine/table-synthesis';
import type { Patch } from '../../../shared/patch/patch-schema';
import { validatePatch } from '../../../shared/patch/validate-patch';

/** Length of a played note, seconds. */
export const NOTE_DURATION_S = 1.5;
/** Peak of a played note, relative to full scale, before the master volume (−6 dBFS). */
export const NOTE_PEAK = 0.5;

export type RenderedNote = { samples: Float32Array; sampleRateHz: number } | { error: string };

/**
 * Renders the patch's string retuned to a MIDI note with the engine itself (recomputed, not
 * resampled), short and at no more than 48 kHz so it is ready within a few milliseconds. Runs in
 * the synthesis worker with its kernel (`render`); the TypeScript kernel by default.
 */
export function renderNote(patch: Patch, midiNote: number, render: MonoBankRenderer = renderBank): RenderedNote {
  const retuned = validatePatch(retunePatch(patch, midiNote, 'tension'));
  if (!retuned.ok) return { error: retuned.issues[0].message };
  const short = previewPatch(retuned.value, NOTE_DURATION_S);
  const { bank } = prepareRender(short);
  const rendered = new Float64Array(bank.sampleCount);
  render(bank, rendered);
  const peak = samplePeak(rendered);
  const gain = peak > 0 ? NOTE_PEAK / peak : 0;
  const samples = new Float32Array(rendered.length);
  for (let i = 0; i < rendered.length; i++) samples[i] = rendered[i] * gain;
  return { samples, sampleRateHz: short.render.sampleRateHz };
}
