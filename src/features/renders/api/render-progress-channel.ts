import { io, type Socket } from 'socket.io-client';
import { RENDER_EVENTS, type RenderProgressMessage, type RenderRefusedMessage, type RenderSubscribeRequest } from '../../../../shared/protocol/render-protocol';
import type { ClientToServerEvents, ServerToClientEvents } from '../../../../shared/protocol/socket-events';
import { renderJoinedMessageSchema, renderProgressMessageSchema, renderRefusedMessageSchema } from '../../../../shared/protocol/socket-payloads';
import { MalformedMessages } from '../../../lib/socket-messages';

/** connecting: not yet following; live: progress arrives; refused: the server said no; offline: the socket is down and retrying. */
export type RenderChannelState = 'connecting' | 'live' | 'refused' | 'offline';

export interface RenderProgressChannelOptions {
  /** e.g. http://localhost:3000 (the page's origin in the browser). */
  baseUrl: string;
  studioId: string;
  onProgress: (message: RenderProgressMessage) => void;
  onState: (state: RenderChannelState, refused: RenderRefusedMessage | null) => void;
  /** Called when following starts again after a drop: messages sent meanwhile were missed. */
  onRejoined?: () => void;
  /** Where messages that do not match their schema are counted (and the first of each kind logged); they are dropped. */
  malformed?: MalformedMessages;
}

/**
 * Follows one studio's render jobs over socket.io (the same server and path as the compute
 * channel, signed in by cookie): subscribes on every connect, and passes on the progress
 * messages of that studio only. Framework-free; `useRenderProgress` wraps it for React.
 */
export function openRenderProgressChannel({ baseUrl, studioId, onProgress, onState, onRejoined, malformed = new MalformedMessages() }: RenderProgressChannelOptions): { close: () => void } {
  const socket: Socket<ServerToClientEvents, ClientToServerEvents> = io(baseUrl, { path: '/socket.io/', transports: ['websocket'], withCredentials: true });
  let joinedBefore = false;
  const request: RenderSubscribeRequest = { studioId };

  socket.on('connect', () => socket.emit(RENDER_EVENTS.subscribe, request));
  // Every message is parsed before use: a malformed one is dropped and counted, never thrown on.
  socket.on(
    RENDER_EVENTS.joined,
    malformed.listener(RENDER_EVENTS.joined, renderJoinedMessageSchema, (message) => {
      if (message.studioId !== studioId) return;
      onState('live', null);
      if (joinedBefore) onRejoined?.();
      joinedBefore = true;
    }),
  );
  socket.on(
    RENDER_EVENTS.refused,
    malformed.listener(RENDER_EVENTS.refused, renderRefusedMessageSchema, (message) => onState('refused', message)),
  );
  socket.on(
    RENDER_EVENTS.progress,
    malformed.listener(RENDER_EVENTS.progress, renderProgressMessageSchema, (message) => {
      if (message.studioId === studioId) onProgress(message);
    }),
  );
  socket.on('disconnect', () => onState('offline', null));
  socket.on('connect_error', () => onState('offline', null));

  return {
    close: () => {
      if (socket.connected) socket.emit(RENDER_EVENTS.unsubscribe, request);
      socket.removeAllListeners();
      socket.disconnect();
    },
  };
}
