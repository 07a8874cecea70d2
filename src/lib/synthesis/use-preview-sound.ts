import { useMemo } from 'react';
import { previewBankFromWire, renderBankChunk } from '../../../shared/engine/table-synthesis';
import { renderBank } from '../../../shared/engine/render-bank';
import type { ComputeResult } from '../live-session/session-connection';
import type { PreviewSound } from './preview-sound';

/** The preview of the latest mode table, synthesised in the browser from the table. */
export function usePreviewSound(result: ComputeResult | null): PreviewSound | null {
  return useMemo(() => {
    if (!result) return null;
    const bank = previewBankFromWire(result.wire, result);
    const physical = renderBankChunk(bank, 0, bank.sampleCount, renderBank);
    let peak = 0;
    for (let i = 0; i < physical.length; i++) peak = Math.max(peak, Math.abs(physical[i]));
    const gain = peak > 0 ? 1 / peak : 0;
    const samples = new Float32Array(physical.length);
    for (let i = 0; i < physical.length; i++) samples[i] = physical[i] * gain;
    return { sequence: result.sequence, sampleRateHz: result.wire.preview.sampleRateHz, samples, readySamples: samples.length, complete: true, physicalPeak: peak };
  }, [result]);
}
