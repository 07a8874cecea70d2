import type { Hertz } from '../../../shared/units';
import { columnMinMax } from './column-min-max';
import { magnitudeSpectrum, type MagnitudeSpectrum } from './magnitude-spectrum';
import { envelopeBlockS, rmsEnvelope, type RmsEnvelope } from './rms-envelope';

/** The waveform chart's data for one plot width: each pixel column's lowest and highest sample, and the decay envelope in blocks no shorter than a column. */
export interface WaveformColumns {
  columns: number;
  min: Float32Array;
  max: Float32Array;
  envelope: RmsEnvelope;
}

/**
 * What the charts draw of a complete preview, computed in the synthesis worker so the page only
 * draws: the magnitude spectrum, the whole preview's decay envelope (blocks of two periods of f0,
 * for the waveform's summary) and, once a plot width is known, the waveform's columns.
 */
export interface PreviewAnalysis {
  spectrum: MagnitudeSpectrum;
  envelope: RmsEnvelope;
  waveform: WaveformColumns | null;
}

/** The waveform's columns and envelope for a plot `columns` pixels wide (the envelope's blocks follow envelopeBlockS). */
export function waveformColumns(samples: Float32Array, sampleRateHz: Hertz, f0Hz: Hertz, columns: number): WaveformColumns {
  const durationS = samples.length / sampleRateHz;
  const { min, max } = columnMinMax(samples, columns);
  return { columns, min, max, envelope: rmsEnvelope(samples, sampleRateHz, envelopeBlockS(f0Hz, durationS, columns)) };
}

/** The charts' data of a complete, peak-normalised preview; the waveform's columns only when a width is asked for. */
export function analysePreview(samples: Float32Array, sampleRateHz: Hertz, f0Hz: Hertz, columns: number | null): PreviewAnalysis {
  const durationS = samples.length / sampleRateHz;
  return {
    spectrum: magnitudeSpectrum(samples, sampleRateHz),
    envelope: rmsEnvelope(samples, sampleRateHz, envelopeBlockS(f0Hz, durationS, 0)),
    waveform: columns !== null && columns > 0 ? waveformColumns(samples, sampleRateHz, f0Hz, columns) : null,
  };
}

/** The buffers of a waveform's data, to transfer rather than copy. */
export function waveformBuffers(waveform: WaveformColumns | null): ArrayBuffer[] {
  return waveform ? [waveform.min.buffer, waveform.max.buffer, waveform.envelope.timeS.buffer, waveform.envelope.levelDb.buffer] as ArrayBuffer[] : [];
}

/** The buffers of an analysis, to transfer rather than copy. */
export function analysisBuffers(analysis: PreviewAnalysis): ArrayBuffer[] {
  return [analysis.spectrum.levelDb.buffer, analysis.envelope.timeS.buffer, analysis.envelope.levelDb.buffer, ...waveformBuffers(analysis.waveform)] as ArrayBuffer[];
}
