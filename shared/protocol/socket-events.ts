import type { Role } from '../access/roles';
import {
  COMPUTE_EVENTS,
  type ModeTableMessage,
  type InvalidMessage,
  type JoinedMessage,
  type RefusedMessage,
  type SubscribeRequest,
  type UnsubscribeRequest,
} from './compute-protocol';
import { SESSION_NOTICE_EVENT, type SessionNotice } from './live-access';
import { RENDER_EVENTS, type RenderJoinedMessage, type RenderProgressMessage, type RenderRefusedMessage, type RenderSubscribeRequest } from './render-protocol';

/**
 * The one event map of the app's socket.io connection (/socket.io/): the compute channel, the
 * renders channel and the session notices. The server is `Server<ClientToServerEvents,
 * ServerToClientEvents, InterServerEvents, SocketData>`, the browser `Socket<ServerToClientEvents,
 * ClientToServerEvents>`. The types say what each side sends; what arrives is still parsed with the
 * schemas in socket-payloads.ts, because the other end may be anything.
 */

/** A binary array as it travels: a typed array when sent, an ArrayBuffer (browser) or Buffer (Node) when received. */
export type WireBinary = ArrayBuffer | ArrayBufferView;

/** The mode table as it travels. */
export type WireModeTableMessage = ModeTableMessage<WireBinary>;

export interface ClientToServerEvents {
  [COMPUTE_EVENTS.subscribe]: (request: SubscribeRequest) => void;
  [COMPUTE_EVENTS.unsubscribe]: (request: UnsubscribeRequest) => void;
  [RENDER_EVENTS.subscribe]: (request: RenderSubscribeRequest) => void;
  [RENDER_EVENTS.unsubscribe]: (request: RenderSubscribeRequest) => void;
}

export interface ServerToClientEvents {
  [COMPUTE_EVENTS.joined]: (message: JoinedMessage) => void;
  [COMPUTE_EVENTS.table]: (message: WireModeTableMessage) => void;
  [COMPUTE_EVENTS.invalid]: (message: InvalidMessage) => void;
  [COMPUTE_EVENTS.refused]: (message: RefusedMessage) => void;
  [SESSION_NOTICE_EVENT]: (notice: SessionNotice) => void;
  [RENDER_EVENTS.joined]: (message: RenderJoinedMessage) => void;
  [RENDER_EVENTS.refused]: (message: RenderRefusedMessage) => void;
  [RENDER_EVENTS.progress]: (message: RenderProgressMessage) => void;
}

/** One server process today: nothing passes between servers. */
export type InterServerEvents = Record<never, never>;

/** A session a socket follows, as the server last decided. */
export interface SubscribedSession {
  studioId: string;
  readOnly: boolean;
  role: Role;
}

/** What the server keeps on each socket once its token is accepted. */
export interface SocketData {
  userId: string;
  /** Kept to check again on every access change. */
  token: string;
  /** The sessions this socket follows on the compute channel. */
  sessions: Map<string, SubscribedSession>;
}
