import { LIMITS } from '../limits';
import { pickupOutputs, type PickupOutput } from '../patch/patch-schema';
import type { Hertz, Inharmonicity, Joules, KilogramsPerMetre, Metres, Newtons, PerSecond, Seconds, SquareMetresPerSecond } from '../units';

/**
 * The mode table as it travels from the server to every editor: one little-endian binary block,
 * versioned, holding what only the server computes (each kept mode's sine-series amplitudes a_n
 * and v_n) and the few numbers every other per-mode quantity follows from in closed form (the
 * string, the damping, the pickup). The browser rebuilds frequencies, decay rates, energies and
 * the oscillators of the preview from these with the same shared code as the server, so a table
 * of 256 modes is about 2 KB and one of 4,096 modes about 33 KB (LIMITS.modeTableMaxBytes bounds it).
 *
 * Amplitudes travel as float32 (relative rounding 6e-8, far below the 1e-6 of peak the browser's
 * synthesis is held to); every scalar travels as float64.
 *
 * Layout (byte offset: field):
 *   0 u32 magic 'TLMT'            4 u16 format version        6 u8 pickup output   7 u8 reserved (0)
 *   8 u32 sequence               12 u32 mode count
 *  16 f64 document version (admitted updates of the live document; 0 when read from storage)
 *  24 f64 length (m)            32 f64 tension (N)          40 f64 linear density (kg/m)
 *  48 f64 inharmonicity B       56 f64 b1 (1/s)             64 f64 b2 (m²/s)
 *  72 f64 pickup position (m)   80 f64 render rate (Hz)     88 f64 render duration (s)
 *  96 f64 preview rate (Hz)    104 f64 preview duration (s) 112 f64 total energy (J)
 * 120 f64 compute time (ms)    128 u32 state-vector bytes S
 * 132 S bytes: the Yjs state vector the table was computed for, then zero padding to a multiple of 4
 *   then f32 a_n (m) × count, then f32 v_n (m/s) × count.
 */
export const MODE_TABLE_MAGIC = 0x544d4c54; // 'TLMT' read as a little-endian u32
export const MODE_TABLE_FORMAT_VERSION = 1;
export const MODE_TABLE_HEADER_BYTES = 132;

export interface ModeTableWire {
  /** Increases with each table the server sends for a session. */
  sequence: number;
  /** How many updates the server's live document had admitted when the table was computed (0: from storage). */
  documentVersion: number;
  /** The Yjs state vector of the document the table was computed for (empty when unknown). */
  stateVector: Uint8Array;
  string: { lengthM: Metres; tensionN: Newtons; linearDensityKgPerM: KilogramsPerMetre; inharmonicityB: Inharmonicity };
  damping: { b1PerS: PerSecond; b2M2PerS: SquareMetresPerSecond };
  pickup: { output: PickupOutput; positionM: Metres };
  /** The patch's own render settings (the mode count follows from its rate). */
  render: { sampleRateHz: Hertz; durationS: Seconds };
  /** What the browser synthesises for audition: this rate and length (LIMITS.previewMaxSamples at most). */
  preview: { sampleRateHz: Hertz; durationS: Seconds };
  totalEnergyJ: Joules;
  computeMs: number;
  /** Initial displacement amplitude a_n of modes 1…count, metres. */
  aM: Float32Array;
  /** Initial velocity amplitude v_n of modes 1…count, metres per second. */
  vMPerS: Float32Array;
}

const padded = (bytes: number) => Math.ceil(bytes / 4) * 4;

/** Size in bytes of a table of `modeCount` modes with a state vector of `stateVectorBytes`. */
export function modeTableByteLength(modeCount: number, stateVectorBytes: number): number {
  return MODE_TABLE_HEADER_BYTES + padded(stateVectorBytes) + 8 * modeCount;
}

