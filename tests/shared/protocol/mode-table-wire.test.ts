import { describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import { keptModeCount } from '../../../shared/engine/mode-frequencies';
import { modeTableMessage } from '../../../shared/engine/mode-table-message';
import { LIMITS } from '../../../shared/limits';
import {
  decodeModeTable,
  encodeModeTable,
  MODE_TABLE_FORMAT_VERSION,
  MODE_TABLE_HEADER_BYTES,
  MODE_TABLE_MAGIC,
  modeTableByteLength,
  restampModeTable,
  type ModeTableWire,
} from '../../../shared/protocol/mode-table-wire';
import { testPatch, validPatch } from '../../support/patches';

/**
 * A table with values that do not survive a float32 (1/3, 1e-300, π·1e5) in every float64 field, so
 * a scalar sent as float32 by mistake would show; amplitudes that are exact float32 values.
 */
function handMadeTable(modeCount: number, stateVector = new Uint8Array([5, 1, 200, 3, 7])): ModeTableWire {
  return {
    sequence: 4_000_000_001,
    documentVersion: 2 ** 40 + 1,
    stateVector,
    string: { lengthM: 0.65 + 1 / 3e9, tensionN: Math.PI * 1e5, linearDensityKgPerM: 1e-300, inharmonicityB: 1 / 3 },
    damping: { b1PerS: Math.E, b2M2PerS: 0.1 + 0.2 },
    pickup: { output: 'velocity', positionM: 0.1 + 1e-12 },
    render: { sampleRateHz: 96000, durationS: 59.999999999 },
    preview: { sampleRateHz: 24000, durationS: 12 },
    totalEnergyJ: 1e-6 / 7,
    computeMs: 0.123456789,
    aM: Float32Array.from({ length: modeCount }, (_, m) => Math.fround(0.003 / (m + 1) ** 2) * (m % 2 ? -1 : 1)),
    vMPerS: Float32Array.from({ length: modeCount }, (_, m) => Math.fround(-0.7 / (m + 1)) + Math.fround(1e-30)),
  };
}

function decoded(bytes: unknown): ModeTableWire {
  const result = decodeModeTable(bytes);
  if (!result.ok) throw new Error(result.reason);
  return result.table;
}

function reasonFor(bytes: unknown): string {
  const result = decodeModeTable(bytes);
  return result.ok ? 'decoded' : result.reason;
}

/** A copy of a good table changed through a DataView. */
function altered(change: (view: DataView, bytes: Uint8Array) => void, table: ModeTableWire = handMadeTable(8)): Uint8Array {
  const bytes = encodeModeTable(table);
  change(new DataView(bytes.buffer), bytes);
  return bytes;
}

/** The offset of scalar k (document version 0, length 1, …, compute time 13). */
const scalarAt = (k: number) => 16 + 8 * k;

/** A Yjs state vector of a document edited by `clients` people (the compute channel sends the live one). */
function stateVectorOf(clients: number): Uint8Array {
  const doc = new Y.Doc();
  for (let c = 0; c < clients; c++) {
    const peer = new Y.Doc();
    Y.applyUpdate(peer, Y.encodeStateAsUpdate(doc));
    for (let edit = 0; edit < 50; edit++) peer.getMap('string').set('tensionN', 60 + edit);
    Y.applyUpdate(doc, Y.encodeStateAsUpdate(peer));
  }
  return Y.encodeStateVector(doc);
}

describe('the mode table on the wire', () => {
  it('round-trips every float64 scalar to the bit, the amplitudes as the same float32 values, and the stamp', () => {
    for (const count of [0, 1, 7, 256]) {
      const table = handMadeTable(count);
      const back = decoded(encodeModeTable(table));
      expect(back).toEqual(table);
      // toEqual on typed arrays compares values; also their kinds and every bit pattern.
      expect(back.aM).toBeInstanceOf(Float32Array);
      expect(Buffer.from(back.aM.buffer).equals(Buffer.from(table.aM.buffer))).toBe(true);
      expect(Buffer.from(back.vMPerS.buffer).equals(Buffer.from(table.vMPerS.buffer))).toBe(true);
      expect(Object.is(back.string.linearDensityKgPerM, 1e-300)).toBe(true);
    }
  });

  it('a table made from a patch carries a_n and v_n rounded to the nearest float32 (IEEE 754) and the patch’s numbers exactly', () => {
    const patch = validPatch(testPatch({ pickup: { positionM: 0.137, output: 'force' } }));
    const message = modeTableMessage(patch, 2, { sequence: 9, documentVersion: 31, stateVector: new Uint8Array([1, 2]) });
    const back = decoded(encodeModeTable(message));
    expect(back.string).toEqual(patch.string);
    expect(back.damping).toEqual(patch.damping);
    expect(back.pickup).toEqual(patch.pickup);
    expect(back.render).toEqual({ sampleRateHz: 48000, durationS: 1 });
    expect(back.preview).toEqual({ sampleRateHz: 48000, durationS: 1 });
    expect(back.aM).toEqual(message.aM);
    expect([back.sequence, back.documentVersion, Array.from(back.stateVector)]).toEqual([9, 31, [1, 2]]);
  });

  it('reads a Node Buffer that starts at an odd offset of a larger buffer (as socket.io delivers binary in Node)', () => {
    const bytes = encodeModeTable(handMadeTable(5));
    const pool = Buffer.alloc(bytes.byteLength + 3);
    pool.set(bytes, 1);
    const unaligned = pool.subarray(1, 1 + bytes.byteLength);
    expect(unaligned.byteOffset % 4).not.toBe(0);
    expect(decoded(unaligned)).toEqual(handMadeTable(5));
    expect(decoded(bytes.buffer)).toEqual(handMadeTable(5));
  });

  it('is at most 16 KB for 256 modes and 64 KB for 4,096 modes (the issue’s targets), even with the longest state vector', () => {
    expect(modeTableByteLength(256, LIMITS.modeTableMaxStateVectorBytes)).toBeLessThanOrEqual(16 * 1024);
    expect(modeTableByteLength(LIMITS.maxModes, LIMITS.modeTableMaxStateVectorBytes)).toBeLessThanOrEqual(64 * 1024);
    expect(modeTableByteLength(LIMITS.maxModes, LIMITS.modeTableMaxStateVectorBytes)).toBeLessThanOrEqual(LIMITS.modeTableMaxBytes);

    // Real patches: f0 = (1/2L)·√(T/μ) (Mersenne's law); T = μ(2L·f0)² puts 256 and 4,096 modes below Nyquist.
    const tensionFor = (f0Hz: number) => 6e-4 * (2 * 0.65 * f0Hz) ** 2;
    const sixteenPeople = stateVectorOf(16);
    for (const [f0Hz, rateHz, maxModes, limitBytes] of [
      [80, 48000, 256, 16 * 1024],
      [11, 96000, 4096, 64 * 1024],
    ] as const) {
      const patch = validPatch(testPatch({ string: { lengthM: 0.65, tensionN: tensionFor(f0Hz), linearDensityKgPerM: 6e-4, inharmonicityB: 0 }, render: { sampleRateHz: rateHz, durationS: 2, maxModes } }));
      expect(keptModeCount(patch.string, maxModes, rateHz)).toBe(maxModes);
      const bytes = encodeModeTable(modeTableMessage(patch, LIMITS.livePreviewMaxDurationS, { sequence: 1, documentVersion: 1, stateVector: sixteenPeople }));
      expect(decoded(bytes).aM.length).toBe(maxModes);
      expect(bytes.byteLength).toBe(MODE_TABLE_HEADER_BYTES + Math.ceil(sixteenPeople.length / 4) * 4 + 8 * maxModes);
      expect(bytes.byteLength).toBeLessThanOrEqual(limitBytes);
    }
  });

  it('leaves out a state vector longer than LIMITS.modeTableMaxStateVectorBytes (sent empty), keeping the rest', () => {
    const long = new Uint8Array(LIMITS.modeTableMaxStateVectorBytes + 1).fill(1);
    const back = decoded(encodeModeTable(handMadeTable(3, long)));
    expect(back.stateVector.length).toBe(0);
    expect(back.aM).toEqual(handMadeTable(3).aM);
    const atLimit = decoded(encodeModeTable(handMadeTable(3, long.subarray(1))));
    expect(atLimit.stateVector.length).toBe(LIMITS.modeTableMaxStateVectorBytes);
  });

  it('restamping keeps every amplitude and figure and changes only the sequence, document version and state vector', () => {
    const original = encodeModeTable(handMadeTable(33, new Uint8Array([9, 9, 9])));
    // Longer (padding 3 → 8 bytes), shorter, empty and over-long state vectors.
    for (const stateVector of [new Uint8Array([1, 2, 3, 4, 5, 6, 7]), new Uint8Array([4]), new Uint8Array(0), new Uint8Array(LIMITS.modeTableMaxStateVectorBytes + 8)]) {
      const restamped = restampModeTable(original, { sequence: 77, documentVersion: 1234, stateVector });
      const back = decoded(restamped);
      const sent = stateVector.length <= LIMITS.modeTableMaxStateVectorBytes ? stateVector : new Uint8Array(0);
      expect(back).toEqual({ ...handMadeTable(33), sequence: 77, documentVersion: 1234, stateVector: sent });
      expect(restamped.byteLength).toBe(modeTableByteLength(33, sent.length));
    }
    // The original is untouched.
    expect(decoded(original)).toEqual(handMadeTable(33, new Uint8Array([9, 9, 9])));
  });
});

describe('a table that is not one this version wrote is refused with a reason', () => {
  const good = () => encodeModeTable(handMadeTable(8));

  it('not binary, too large, too short for its header', () => {
    expect(reasonFor('TLMT')).toBe('the mode table is not binary');
    expect(reasonFor([1, 2, 3])).toBe('the mode table is not binary');
    expect(reasonFor(new Uint8Array(LIMITS.modeTableMaxBytes + 1))).toBe(`the mode table is ${LIMITS.modeTableMaxBytes + 1} bytes, more than the ${LIMITS.modeTableMaxBytes} allowed`);
    expect(reasonFor(good().slice(0, MODE_TABLE_HEADER_BYTES - 1))).toBe(`the mode table is ${MODE_TABLE_HEADER_BYTES - 1} bytes, shorter than its ${MODE_TABLE_HEADER_BYTES}-byte header`);
  });

  it('wrong magic (and so a big-endian writer), another format version, an unknown pickup output', () => {
    expect(reasonFor(altered((view) => view.setUint32(0, MODE_TABLE_MAGIC, false)))).toBe('the block is not a mode table (wrong magic)');
    expect(reasonFor(altered((view) => view.setUint16(4, MODE_TABLE_FORMAT_VERSION + 1, true)))).toBe(`mode table format ${MODE_TABLE_FORMAT_VERSION + 1} is not the supported format ${MODE_TABLE_FORMAT_VERSION}`);
    expect(reasonFor(altered((view) => view.setUint8(6, 3)))).toBe('pickup output code 3 is unknown');
  });

  it('a mode count over LIMITS.maxModes, a state vector over its limit, a length that does not match the counts', () => {
    expect(reasonFor(altered((view) => view.setUint32(12, LIMITS.maxModes + 1, true)))).toBe(`mode count ${LIMITS.maxModes + 1} is more than ${LIMITS.maxModes}`);
    expect(reasonFor(altered((view) => view.setUint32(128, LIMITS.modeTableMaxStateVectorBytes + 1, true)))).toBe(`state vector of ${LIMITS.modeTableMaxStateVectorBytes + 1} bytes is longer than ${LIMITS.modeTableMaxStateVectorBytes}`);
    const expected = modeTableByteLength(8, 5);
    expect(reasonFor(good().slice(0, -1))).toBe(`a table of 8 modes is ${expected} bytes, this one is ${expected - 1}`);
    expect(reasonFor(altered((view) => view.setUint32(12, 9, true)))).toBe(`a table of 9 modes is ${modeTableByteLength(9, 5)} bytes, this one is ${expected}`);
  });

  it('each scalar that is not a finite number ≥ 0 is named', () => {
    const names = ['document version', 'string length', 'tension', 'linear density', 'inharmonicity B', 'b1', 'b2', 'pickup position', 'render sample rate', 'render duration', 'preview sample rate', 'preview duration', 'total energy', 'compute time'];
    names.forEach((name, k) => {
      expect(reasonFor(altered((view) => view.setFloat64(scalarAt(k), Number.NaN, true)))).toBe(`${name} must be a finite number ≥ 0, is NaN`);
      expect(reasonFor(altered((view) => view.setFloat64(scalarAt(k), -1, true)))).toBe(`${name} must be a finite number ≥ 0, is -1`);
    });
    expect(reasonFor(altered((view) => view.setFloat64(scalarAt(2), Number.POSITIVE_INFINITY, true)))).toBe('tension must be a finite number ≥ 0, is Infinity');
  });

  it('a zero length, tension, density or rate; a pickup beyond the string; a preview over its rate or sample budget', () => {
    for (const [k, name] of [[1, 'string length'], [2, 'tension'], [3, 'linear density'], [8, 'render sample rate'], [10, 'preview sample rate']] as const) {
      expect(reasonFor(altered((view) => view.setFloat64(scalarAt(k), 0, true)))).toBe(`${name} must be > 0`);
    }
    expect(reasonFor(altered((view) => view.setFloat64(scalarAt(7), 0.7, true)))).toBe('the pickup position lies beyond the string');
    expect(reasonFor(altered((view) => view.setFloat64(scalarAt(10), 96000, true)))).toBe(`preview sample rate 96000 Hz is above ${LIMITS.previewMaxSampleRateHz} Hz`);
    // 12 s at 48 kHz is 576,000 samples, twice the budget.
    expect(reasonFor(altered((view) => view.setFloat64(scalarAt(10), 48000, true)))).toBe(`the preview would hold more than ${LIMITS.previewMaxSamples} samples`);
  });

  it('a NaN or infinite amplitude names its mode (a_n and v_n alike)', () => {
    const amplitudesAt = MODE_TABLE_HEADER_BYTES + 8; // the 5-byte state vector padded to 8
    expect(reasonFor(altered((view) => view.setFloat32(amplitudesAt + 4 * 2, Number.NaN, true)))).toBe('mode 3 has an amplitude that is not a finite number');
    expect(reasonFor(altered((view) => view.setFloat32(amplitudesAt + 4 * (8 + 7), Number.NEGATIVE_INFINITY, true)))).toBe('mode 8 has an amplitude that is not a finite number');
    // The unchanged table still decodes: each refusal above is the change, not the table.
    expect(reasonFor(good())).toBe('decoded');
  });
});
