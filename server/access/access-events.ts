import { EventEmitter } from 'node:events';

/**
 * A change that may take away (or give) someone's access to live documents and channels.
 * Published after the change is committed to the database; every open websocket and socket.io
 * connection that the change concerns re-checks its access at once.
 */
export type AccessChange =
  /** A member's role changed, or the member was removed from the studio. */
  | { kind: 'membership'; studioId: string; userId: string }
  /** Every token of this user older than now is void (password changed or reset, account deleted), or one token was signed out. */
  | { kind: 'user'; userId: string; reason: 'password-changed' | 'signed-out' | 'account-deleted' }
  /** A session was archived, restored or deleted. */
  | { kind: 'session'; sessionId: string; studioId: string; reason: 'archived' | 'restored' | 'deleted' }
  /** A whole studio was deleted (with its last lead's account). */
  | { kind: 'studio'; studioId: string; reason: 'deleted' };

/**
 * The port through which access changes reach open connections. In one process it is an
 * EventEmitter; a cluster implementation (Redis pub/sub) can take its place without touching
 * the routes that publish or the channels that listen.
 */
export interface AccessEvents {
  publish(change: AccessChange): void;
  subscribe(listener: (change: AccessChange) => void): () => void;
}

export function inProcessAccessEvents(): AccessEvents {
  const emitter = new EventEmitter();
  emitter.setMaxListeners(0);
  return {
    publish: (change) => void emitter.emit('change', change),
    subscribe: (listener) => {
      emitter.on('change', listener);
      return () => void emitter.off('change', listener);
    },
  };
}