/** Encodes a table; a state vector longer than LIMITS.modeTableMaxStateVectorBytes is left out (sent empty). */
export function encodeModeTable(table: ModeTableWire): Uint8Array<ArrayBuffer> {
  const count = table.aM.length;
  if (table.vMPerS.length !== count) throw new Error('aM and vMPerS must hold the same number of modes');
  const stateVector = table.stateVector.length <= LIMITS.modeTableMaxStateVectorBytes ? table.stateVector : new Uint8Array(0);
  const bytes = new Uint8Array(modeTableByteLength(count, stateVector.length));
  const view = new DataView(bytes.buffer);
  view.setUint32(0, MODE_TABLE_MAGIC, true);
  view.setUint16(4, MODE_TABLE_FORMAT_VERSION, true);
  view.setUint8(6, pickupOutputs.indexOf(table.pickup.output));
  view.setUint32(8, table.sequence, true);
  view.setUint32(12, count, true);
  const scalars = [
    table.documentVersion,
    table.string.lengthM,
    table.string.tensionN,
    table.string.linearDensityKgPerM,
    table.string.inharmonicityB,
    table.damping.b1PerS,
    table.damping.b2M2PerS,
    table.pickup.positionM,
    table.render.sampleRateHz,
    table.render.durationS,
    table.preview.sampleRateHz,
    table.preview.durationS,
    table.totalEnergyJ,
    table.computeMs,
  ];
  scalars.forEach((value, k) => view.setFloat64(16 + 8 * k, value, true));
  view.setUint32(128, stateVector.length, true);
  bytes.set(stateVector, MODE_TABLE_HEADER_BYTES);
  const arraysAt = MODE_TABLE_HEADER_BYTES + padded(stateVector.length);
  for (let m = 0; m < count; m++) {
    view.setFloat32(arraysAt + 4 * m, table.aM[m], true);
    view.setFloat32(arraysAt + 4 * (count + m), table.vMPerS[m], true);
  }
  return bytes;
}

export type DecodedModeTable = { ok: true; table: ModeTableWire } | { ok: false; reason: string };

/** Any binary the socket delivered (ArrayBuffer in the browser, Buffer in Node) as bytes, without copying. */
export function wireBytes(value: unknown): Uint8Array | null {
  if (value instanceof ArrayBuffer) return new Uint8Array(value);
  if (ArrayBuffer.isView(value)) return new Uint8Array(value.buffer, value.byteOffset, value.byteLength);
  return null;
}

/**
 * Reads a table, refusing anything that is not one this version wrote: the reason names what is
 * wrong (size, magic, version, a field out of range), so a client can log it and drop the table.
 */
