import { useCallback, useEffect, useLayoutEffect, useState } from 'react';
import { Button } from '../../../components/button';
import { COMPACT_CONTROL_CLASS } from '../../../components/compact-control';
import { SegmentedChoice } from '../../../components/segmented-choice';
import { followPreview, observeLoop, onSamplesEnded, playPreview, playUrl, setPreviewLoop, stopPlayback } from '../../../lib/audio-output';
import { auditionProbe } from '../../../lib/audio/audition-probe';
import { isPlayable } from '../../../lib/audio/preview-playable';
import { useHearingCaution } from '../../../components/use-hearing-caution';
import type { PreviewSound } from '../../../lib/synthesis/preview-sound';

/** A sound to compare the session's string with: a preset's preview, by its URL. */
export interface ComparisonSound {
  id: string;
  name: string;
  url: string;
}

// The end-to-end tests' probe (null unless a test asked for it) watches the preview loop.
if (auditionProbe) observeLoop(auditionProbe);

/**
 * Plays the session's preview (space bar), once or looped, through the master volume and the
 * limiter, and A/B against a preset's preview (key B switches). Playing starts as soon as the
 * preview's first 250 ms are ready; looped, it follows every newer preview (a drag is heard as it
 * happens), each crossfaded in at the same place in the loop. The first play on a device shows a
 * short hearing-safety caution.
 */
export function PreviewAudition({ sound, comparisons = [] }: { sound: PreviewSound | null; comparisons?: ComparisonSound[] }) {
  const [playing, setPlaying] = useState(false);
  const [loop, setLoop] = useState(false);
  const [info, setInfo] = useState<string | null>(null);
  const [comparisonId, setComparisonId] = useState('');
  const [side, setSide] = useState<'a' | 'b'>('a');
  const comparison = comparisons.find((sound) => sound.id === comparisonId) ?? null;
  const playingB = side === 'b' && comparison !== null;

  const play = useCallback(async () => {
    if (playingB) {
      const played = await playUrl(comparison.url, loop);
      setPlaying(true);
      setInfo(`B: ${comparison.name} · ${played.durationS.toFixed(2)} s`);
      if (!loop) setTimeout(() => setPlaying(false), played.durationS * 1000);
      return;
    }
    if (!sound || !isPlayable(sound)) return;
    const played = await playPreview(sound, loop);
    setPlaying(true);
    setInfo(`${comparison ? 'A: this string · ' : ''}${played.bufferLength} samples at ${played.bufferSampleRateHz} Hz · audio ${played.contextState}`);
  }, [sound, loop, playingB, comparison]);
  const { requestPlay, caution } = useHearingCaution(play);
  const playingA = playing && !playingB;

  // Each new preview, and each further part of one, goes to the loop at once (before paint): it
  // decides whether to crossfade it in (src/lib/audio/loop-crossfade.ts).
  useLayoutEffect(() => {
    if (sound) auditionProbe?.soundSeen(sound);
    if (sound && playingA) void followPreview(sound);
  }, [sound, playingA]);
  useEffect(() => {
    void setPreviewLoop(loop);
  }, [loop]);
  // Played once, the preview ends by itself (however long it was extended).
  useEffect(() => (playingA ? onSamplesEnded(() => setPlaying(false)) : undefined), [playingA]);

  const toggle = useCallback(() => {
    if (playing) {
      void stopPlayback();
      setPlaying(false);
    } else requestPlay();
  }, [playing, requestPlay]);

  // Switching sides while something plays plays the other side at once, as an A/B should.
  const switchSide = useCallback(
    (next: 'a' | 'b') => {
      setSide(next);
      if (playing) void stopPlayback().then(() => setPlaying(false));
    },
    [playing],
  );

  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      const target = event.target as HTMLElement | null;
      if (target?.closest('input, textarea, select, button')) return;
      if (event.code === 'Space') {
        event.preventDefault();
        toggle();
      } else if (event.key.toLowerCase() === 'b' && comparison && !event.ctrlKey && !event.metaKey) {
        event.preventDefault();
        switchSide(side === 'a' ? 'b' : 'a');
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [toggle, switchSide, side, comparison]);

  return (
    <section aria-label="Audition" className="flex flex-wrap items-center gap-x-3 gap-y-2">
      <Button onClick={toggle} disabledReason={(sound && isPlayable(sound)) || playingB ? undefined : 'no preview yet'} aria-keyshortcuts="Space">
        {playing ? '■ Stop' : playingB ? '▶ Play B' : '▶ Play preview'}
      </Button>
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" checked={loop} onChange={(event) => setLoop(event.target.checked)} className="size-4 accent-brass-500" />
        Loop
      </label>
      {comparisons.length > 0 && (
        <>
          <label className="flex items-center gap-2 text-sm">
            Compare with
            <select
              value={comparisonId}
              onChange={(event) => {
                setComparisonId(event.target.value);
                if (!event.target.value) setSide('a');
              }}
              className={COMPACT_CONTROL_CLASS}
            >
              <option value="">no preset</option>
              {comparisons.map((sound) => (
                <option key={sound.id} value={sound.id}>
                  {sound.name}
                </option>
              ))}
            </select>
          </label>
          {comparison && (
            <SegmentedChoice
              label="A/B"
              keyShortcuts="B"
              value={side}
              onChange={switchSide}
              options={[
                { value: 'a', label: 'A: this string' },
                { value: 'b', label: `B: ${comparison.name}` },
              ]}
            />
          )}
        </>
      )}
      <span className="text-xs text-slate-600 dark:text-slate-300">Space plays and stops{comparison ? '; B switches A/B' : ''}</span>
      {info && (
        <span className="text-xs text-slate-600 dark:text-slate-300" data-testid="audition-info">
          {info}
        </span>
      )}
      {caution}
    </section>
  );
}
