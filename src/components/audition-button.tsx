import { useCallback, useState } from 'react';
import { Button } from './button';
import { playUrl, stopPlayback } from '../lib/audio-output';
import { useHearingCaution } from './use-hearing-caution';

/**
 * Plays a preview. The first play anywhere in the app asks the listener to turn their speakers
 * down first and shows the master volume; every play goes through the master volume and a limiter.
 */
export function AuditionButton({ url, label }: { url: string; label: string }) {
  const [state, setState] = useState<'idle' | 'loading' | 'playing' | 'failed'>('idle');

  const play = useCallback(async () => {
    setState('loading');
    try {
      const { durationS } = await playUrl(url);
      setState('playing');
      setTimeout(() => setState((current) => (current === 'playing' ? 'idle' : current)), durationS * 1000);
    } catch {
      setState('failed');
    }
  }, [url]);
  const { requestPlay, caution } = useHearingCaution(play);

  return (
    <span className="inline-flex flex-col gap-2">
      <span className="inline-flex gap-2">
        <Button
          variant="secondary"
          busy={state === 'loading'}
          aria-label={state === 'playing' ? `Stop ${label}` : `Play ${label}`}
          onClick={() => {
            if (state === 'playing') {
              void stopPlayback();
              setState('idle');
            } else requestPlay();
          }}
        >
          {state === 'playing' ? '■ Stop' : '▶ Play'}
        </Button>
      </span>
      {state === 'failed' && <span className="text-sm text-ember-600 dark:text-ember-400">The preview could not be played.</span>}
      {caution}
    </span>
  );
}
