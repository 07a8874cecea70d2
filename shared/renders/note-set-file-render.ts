import { retunePatch } from '../designer/retune-patch';
import { fieldIssue, type FieldIssue } from '../patch/field-issue';
import type { Patch } from '../patch/patch-schema';
import { validatePatch } from '../patch/validate-patch';
import { applyStrength, type NoteSetFile } from './note-set-plan';
import type { NoteSetSpec, RenderOutput } from './render-settings';

/** What one file of a note set is rendered from: its own patch and its own output settings. */
export interface NoteSetFileRender {
  patch: Patch;
  output: RenderOutput;
}

/**
 * One file's patch and output: the patch retuned to the file's root (`retunePatch`, by tension or
 * length) and played at its strength (`applyStrength`). A stereo set's second pickup moves with the
 * string as the first does: retuned by length, it keeps its fraction of the string, x' = x·L'/L, so
 * on a shortened string it still sits where it did relative to the ends (by tension L is unchanged).
 */
export function noteSetFileRender(patch: Patch, output: RenderOutput, retuneBy: NoteSetSpec['retuneBy'], file: NoteSetFile): NoteSetFileRender {
  const retuned = retunePatch(patch, file.rootMidi, retuneBy);
  const played = applyStrength(retuned, file);
  if (output.channels.kind !== 'stereo') return { patch: played, output };
  const secondPickupPositionM = (output.channels.secondPickupPositionM / patch.string.lengthM) * retuned.string.lengthM;
  return { patch: played, output: { ...output, channels: { kind: 'stereo', secondPickupPositionM } } };
}

/**
 * The first problem with any file of a set, checked before the job runs: each file's own patch
 * (`validatePatch`, which holds its pickup on the string) and, in stereo, its second pickup. The
 * message names the file's note; the field is the request's (`output.channels.secondPickupPositionM`
 * for the second pickup, `noteSet` for the retuned patch). Null when every file can be rendered.
 */
export function noteSetFileIssue(patch: Patch, output: RenderOutput, spec: NoteSetSpec, plan: ReadonlyArray<NoteSetFile>): FieldIssue | null {
  for (const file of plan) {
    const made = noteSetFileRender(patch, output, spec.retuneBy, file);
    const checked = validatePatch(made.patch);
    if (!checked.ok) {
      const issue = checked.issues[0];
      return fieldIssue(['noteSet'], `cannot play ${file.rootName} (MIDI ${file.rootMidi}) retuned by ${spec.retuneBy}: ${issue.message}`, spec, false);
    }
    const { channels } = made.output;
    const lengthM = made.patch.string.lengthM;
    if (channels.kind === 'stereo' && !(channels.secondPickupPositionM > 0 && channels.secondPickupPositionM < lengthM)) {
      return fieldIssue(
        ['output', 'channels', 'secondPickupPositionM'],
        `must lie on the string of every note: at ${file.rootName} (MIDI ${file.rootMidi}) it is at ${(channels.secondPickupPositionM * 1000).toFixed(1)} mm, on a string of ${(lengthM * 1000).toFixed(1)} mm`,
        output.channels.kind === 'stereo' ? output.channels.secondPickupPositionM : undefined,
      );
    }
  }
  return null;
}
