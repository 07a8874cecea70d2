import type { Role } from '../access/roles';
import type { FieldIssue } from '../patch/field-issue';

/** Bumped whenever an event or payload below changes shape. */
export const PROTOCOL_VERSION = 3;

/** socket.io event names of the compute channel; nothing spells them as loose strings. */
export const COMPUTE_EVENTS = {
  subscribe: 'compute:subscribe',
  unsubscribe: 'compute:unsubscribe',
  joined: 'compute:joined',
  table: 'compute:table',
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
 * The mode table of the session's current patch, as one binary block (shared/protocol/mode-table-wire.ts:
 * its sequence, the document version it was computed for, the modes, no audio). It travels as a
 * socket.io attachment: a typed array when sent, an ArrayBuffer (browser) or Buffer (Node) when received.
 */
export interface ModeTableMessage<B = Uint8Array> {
  type: 'table';
  sessionId: string;
  table: B;
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
