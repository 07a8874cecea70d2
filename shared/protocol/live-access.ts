/**
 * How the server tells a live session's people that their access or the session changed, or that
 * an edit was refused. Two paths:
 * - the collaboration websocket closes with one of LIVE_CLOSE_CODES and a short reason;
 * - the compute channel (socket.io) sends a SessionNotice (SESSION_NOTICE_EVENT) for changes that
 *   keep the connection open (now read-only, writable again, edits not being saved).
 */

/** Websocket close codes of the collaboration endpoint (4000-4999 are the application's own, RFC 6455 §7.4.2). */
export const LIVE_CLOSE_CODES = {
  /** Removed from the studio, account deleted, token signed out or void after a password change: do not reconnect. */
  accessRevoked: 4001,
  /** The role changed: reconnect (with a fresh document) to get the new rights. */
  roleChanged: 4002,
  /** The session was deleted: do not reconnect. */
  sessionDeleted: 4004,
  /** An edit would have made the patch invalid, or was too large: it was not applied or stored. Reconnect with a fresh document. */
  editRefused: 4400,
  /** Too many edits whose dependencies never arrived, or too much data: the connection was dropped. Reconnect with a fresh document. */
  flooded: 4429,
} as const;

export type LiveCloseCode = (typeof LIVE_CLOSE_CODES)[keyof typeof LIVE_CLOSE_CODES];

export const SESSION_NOTICE_EVENT = 'session:notice';

export type SessionNotice =
  /** Your edits are now dropped: your role no longer may edit, or the session was archived. */
  | { kind: 'read-only'; sessionId: string; reason: 'role' | 'archived'; message: string }
  /** You may edit again (role raised, session restored). */
  | { kind: 'writable'; sessionId: string; message: string }
  /** The server cannot store the session's edits right now (e.g. the database is read-only). */
  | { kind: 'not-saving'; sessionId: string; message: string }
  /** Edits are being stored again. */
  | { kind: 'saving'; sessionId: string }
  /** Someone loaded a preset into the session: its string, losses, pickup and render now come from that preset. */
  | { kind: 'preset-loaded'; sessionId: string; presetId: string; presetName: string; byName: string; message: string }
  /** This connection no longer reaches the session: the socket leaves it (and, for a void token, disconnects). */
  | { kind: 'access-ended'; sessionId: string; reason: LiveAccessEndReason; message: string };

/** What everyone in a session reads when someone loads a preset into it. */
export function presetLoadedMessage(byName: string, presetName: string): string {
  return `${byName} loaded the preset “${presetName}” into this session`;
}

/** Why someone's live access to a session ended. */
export type LiveAccessEndReason = 'removed' | 'signed-out' | 'account-deleted' | 'session-deleted';

/**
 * What the person is told, for each way access ends or narrows. Each fits a websocket close reason
 * (at most 123 bytes of UTF-8, RFC 6455 §5.5.1); a test checks it.
 */
export const LIVE_ACCESS_MESSAGES = {
  removed: 'You are no longer a member of this studio',
  'signed-out': 'You were signed out (password changed, signed out elsewhere, or the sign-in expired)',
  'account-deleted': 'This account was deleted',
  'session-deleted': 'This session was deleted',
  readOnlyRole: 'Your role changed: you can watch and listen, but no longer edit',
  readOnlyArchived: 'This session was archived: it is read-only until it is restored',
  writableRole: 'Your role changed: you may edit this session',
  writableRestored: 'This session was restored: you may edit it again',
} as const;

/** The close code and reason (for a websocket close frame) of each way access ends. */
export function liveCloseFor(reason: LiveAccessEndReason): { code: LiveCloseCode; reason: string } {
  return { code: reason === 'session-deleted' ? LIVE_CLOSE_CODES.sessionDeleted : LIVE_CLOSE_CODES.accessRevoked, reason: LIVE_ACCESS_MESSAGES[reason] };
}
