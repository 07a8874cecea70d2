import { useId } from 'react';
import { Button } from './button';
import { markCautionSeen } from '../lib/audio-output';
import { MasterVolume } from './master-volume';

/**
 * The hearing-safety caution shown before the first sound on a device: start low, with the master
 * volume at hand. Confirming remembers it on this device.
 */
export function AudioCaution({ onConfirm, onCancel }: { onConfirm: () => void; onCancel: () => void }) {
  const id = useId();
  return (
    <div role="alertdialog" aria-labelledby={`${id}-title`} className="w-full rounded-md border border-brass-500/60 bg-brass-400/15 p-3 text-sm">
      <p id={`${id}-title`} className="font-semibold">
        Before the first sound
      </p>
      <p className="mt-1">
        Start low: loud audio can hurt hearing and speakers. Turn your speakers or headphones down, then raise the level slowly. Long listening is safe only at
        moderate levels (WHO–ITU H.870: at most 80 dB(A) for 40 hours a week).
      </p>
      <div className="mt-2">
        <MasterVolume />
      </div>
      <div className="mt-2 flex gap-2">
        <Button
          onClick={() => {
            markCautionSeen();
            onConfirm();
          }}
        >
          Play at this level
        </Button>
        <Button variant="ghost" onClick={onCancel}>
          Not now
        </Button>
      </div>
    </div>
  );
}
