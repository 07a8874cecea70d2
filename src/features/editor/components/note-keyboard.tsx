import { useEffect, useRef, useState } from 'react';
import { frequencyHzToMidi, midiToFrequencyHz, midiToNoteName } from '../../../../shared/designer/pitch';
import { fundamentalFrequencyHz } from '../../../../shared/engine/mode-frequencies';
import type { Patch } from '../../../../shared/patch/patch-schema';
import { Button } from '../../../components/button';
import { cautionSeen, playSamples } from '../../../lib/audio-output';
import { useSynthesisClient } from '../../../lib/synthesis/page-synthesis';

const BLACK = new Set([1, 3, 6, 8, 10]);
type MidiState = 'off' | 'asking' | 'unsupported' | 'no-device' | 'denied' | { inputs: number };

/**
 * Plays the session's string at other pitches: each note retuned by its tension and rendered by
 * the engine in the page's synthesis worker (the preview's kernel), from the on-screen keys or a
 * MIDI keyboard (Web MIDI).
 */
export function NoteKeyboard({ patch }: { patch: Patch }) {
  const root = Math.round(frequencyHzToMidi(fundamentalFrequencyHz(patch.string)));
  const notes = Array.from({ length: 25 }, (_, index) => root - 12 + index);
  const [played, setPlayed] = useState<string | null>(null);
  const [midi, setMidi] = useState<MidiState>('off');
  const patchRef = useRef(patch);
  patchRef.current = patch;
  const synthesis = useSynthesisClient();

  const play = async (note: number) => {
    if (!cautionSeen()) return setPlayed('Press “Play preview” once first to confirm a safe level.');
    const started = performance.now();
    const rendered = await synthesis.renderNote(patchRef.current, note);
    if ('error' in rendered) return setPlayed(`Cannot play ${midiToNoteName(note)}: ${rendered.error}`);
    const renderMs = performance.now() - started;
    await playSamples(rendered.samples, rendered.sampleRateHz);
    setPlayed(`Played ${midiToNoteName(note)} (${midiToFrequencyHz(note).toFixed(1)} Hz), computed in ${renderMs.toFixed(0)} ms`);
  };
  const playRef = useRef(play);
  playRef.current = play;

  const connectMidi = async () => {
    if (typeof navigator.requestMIDIAccess !== 'function') return setMidi('unsupported');
    setMidi('asking');
    try {
      const access = await navigator.requestMIDIAccess();
      const attach = () => {
        let count = 0;
        access.inputs.forEach((input) => {
          count++;
          input.onmidimessage = (event) => {
            const [status, note, velocity] = event.data ?? [];
            if ((status & 0xf0) === 0x90 && velocity > 0) void playRef.current(note);
          };
        });
        setMidi(count > 0 ? { inputs: count } : 'no-device');
      };
      attach();
      access.onstatechange = attach;
    } catch {
      setMidi('denied');
    }
  };
  useEffect(() => () => setMidi('off'), []);

  const midiWords =
    midi === 'off' ? null : midi === 'asking' ? 'Asking for MIDI…' : midi === 'unsupported' ? 'This browser has no Web MIDI.' : midi === 'no-device' ? 'No MIDI keyboard is connected.' : midi === 'denied' ? 'MIDI access was refused.' : `MIDI: ${midi.inputs} input${midi.inputs === 1 ? '' : 's'} connected.`;

  return (
    <section aria-label="Notes" className="rounded-lg border border-slate-700/15 p-3 dark:border-slate-300/10">
      <div className="mb-2 flex flex-wrap items-center gap-3">
        <h2 className="text-sm font-semibold">Play at other pitches</h2>
        <Button variant="secondary" onClick={() => void connectMidi()}>
          Use MIDI keyboard
        </Button>
        {midiWords && (
          <span role="status" className="text-xs text-slate-600 dark:text-slate-300">
            {midiWords}
          </span>
        )}
      </div>
      <div className="flex overflow-x-auto" role="group" aria-label="Keys">
        {notes.map((note) => {
          const black = BLACK.has(((note % 12) + 12) % 12);
          const isRoot = note === root;
          // Every white key is named; the root (the string's own pitch) is filled and marked.
          const face = isRoot
            ? 'z-10 bg-brass-400 text-slate-950 ring-2 ring-inset ring-brass-700 dark:bg-brass-400 dark:ring-brass-200'
            : black
              ? 'bg-slate-900 text-slate-100 dark:bg-slate-700'
              : 'bg-white text-slate-700 dark:bg-slate-100 dark:text-slate-900';
          return (
            <button
              key={note}
              type="button"
              aria-label={`Play ${midiToNoteName(note)}`}
              title={isRoot ? `${midiToNoteName(note)}: the string's own pitch` : midiToNoteName(note)}
              onClick={() => void play(note)}
              className={`-ml-px flex h-20 w-8 shrink-0 flex-col items-center justify-end rounded-b border border-slate-700/40 pb-1 text-[10px] leading-tight focus-visible:outline-2 focus-visible:outline-teal-400 ${face}`}
            >
              {(!black || isRoot) && <span className={note % 12 === 0 || isRoot ? 'font-semibold' : undefined}>{midiToNoteName(note)}</span>}
              {isRoot && <span className="text-[9px] font-semibold uppercase">root</span>}
            </button>
          );
        })}
      </div>
      {played && (
        <p role="status" className="mt-2 text-xs" data-testid="note-played">
          {played}
        </p>
      )}
    </section>
  );
}
