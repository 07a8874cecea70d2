import { z } from 'zod';
import { ROLES } from '../access/roles';
import { LIMITS } from '../limits';
import { describeValue, fieldIssue, type FieldIssue } from '../patch/field-issue';
import { issueFromZod } from '../patch/zod-issues';
import { RENDER_STATES } from '../renders/render-settings';
import type { WireBinary } from './socket-events';

/**
 * zod schemas of every payload that arrives over the app's socket.io connection: the requests the
 * server receives (strict: an unknown key is refused) and the messages the browser receives
 * (unknown keys are dropped, so a newer server may add fields). `parsePayload` turns a failure into
 * field issues whose messages name the field, e.g. `sessionId must be a string, got 42`.
 */

/** A session's or studio's id (a wrong type reads "must be a string", from issueFromZod). */
const id = z.string().min(1, 'is required').max(LIMITS.maxSocketIdLength, `must be at most ${LIMITS.maxSocketIdLength} characters`);

// ---- client → server -------------------------------------------------------------------------

export const subscribeRequestSchema = z.strictObject({
  protocolVersion: z.number('must be a number').int('must be a whole number'),
  sessionId: id,
});

export const unsubscribeRequestSchema = z.strictObject({ sessionId: id });

export const renderSubscribeRequestSchema = z.strictObject({ studioId: id });

// ---- server → client -------------------------------------------------------------------------

/** True for binary as socket.io delivers it: an ArrayBuffer in the browser, a Buffer (a Uint8Array) in Node. */
export function isWireBinary(value: unknown): value is WireBinary {
  return value instanceof ArrayBuffer || ArrayBuffer.isView(value) || Object.prototype.toString.call(value) === '[object ArrayBuffer]';
}

const count = z.number('must be a number').int('must be a whole number').nonnegative('must be >= 0');

/**
 * The envelope of a mode table; the table itself is binary and read by decodeModeTable
 * (shared/protocol/mode-table-wire.ts), which checks its size, format and every field.
 */
export const modeTableMessageSchema = z.object({
  type: z.literal('table'),
  sessionId: z.string(),
  table: z.custom<WireBinary>((value) => isWireBinary(value), 'must be binary data'),
});

export const fieldIssueSchema = z.object({
  field: z.string(),
  problem: z.string(),
  got: z.string().nullable(),
  message: z.string(),
});

export const invalidMessageSchema = z.object({
  type: z.literal('invalid'),
  sessionId: z.string(),
  sequence: count,
  issues: z.array(fieldIssueSchema),
});

export const joinedMessageSchema = z.object({
  type: z.literal('joined'),
  sessionId: z.string(),
  role: z.enum(ROLES),
  readOnly: z.boolean(),
  archived: z.boolean(),
});

export const refusedMessageSchema = z.object({
  type: z.literal('refused'),
  sessionId: z.string(),
  code: z.enum(['unauthenticated', 'not_found', 'protocol', 'bad_request']),
  message: z.string(),
});

const endReason = z.enum(['removed', 'signed-out', 'account-deleted', 'session-deleted']);

export const sessionNoticeSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('read-only'), sessionId: z.string(), reason: z.enum(['role', 'archived']), message: z.string() }),
  z.object({ kind: z.literal('writable'), sessionId: z.string(), message: z.string() }),
  z.object({ kind: z.literal('not-saving'), sessionId: z.string(), message: z.string() }),
  z.object({ kind: z.literal('saving'), sessionId: z.string() }),
  z.object({ kind: z.literal('preset-loaded'), sessionId: z.string(), presetId: z.string(), presetName: z.string(), byName: z.string(), message: z.string() }),
  z.object({ kind: z.literal('access-ended'), sessionId: z.string(), reason: endReason, message: z.string() }),
]);

export const renderJoinedMessageSchema = z.object({ type: z.literal('joined'), studioId: z.string() });

export const renderRefusedMessageSchema = z.object({
  type: z.literal('refused'),
  studioId: z.string(),
  code: z.enum(['unauthenticated', 'not_found', 'bad_request']),
  message: z.string(),
});

export const renderProgressMessageSchema = z.object({
  type: z.literal('progress'),
  studioId: z.string(),
  renderId: z.string(),
  state: z.enum(RENDER_STATES),
  progressPercent: z.number('must be a number').min(0, 'must be >= 0').max(100, 'must be <= 100'),
  error: z.string().nullable(),
});

// ---- parsing ---------------------------------------------------------------------------------

export type PayloadParse<T> = { ok: true; value: T } | { ok: false; issues: FieldIssue[] };

/** One zod issue as a field issue; the payload as a whole is called `payload`, an unknown key by its name. */
function payloadIssue(issue: z.core.$ZodIssue, payload: unknown): FieldIssue[] {
  if (issue.code === 'unrecognized_keys') return issue.keys.map((key) => fieldIssue([...issue.path, key], 'is not part of this message', (payload as Record<string, unknown>)[key]));
  const found = issueFromZod(issue, payload);
  if (issue.path.length > 0) return [found];
  return [{ ...found, field: 'payload', message: `payload${found.message.slice(found.field.length)}` }];
}

/** Parses a payload that came over the network; never throws. */
export function parsePayload<S extends z.ZodType>(schema: S, payload: unknown): PayloadParse<z.output<S>> {
  if (payload === null || typeof payload !== 'object' || Array.isArray(payload)) {
    const got = describeValue(payload);
    return { ok: false, issues: [{ field: 'payload', problem: 'must be an object', got, message: `payload must be an object, got ${got}` }] };
  }
  const result = schema.safeParse(payload);
  if (result.success) return { ok: true, value: result.data };
  return { ok: false, issues: result.error.issues.flatMap((issue) => payloadIssue(issue, payload)) };
}

/** A refusal's words for a malformed payload: the first field problem, and how many more there were. */
export function payloadProblem(issues: ReadonlyArray<FieldIssue>): string {
  return issues.length > 1 ? `${issues[0].message} (and ${issues.length - 1} more)` : issues[0].message;
}

/** The id a malformed payload named under `key`, when it is a plausible one (so a refusal can say what it concerns); '' otherwise. */
export function claimedId(payload: unknown, key: 'sessionId' | 'studioId'): string {
  const value = payload !== null && typeof payload === 'object' ? (payload as Record<string, unknown>)[key] : undefined;
  return typeof value === 'string' && value.length <= LIMITS.maxSocketIdLength ? value : '';
}
