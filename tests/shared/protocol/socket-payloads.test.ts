import { describe, expect, it } from 'vitest';
import { LIMITS } from '../../../shared/limits';
import { PROTOCOL_VERSION } from '../../../shared/protocol/compute-protocol';
import {
  claimedId,
  invalidMessageSchema,
  isWireBinary,
  joinedMessageSchema,
  modeTableMessageSchema,
  parsePayload,
  payloadProblem,
  refusedMessageSchema,
  renderJoinedMessageSchema,
  renderProgressMessageSchema,
  renderRefusedMessageSchema,
  renderSubscribeRequestSchema,
  sessionNoticeSchema,
  subscribeRequestSchema,
  unsubscribeRequestSchema,
} from '../../../shared/protocol/socket-payloads';

const SESSION = '6f1c2d9e-4b7a-4e1f-9a53-2c8d0b7e5a14';
const STUDIO = 'a3e8b1f0-7c2d-4d6e-8f91-0b5c4a2e7d36';

const messagesOf = (result: ReturnType<typeof parsePayload>) => (result.ok ? [] : result.issues.map((issue) => issue.message));

/** A mode-table message as it arrives: the table as Buffer (Node) or ArrayBuffer (browser). */
function wireTable(binary: 'buffer' | 'arraybuffer', overrides: Record<string, unknown> = {}) {
  const bytes = new Uint8Array(132 + 8 * 12);
  return { type: 'table', sessionId: SESSION, table: binary === 'buffer' ? Buffer.from(bytes.buffer) : bytes.buffer, ...overrides };
}

describe('requests the server receives', () => {
  it('subscribe: takes a good one; names the field of a wrong type, a missing field, an unknown key, an id too long', () => {
    expect(parsePayload(subscribeRequestSchema, { protocolVersion: PROTOCOL_VERSION, sessionId: SESSION })).toEqual({ ok: true, value: { protocolVersion: PROTOCOL_VERSION, sessionId: SESSION } });
    expect(messagesOf(parsePayload(subscribeRequestSchema, { protocolVersion: PROTOCOL_VERSION, sessionId: 7 }))).toEqual(['sessionId must be a string, got 7']);
    expect(messagesOf(parsePayload(subscribeRequestSchema, { sessionId: SESSION }))).toEqual(['protocolVersion is required']);
    expect(messagesOf(parsePayload(subscribeRequestSchema, { protocolVersion: '2', sessionId: SESSION }))).toEqual(['protocolVersion must be a number, got "2"']);
    expect(messagesOf(parsePayload(subscribeRequestSchema, { protocolVersion: 2.5, sessionId: SESSION }))).toEqual(['protocolVersion must be a whole number, got 2.5']);
    expect(messagesOf(parsePayload(subscribeRequestSchema, { protocolVersion: PROTOCOL_VERSION, sessionId: SESSION, colour: 'teal' }))).toEqual(['colour is not part of this message, got "teal"']);
    expect(messagesOf(parsePayload(subscribeRequestSchema, { protocolVersion: PROTOCOL_VERSION, sessionId: 's'.repeat(LIMITS.maxSocketIdLength + 1) }))).toEqual([
      `sessionId must be at most ${LIMITS.maxSocketIdLength} characters, got "${'s'.repeat(40)}…"`,
    ]);
    expect(messagesOf(parsePayload(subscribeRequestSchema, { protocolVersion: PROTOCOL_VERSION, sessionId: '' }))).toEqual(['sessionId is required, got ""']);
  });

  it('a payload that is not an object at all is "payload"', () => {
    for (const [payload, got] of [[null, 'null'], [undefined, 'undefined'], [42, '42'], [[SESSION], 'an array of 1 item'], ['hello', '"hello"']] as const) {
      expect(messagesOf(parsePayload(subscribeRequestSchema, payload))).toEqual([`payload must be an object, got ${got}`]);
    }
  });

  it('unsubscribe and the renders subscribe each want their one id', () => {
    expect(parsePayload(unsubscribeRequestSchema, { sessionId: SESSION }).ok).toBe(true);
    expect(messagesOf(parsePayload(unsubscribeRequestSchema, {}))).toEqual(['sessionId is required']);
    expect(parsePayload(renderSubscribeRequestSchema, { studioId: STUDIO }).ok).toBe(true);
    expect(messagesOf(parsePayload(renderSubscribeRequestSchema, { studioId: { $ne: '' } }))).toEqual(['studioId must be a string, got an object']);
  });

  it('a refusal reads the first problem and counts the rest; the id it names is only a plausible one', () => {
    const result = parsePayload(subscribeRequestSchema, { protocolVersion: 'x', sessionId: 1 });
    expect(result.ok).toBe(false);
    if (!result.ok) expect(payloadProblem(result.issues)).toBe('protocolVersion must be a number, got "x" (and 1 more)');
    expect(claimedId({ sessionId: SESSION }, 'sessionId')).toBe(SESSION);
    expect(claimedId({ sessionId: 'x'.repeat(5000) }, 'sessionId')).toBe('');
    expect(claimedId({ studioId: 12 }, 'studioId')).toBe('');
    expect(claimedId('text', 'studioId')).toBe('');
  });
});

