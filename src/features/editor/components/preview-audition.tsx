import { useCallback, useEffect, useState } from 'react';
import { Button } from '../../../components/button';
import { cautionSeen, playSamples, stopPlayback } from '../../audition/audio-output';
import { AudioCaution } from '../../audition/components/audio-caution';
import type { ComputeResult } from '../../collab/api/session-connection';

/**
 * Plays the preview the server sent (space bar), once or looped, through the master volume and the
 * limiter. The first play on a device shows a short hearing-safety caution.
 */
export function PreviewAudition({ result }: { result: ComputeResult | null }) {
  const [asking, setAsking] = useState(false);
  const [playing, setPlaying] = useState(false);
  const [loop, setLoop] = useState(false);
  const [info, setInfo] = useState<string | null>(null);

  const play = useCallback(async () => {
    if (!result) return;
    const played = await playSamples(result.preview, result.previewSampleRateHz, loop);
    setPlaying(true);
    setInfo(`${played.bufferLength} samples at ${played.bufferSampleRateHz} Hz · audio ${played.contextState}`);
    if (!loop) setTimeout(() => setPlaying(false), played.durationS * 1000);
  }, [result, loop]);

  const toggle = useCallback(() => {
    if (playing) {
      void stopPlayback();
      setPlaying(false);
    } else if (!cautionSeen()) setAsking(true);
    else void play();
  }, [playing, play]);

  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      const target = event.target as HTMLElement | null;
      if (event.code !== 'Space' || target?.closest('input, textarea, select, button')) return;
      event.preventDefault();
      toggle();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [toggle]);

  return (
    <section aria-label="Audition" className="flex flex-wrap items-center gap-3 rounded-lg border border-slate-700/15 p-3 dark:border-slate-300/10">
      <Button onClick={toggle} disabledReason={result ? undefined : 'no preview yet'} aria-keyshortcuts="Space">
        {playing ? '■ Stop' : '▶ Play preview'}
      </Button>
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" checked={loop} onChange={(event) => setLoop(event.target.checked)} className="size-4 accent-brass-500" />
        Loop
      </label>
      <span className="text-xs text-slate-600 dark:text-slate-300">Space bar plays and stops</span>
      {info && (
        <span className="text-xs text-slate-600 dark:text-slate-300" data-testid="audition-info">
          {info}
        </span>
      )}
      {asking && (
        <AudioCaution
          onConfirm={() => {
            setAsking(false);
            void play();
          }}
          onCancel={() => setAsking(false)}
        />
      )}
    </section>
  );
}
