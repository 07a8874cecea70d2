import { useState } from 'react';
import { Button } from '../../../components/button';
import { cautionSeen, markCautionSeen, playUrl, stopPlayback } from '../audio-output';
import { MasterVolume } from './master-volume';

/**
 * Plays a preview. The first play anywhere in the app asks the listener to turn their speakers
 * down first and shows the master volume; every play goes through the master volume and a limiter.
 */
export function AuditionButton({ url, label }: { url: string; label: string }) {
  const [asking, setAsking] = useState(false);
  const [state, setState] = useState<'idle' | 'loading' | 'playing' | 'failed'>('idle');

  const play = async () => {
    setState('loading');
    try {
      const { durationS } = await playUrl(url);
      setState('playing');
      setTimeout(() => setState((current) => (current === 'playing' ? 'idle' : current)), durationS * 1000);
    } catch {
      setState('failed');
    }
  };

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
            } else if (!cautionSeen()) setAsking(true);
            else void play();
          }}
        >
          {state === 'playing' ? '■ Stop' : '▶ Play'}
        </Button>
      </span>
      {state === 'failed' && <span className="text-sm text-ember-600 dark:text-ember-400">The preview could not be played.</span>}
      {asking && (
        <div role="alertdialog" aria-labelledby="audio-caution-title" className="rounded-md border border-brass-500/60 bg-brass-400/15 p-3 text-sm">
          <p id="audio-caution-title" className="font-semibold">
            Before the first sound
          </p>
          <p className="mt-1">Audio can be loud and can hurt hearing and speakers. Turn your speakers or headphones down, then raise the level slowly.</p>
          <div className="mt-2">
            <MasterVolume />
          </div>
          <div className="mt-2 flex gap-2">
            <Button
              onClick={() => {
                markCautionSeen();
                setAsking(false);
                void play();
              }}
            >
              Play at this level
            </Button>
            <Button variant="ghost" onClick={() => setAsking(false)}>
              Not now
            </Button>
          </div>
        </div>
      )}
    </span>
  );
}