export function decodeModeTable(value: unknown): DecodedModeTable {
  const bytes = wireBytes(value);
  if (!bytes) return { ok: false, reason: 'the mode table is not binary' };
  if (bytes.byteLength > LIMITS.modeTableMaxBytes) return { ok: false, reason: `the mode table is ${bytes.byteLength} bytes, more than the ${LIMITS.modeTableMaxBytes} allowed` };
  if (bytes.byteLength < MODE_TABLE_HEADER_BYTES) return { ok: false, reason: `the mode table is ${bytes.byteLength} bytes, shorter than its ${MODE_TABLE_HEADER_BYTES}-byte header` };
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (view.getUint32(0, true) !== MODE_TABLE_MAGIC) return { ok: false, reason: 'the block is not a mode table (wrong magic)' };
  const version = view.getUint16(4, true);
  if (version !== MODE_TABLE_FORMAT_VERSION) return { ok: false, reason: `mode table format ${version} is not the supported format ${MODE_TABLE_FORMAT_VERSION}` };
  const output = pickupOutputs[view.getUint8(6)];
  if (!output) return { ok: false, reason: `pickup output code ${view.getUint8(6)} is unknown` };
  const count = view.getUint32(12, true);
  if (count > LIMITS.maxModes) return { ok: false, reason: `mode count ${count} is more than ${LIMITS.maxModes}` };
  const stateVectorBytes = view.getUint32(128, true);
  if (stateVectorBytes > LIMITS.modeTableMaxStateVectorBytes) return { ok: false, reason: `state vector of ${stateVectorBytes} bytes is longer than ${LIMITS.modeTableMaxStateVectorBytes}` };
  const expected = modeTableByteLength(count, stateVectorBytes);
  if (bytes.byteLength !== expected) return { ok: false, reason: `a table of ${count} modes is ${expected} bytes, this one is ${bytes.byteLength}` };

  const f64 = (k: number) => view.getFloat64(16 + 8 * k, true);
  const names = ['document version', 'string length', 'tension', 'linear density', 'inharmonicity B', 'b1', 'b2', 'pickup position', 'render sample rate', 'render duration', 'preview sample rate', 'preview duration', 'total energy', 'compute time'];
  const scalars = names.map((_, k) => f64(k));
  const bad = scalars.findIndex((value) => !Number.isFinite(value) || value < 0);
  if (bad >= 0) return { ok: false, reason: `${names[bad]} must be a finite number ≥ 0, is ${scalars[bad]}` };
  const [documentVersion, lengthM, tensionN, linearDensityKgPerM, inharmonicityB, b1PerS, b2M2PerS, positionM, renderRateHz, renderDurationS, previewRateHz, previewDurationS, totalEnergyJ, computeMs] = scalars;
  for (const [name, value] of [['string length', lengthM], ['tension', tensionN], ['linear density', linearDensityKgPerM], ['render sample rate', renderRateHz], ['preview sample rate', previewRateHz]] as const) {
    if (!(value > 0)) return { ok: false, reason: `${name} must be > 0` };
  }
  if (positionM > lengthM) return { ok: false, reason: 'the pickup position lies beyond the string' };
  if (previewRateHz > LIMITS.previewMaxSampleRateHz) return { ok: false, reason: `preview sample rate ${previewRateHz} Hz is above ${LIMITS.previewMaxSampleRateHz} Hz` };
  if (Math.round(previewDurationS * previewRateHz) > LIMITS.previewMaxSamples) return { ok: false, reason: `the preview would hold more than ${LIMITS.previewMaxSamples} samples` };

  const arraysAt = bytes.byteOffset + MODE_TABLE_HEADER_BYTES + padded(stateVectorBytes);
  // Copied into aligned arrays (the socket's buffer may start anywhere); the byte order is checked to be little-endian by the magic.
  const aM = new Float32Array(count);
  const vMPerS = new Float32Array(count);
  for (let m = 0; m < count; m++) {
    aM[m] = view.getFloat32(arraysAt - bytes.byteOffset + 4 * m, true);
    vMPerS[m] = view.getFloat32(arraysAt - bytes.byteOffset + 4 * (count + m), true);
    if (!Number.isFinite(aM[m]) || !Number.isFinite(vMPerS[m])) return { ok: false, reason: `mode ${m + 1} has an amplitude that is not a finite number` };
  }
  return {
    ok: true,
    table: {
      sequence: view.getUint32(8, true),
      documentVersion,
      stateVector: bytes.slice(MODE_TABLE_HEADER_BYTES, MODE_TABLE_HEADER_BYTES + stateVectorBytes),
      string: { lengthM, tensionN, linearDensityKgPerM, inharmonicityB },
      damping: { b1PerS, b2M2PerS },
      pickup: { output, positionM },
      render: { sampleRateHz: renderRateHz, durationS: renderDurationS },
      preview: { sampleRateHz: previewRateHz, durationS: previewDurationS },
      totalEnergyJ,
      computeMs,
      aM,
      vMPerS,
    },
  };
}

/**
 * The same table with a new sequence, document version and state vector: a table computed once
 * for a patch is re-sent as is when the patch comes back (undo, a rename), without recomputing.
 */
export function restampModeTable(bytes: Uint8Array, stamp: Pick<ModeTableWire, 'sequence' | 'documentVersion' | 'stateVector'>): Uint8Array<ArrayBuffer> {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const count = view.getUint32(12, true);
  const oldVectorBytes = view.getUint32(128, true);
  const stateVector = stamp.stateVector.length <= LIMITS.modeTableMaxStateVectorBytes ? stamp.stateVector : new Uint8Array(0);
  const out = new Uint8Array(modeTableByteLength(count, stateVector.length));
  const outView = new DataView(out.buffer);
  out.set(bytes.subarray(0, MODE_TABLE_HEADER_BYTES));
  outView.setUint32(8, stamp.sequence, true);
  outView.setFloat64(16, stamp.documentVersion, true);
  outView.setUint32(128, stateVector.length, true);
  out.set(stateVector, MODE_TABLE_HEADER_BYTES);
  out.set(bytes.subarray(MODE_TABLE_HEADER_BYTES + padded(oldVectorBytes)), MODE_TABLE_HEADER_BYTES + padded(stateVector.length));
  return out;
}
