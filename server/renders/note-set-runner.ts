import { modeFrequencyHz } from '../../shared/engine/mode-frequencies';
import type { Patch } from '../../shared/patch/patch-schema';
import { validatePatch } from '../../shared/patch/validate-patch';
import { noteSetFileRender } from '../../shared/renders/note-set-file-render';
import { buildNoteSetManifest, NOTE_SET_MANIFEST_FILE_NAME } from '../../shared/renders/note-set-manifest';
import { noteSetPlan } from '../../shared/renders/note-set-plan';
import { noteSetLevellingNote } from '../../shared/renders/render-levelling';
import type { WavMetadata } from '../audio/encode-wav';
import type { Render } from '../db/entities/render';
import { renderWavFile, type ProgressSink } from './render-job-runner';
import type { RenderTaskPool } from './render-task-pool';
import type { FinishResult } from './render-tasks';

/** Share of a set's progress given to its files; the rest is packing the ZIP. */
const FILES_SHARE = 0.95;

/**
 * A multi-note set as one job: every note of the range at every strength, each retuned (by tension
 * or length, a stereo set's second pickup moving with the string) and rendered by the engine, then
 * packed with a manifest into one ZIP. Each file carries its own patch in its INFO comment
 * (`metadataFor`). Notes render a few at a time, so the pool's threads stay busy while one file is
 * being levelled and encoded.
 */
export async function renderNoteSet(pool: RenderTaskPool, render: Render, metadataFor: (patch: Patch) => WavMetadata, onProgress: ProgressSink) {
  const metadata = metadataFor(render.patch);
  const spec = render.noteSet;
  if (!spec) throw new Error('a note-set render has no note set');
  const plan = noteSetPlan(spec, render.name);
  const fractions = new Array<number>(plan.length).fill(0);
  const report = () => onProgress((FILES_SHARE * fractions.reduce((sum, value) => sum + value, 0)) / plan.length);
  const results = new Array<FinishResult>(plan.length);
  const fundamentalsHz = new Array<number>(plan.length);
  // One unit of work per note: its strengths hardest first, the softer ones taking the hardest's
  // gain, so that levelling brings each note's hardest strength to the target and the softer
  // strengths keep their levels below it (what a sampler's velocity layers need).
  const notes = [...new Set(plan.map((file) => file.rootMidi))].map((root) =>
    plan
      .map((file, index) => ({ file, index }))
      .filter(({ file }) => file.rootMidi === root)
      .sort((a, b) => b.file.strength - a.file.strength),
  );
  let next = 0;
  const worker = async () => {
    while (next < notes.length) {
      let noteGain: number | undefined;
      for (const { file, index } of notes[next++]) {
        const made = noteSetFileRender(render.patch, render.output, spec.retuneBy, file);
        const checked = validatePatch(made.patch);
        if (!checked.ok) throw new Error(`${file.fileName}: ${checked.issues[0].message}`);
        fundamentalsHz[index] = modeFrequencyHz(checked.value.string, 1);
        const title = `${render.name} ${file.rootName} strength ${file.strength}/${file.strengthCount}`;
        results[index] = await renderWavFile(pool, { id: render.id, fileKey: file.fileName }, checked.value, made.output, { ...metadataFor(checked.value), title }, index + 1, (fraction) => {
          fractions[index] = fraction;
          report();
        }, noteGain);
        noteGain ??= results[index].gain;
      }
    }
  };
  await Promise.all(Array.from({ length: Math.max(1, pool.size) }, worker));

  const manifest = buildNoteSetManifest({
    name: render.name,
    createdAt: render.createdAt.toISOString(),
    software: metadata.software,
    source: { kind: render.sourceKind, name: render.sourceName },
    retuneBy: spec.retuneBy,
    output: render.output,
    files: plan.map((planned, index) => ({ planned, rendered: { ...results[index], fundamentalHz: fundamentalsHz[index] } })),
  });
  const files = plan.map((file, index) => ({ name: file.fileName, bytes: results[index].bytes }));
  files.push({ name: NOTE_SET_MANIFEST_FILE_NAME, bytes: new TextEncoder().encode(`${JSON.stringify(manifest, null, 2)}\n`) });
  files.push({ name: 'patch.json', bytes: new TextEncoder().encode(`${JSON.stringify(render.patch, null, 2)}\n`) });
  // Moved, not copied, to the worker: copying 30 MB of files would hold up the event loop.
  const transfer = files.filter((file) => file.bytes.byteOffset === 0 && file.bytes.byteLength === file.bytes.buffer.byteLength).map((file) => file.bytes.buffer as ArrayBuffer);
  const zipped = await pool.run(render.id, { type: 'zip', files }, transfer);
  onProgress(1);
  const loudest = results.reduce((best, result) => (result.integratedLufs > best.integratedLufs ? result : best), results[0]);
  return {
    levellingNote: noteSetLevellingNote(
      results.map((result) => result.levelling),
      render.output,
    ),
    bytes: zipped.bytes,
    fileCount: results.length,
    durationS: Math.max(...results.map((result) => result.durationS)),
    peakDbfs: Math.max(...results.map((result) => result.peakDbfs)),
    truePeakDbtp: Math.max(...results.map((result) => result.truePeakDbtp)),
    integratedLufs: loudest.integratedLufs,
  };
}
