import { useEffect } from 'react';
import { heldSynthesisClient } from './page-synthesis';
import type { PreviewSound } from './preview-sound';

/**
 * Asks the page's synthesis worker for the waveform of the finished preview at `columns` pixel
 * columns when what it has is for another width (a resized chart). The answer arrives as a new
 * PreviewSound; until then the chart stretches the columns it has.
 */
export function useWaveformRequest(sound: PreviewSound | null, columns: number): void {
  const analysed = Boolean(sound?.analysis);
  const have = sound?.analysis?.waveform?.columns ?? null;
  useEffect(() => {
    if (analysed && have !== columns) heldSynthesisClient()?.requestWaveform(columns);
  }, [analysed, have, columns]);
}
