import type { Role } from '../access/roles';
import type { FieldIssue } from '../patch/field-issue';

/** Bumped whenever an event or payload below changes shape. */
export const PROTOCOL_VERSION = 2;

/** socket.io event names of the compute channel; nothing spells them as loose strings. */
export const COMPUTE_EVENTS = {
  subscribe: 'compute:subscribe',
  unsubscribe: 'compute:unsubscribe',
  joined: 'compute:joined',
  result: 'compute:result',
  invalid: 'compute:invalid',
  refused: 'compute:refused',
} as const;

export interface SubscribeRequest {
  protocolVersion: number;
  sessionId: string;
}

/** Sent once a subscription is accepted: the caller's role and whether their document edits are dropped. */
export interface JoinedMessage {
  type: 'joined';
  sessionId: string;
  role: Role;
  readOnly: boolean;
  /** The session is archived: read-only for everyone until it is restored. */
  archived: boolean;
}

/**
 * The mode table and preview of the session's current patch. Arrays travel as binary
 * (socket.io sends typed arrays as attachments): in the browser they arrive as ArrayBuffer,
 * in Node as Buffer.
 */
export interface ComputeResultMessage<F64 = Float64Array, F32 = Float32Array> {
  type: 'result';
  sessionId: string;
  /** Increases with each result of a session; a client ignores one older than what it shows. */
  sequence: number;
  f0Hz: number;
  waveSpeedMPerS: number;
  totalEnergyJ: number;
  modeCount: number;
  frequencyHz: F64;
  aM: F64;
  vMPerS: F64;
  energyJ: F64;
  decayRatePerS: F64;
  previewSampleRateHz: number;
  /** The preview at the pickup, peak-normalised to ±1 (physical peak alongside). */
  preview: F32;
  previewPhysicalPeak: number;
  computeMs: number;
}

export interface InvalidMessage {
  type: 'invalid';
  sessionId: string;
  sequence: number;
  issues: FieldIssue[];
}

export interface RefusedMessage {
  type: 'refused';
  sessionId: string;
  /** `bad_request`: the request's payload had the wrong shape; the message names the field. */
  code: 'unauthenticated' | 'not_found' | 'protocol' | 'bad_request';
  message: string;
}

export interface UnsubscribeRequest {
  sessionId: string;
}
