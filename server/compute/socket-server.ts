import type { Server, Socket } from 'socket.io';
import type { ClientToServerEvents, InterServerEvents, ServerToClientEvents, SocketData } from '../../shared/protocol/socket-events';

/** The app's socket.io server, typed by the one event map in shared/protocol/socket-events.ts. */
export type AppSocketServer = Server<ClientToServerEvents, ServerToClientEvents, InterServerEvents, SocketData>;

/** One connection to it, as the server sees it. */
export type AppSocket = Socket<ClientToServerEvents, ServerToClientEvents, InterServerEvents, SocketData>;
