import { useState } from 'react';
import { MASTER_VOLUME_DB, setMasterVolumeDb, storedMasterVolumeDb } from '../lib/audio-output';

/** The master volume of everything the app plays, always within reach in the header. */
export function MasterVolume() {
  const [volumeDb, setVolumeDb] = useState(storedMasterVolumeDb);
  return (
    <label className="flex shrink-0 items-center gap-2 text-sm text-slate-700 dark:text-slate-300" title="Master volume of every preview (a limiter follows it)">
      <span className="sr-only xl:not-sr-only">Volume</span>
      <input
        type="range"
        min={MASTER_VOLUME_DB.min}
        max={MASTER_VOLUME_DB.max}
        step={1}
        value={volumeDb}
        aria-valuetext={`${volumeDb} dB`}
        className="w-20 accent-brass-500 xl:w-24"
        onChange={(event) => {
          setVolumeDb(Number(event.target.value));
          void setMasterVolumeDb(Number(event.target.value));
        }}
      />
      <span className="w-12 tabular-nums">{volumeDb} dB</span>
    </label>
  );
}
