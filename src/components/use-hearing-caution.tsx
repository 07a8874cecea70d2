import { useCallback, useState, type ReactNode } from 'react';
import { cautionSeen } from '../lib/audio-output';
import { AudioCaution } from './audio-caution';

/**
 * The hearing-safety step before a sound: `requestPlay()` plays at once once the caution has been
 * confirmed on this device; before that it shows the caution (render `caution` where it belongs)
 * and plays when the listener confirms.
 */
export function useHearingCaution(play: () => Promise<void>): { requestPlay: () => void; caution: ReactNode } {
  const [asking, setAsking] = useState(false);
  const requestPlay = useCallback(() => {
    if (cautionSeen()) void play();
    else setAsking(true);
  }, [play]);
  const caution = asking ? (
    <AudioCaution
      onConfirm={() => {
        setAsking(false);
        void play();
      }}
      onCancel={() => setAsking(false)}
    />
  ) : null;
  return { requestPlay, caution };
}