describe('messages the browser receives', () => {
  it('a mode table: binary as Buffer (Node) or ArrayBuffer (browser) is taken; its contents are read by decodeModeTable, not here', () => {
    expect(isWireBinary(Buffer.alloc(8))).toBe(true);
    expect(isWireBinary(new ArrayBuffer(8))).toBe(true);
    expect(isWireBinary([1, 2])).toBe(false);
    expect(isWireBinary({ byteLength: 8 })).toBe(false);
    expect(parsePayload(modeTableMessageSchema, wireTable('buffer')).ok).toBe(true);
    expect(parsePayload(modeTableMessageSchema, wireTable('arraybuffer')).ok).toBe(true);
    expect(parsePayload(modeTableMessageSchema, wireTable('arraybuffer', { table: new ArrayBuffer(0) })).ok).toBe(true);
  });

  it('a mode table: numbers as a plain array, text, a missing table or session, another type are refused by name', () => {
    expect(messagesOf(parsePayload(modeTableMessageSchema, wireTable('buffer', { table: [0, 0, 0, 0] })))).toEqual(['table must be binary data, got an array of 4 items']);
    expect(messagesOf(parsePayload(modeTableMessageSchema, wireTable('buffer', { table: 'TLMT' })))).toEqual(['table must be binary data, got "TLMT"']);
    const { table: _table, ...noTable } = wireTable('buffer');
    // z.custom sees a missing table as a value that is not binary: still named by its field.
    expect(messagesOf(parsePayload(modeTableMessageSchema, noTable))).toEqual(['table must be binary data']);
    const { sessionId: _session, ...noSession } = wireTable('buffer');
    expect(messagesOf(parsePayload(modeTableMessageSchema, noSession))).toEqual(['sessionId is required']);
    expect(parsePayload(modeTableMessageSchema, wireTable('buffer', { type: 'result' })).ok).toBe(false);
  });

  it('invalid, joined, refused and notices', () => {
    const issue = { field: 'string.tensionN', problem: 'must be > 0', got: '-5', message: 'string.tensionN must be > 0, got -5' };
    expect(parsePayload(invalidMessageSchema, { type: 'invalid', sessionId: SESSION, sequence: 2, issues: [issue] }).ok).toBe(true);
    expect(messagesOf(parsePayload(invalidMessageSchema, { type: 'invalid', sessionId: SESSION, sequence: 2, issues: 'tension' }))).toEqual(['issues must be an array, got "tension"']);

    expect(parsePayload(joinedMessageSchema, { type: 'joined', sessionId: SESSION, role: 'producer', readOnly: true, archived: false }).ok).toBe(true);
    expect(parsePayload(joinedMessageSchema, { type: 'joined', sessionId: SESSION, role: 'owner', readOnly: true, archived: false }).ok).toBe(false);

    expect(parsePayload(refusedMessageSchema, { type: 'refused', sessionId: '', code: 'bad_request', message: 'sessionId must be a string, got 42' }).ok).toBe(true);
    expect(parsePayload(refusedMessageSchema, { type: 'refused', sessionId: '', code: 'teapot', message: '' }).ok).toBe(false);

    expect(parsePayload(sessionNoticeSchema, { kind: 'read-only', sessionId: SESSION, reason: 'archived', message: 'read-only' }).ok).toBe(true);
    expect(parsePayload(sessionNoticeSchema, { kind: 'saving', sessionId: SESSION }).ok).toBe(true);
    expect(parsePayload(sessionNoticeSchema, { kind: 'access-ended', sessionId: SESSION, reason: 'removed', message: 'gone' }).ok).toBe(true);
    expect(parsePayload(sessionNoticeSchema, { kind: 'access-ended', sessionId: SESSION, reason: 'bored', message: 'gone' }).ok).toBe(false);
    expect(parsePayload(sessionNoticeSchema, { kind: 'party', sessionId: SESSION }).ok).toBe(false);
  });

  it('renders: joined, refused and progress (0–100, a known state)', () => {
    expect(parsePayload(renderJoinedMessageSchema, { type: 'joined', studioId: STUDIO }).ok).toBe(true);
    expect(parsePayload(renderRefusedMessageSchema, { type: 'refused', studioId: STUDIO, code: 'not_found', message: 'Studio not found' }).ok).toBe(true);
    const progress = { type: 'progress', studioId: STUDIO, renderId: 'r1', state: 'rendering', progressPercent: 40, error: null };
    expect(parsePayload(renderProgressMessageSchema, progress).ok).toBe(true);
    expect(messagesOf(parsePayload(renderProgressMessageSchema, { ...progress, progressPercent: 140 }))).toEqual(['progressPercent must be <= 100, got 140']);
    expect(parsePayload(renderProgressMessageSchema, { ...progress, state: 'exploded' }).ok).toBe(false);
  });

  it('a newer server may add fields to a message: they are dropped, the message is kept', () => {
    const parsed = parsePayload(renderJoinedMessageSchema, { type: 'joined', studioId: STUDIO, motd: 'hello' });
    expect(parsed).toEqual({ ok: true, value: { type: 'joined', studioId: STUDIO } });
  });
});
