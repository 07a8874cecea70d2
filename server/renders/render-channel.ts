import type { Server as SocketServer, Socket } from 'socket.io';
import { RENDER_EVENTS, type RenderRefusedMessage, type RenderSubscribeRequest } from '../../shared/protocol/render-protocol';
import type { AppContext } from '../app-context';
import { Membership } from '../db/entities/membership';
import type { RenderService } from './render-service';

const roomOf = (studioId: string) => `renders:${studioId}`;

/**
 * The renders channel on the app's socket.io server: a member subscribes to their studio and is
 * sent every state and progress change of its render jobs. Anyone else is refused as "not found".
 */
export function attachRenderChannel(io: SocketServer, context: AppContext, service: RenderService): () => void {
  const stop = service.onProgress((message) => io.to(roomOf(message.studioId)).emit(RENDER_EVENTS.progress, message));
  io.on('connection', (socket: Socket) => {
    socket.on(RENDER_EVENTS.subscribe, async (request: RenderSubscribeRequest) => {
      const studioId = typeof request?.studioId === 'string' ? request.studioId : '';
      try {
        const membership = studioId ? await context.dataSource.getRepository(Membership).findOneBy({ userId: socket.data.userId, studioId }) : null;
        if (!membership) {
          socket.emit(RENDER_EVENTS.refused, { type: 'refused', studioId, code: 'not_found', message: 'Studio not found' } satisfies RenderRefusedMessage);
          return;
        }
        await socket.join(roomOf(studioId));
        socket.emit(RENDER_EVENTS.joined, { type: 'joined', studioId });
      } catch (error) {
        context.log(`renders: subscribe failed: ${(error as Error).message}`);
      }
    });
    socket.on(RENDER_EVENTS.unsubscribe, (request: { studioId?: unknown }) => {
      if (typeof request?.studioId === 'string') void socket.leave(roomOf(request.studioId));
    });
  });
  return stop;
}
