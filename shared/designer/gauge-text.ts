import type { Metres } from '../units';

const INCH_M = 0.0254;
const MM_M = 0.001;

/** A gauge as typed, read: the diameter in metres and the unit it was read in. */
export type GaugeReading = { ok: true; diameterM: Metres; unit: 'mm' | 'in' } | { ok: false; message: string };

/** Below this a bare number is read as inches: no real string is thinner than 0.1 mm, while inch gauges are written .008–.100. */
const BARE_INCH_BELOW = 0.1;

const UNIT_WORDS: Record<string, 'mm' | 'in'> = {
  mm: 'mm',
  in: 'in',
  inch: 'in',
  inches: 'in',
  '"': 'in',
  '″': 'in',
};

/**
 * Reads a string gauge (its diameter) as the trade writes it: `0.46 mm`, `.018 in`, `0.018"`,
 * `0.018″`, `18 thou` (thousandths of an inch). A bare number is millimetres, unless it is below
 * 0.1, which only an inch gauge can be (`.018` is 0.018″ = 0.457 mm). A comma is read as a decimal point.
 */
export function parseGauge(text: string): GaugeReading {
  const trimmed = text.trim().replace(',', '.');
  if (trimmed === '') return { ok: false, message: 'Enter the gauge, e.g. 0.46 mm or .018 in' };
  const match = /^(\d*\.?\d+(?:e-?\d+)?)\s*(mm|inches|inch|in|"|″|thou|mil)?$/i.exec(trimmed);
  if (!match) return { ok: false, message: `Gauge "${text.trim()}" is not a diameter: write it like 0.46 mm, .018 in or 0.018"` };
  const value = Number(match[1]);
  const word = match[2]?.toLowerCase();
  if (!(value > 0)) return { ok: false, message: 'Gauge must be more than 0' };
  if (word === 'thou' || word === 'mil') return { ok: true, diameterM: value * 0.001 * INCH_M, unit: 'in' };
  const unit = word ? UNIT_WORDS[word] : value < BARE_INCH_BELOW ? 'in' : 'mm';
  return { ok: true, diameterM: value * (unit === 'in' ? INCH_M : MM_M), unit };
}

/** A diameter as the trade writes it in either unit: `0.46 mm (.018″)`. */
export function formatGauge(diameterM: Metres): string {
  const mm = diameterM / MM_M;
  const inches = diameterM / INCH_M;
  return `${Number(mm.toPrecision(3))} mm (${inches.toFixed(3).replace(/^0/, '')}″)`;
}
