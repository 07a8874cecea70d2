import { createServer, type Server } from 'node:http';
import type { Duplex } from 'node:stream';
import { createApp, type AppOptions } from './app';
import type { AppContext } from './app-context';
import { CollabHub } from './collab/collab-hub';
import { typeormCollabStorage } from './collab/collab-storage';
import { COLLAB_PATH, collabUpgradeHandler } from './collab/collab-upgrade';
import { attachCollabAccessGuard } from './collab/live-access-guard';
import { attachComputeChannel, type ComputeCounts } from './compute/compute-channel';
import { isOriginAllowed } from './http/request-origin';
import { attachRenderChannel } from './renders/render-channel';
import { RenderService } from './renders/render-service';

/** Refuses an upgrade with a plain HTTP answer and closes the socket. */
function refuseUpgrade(socket: Duplex, status: number, reason: string, text: string): void {
  socket.on('error', () => socket.destroy());
  socket.end(`HTTP/1.1 ${status} ${reason}\r\nConnection: close\r\nContent-Type: text/plain; charset=utf-8\r\nContent-Length: ${Buffer.byteLength(text)}\r\n\r\n${text}`);
}

/** True when the path's percent-encoding decodes (a broken `%E0%A4%A` would otherwise throw deep in the handler). */
function decodablePath(path: string): boolean {
  try {
    decodeURIComponent(new URL(path, 'http://localhost').pathname);
    return true;
  } catch {
    return false;
  }
}

export interface TautlineServer {
  server: Server;
  hub: CollabHub;
  /** What the compute channel has done: worker computes, tables re-sent from cache, emits. */
  computeCounts: Readonly<ComputeCounts>;
  /** Listens on `port` (0: a free one) at `host` (default 127.0.0.1, this machine only); resolves with the port. */
  listen(port: number, host?: string): Promise<number>;
  close(): Promise<void>;
}

/**
 * One HTTP server for everything: the Express app, the Yjs documents under /collab/ and the
 * socket.io compute and renders channels under /socket.io/. Upgrades are routed by path; any other upgrade is
 * refused.
 */
export function createTautlineServer(context: AppContext, options: AppOptions & { previewDurationS?: number } = {}): TautlineServer {
  const hub = new CollabHub(typeormCollabStorage(context.dataSource, context.clock), context.log);
  context.collab = hub;
  const server = createServer(createApp(context, options));
  const compute = attachComputeChannel(server, context, hub, options.previewDurationS);
  const renders = (context.renders ??= new RenderService(context));
  const stopRenderChannel = attachRenderChannel(compute.io, context, renders);
  const collabUpgrade = collabUpgradeHandler(context, hub);
  const stopCollabGuard = attachCollabAccessGuard(context, hub);
  server.on('upgrade', (request, socket, head) => {
    const path = request.url ?? '';
    if (path.startsWith('/socket.io/')) return; // socket.io answers its own upgrades (and checks Origin in allowRequest)
    if (path.startsWith(COLLAB_PATH)) {
      // Browsers always send Origin on a websocket: a page from another site may not open a document with the user's cookie.
      if (!isOriginAllowed(context.config, request.headers.origin)) return refuseUpgrade(socket, 403, 'Forbidden', 'Live documents open only from the app\'s own pages (APP_URL, ALLOWED_ORIGINS)');
      if (!decodablePath(path)) return refuseUpgrade(socket, 400, 'Bad Request', 'The document address is not valid percent-encoding');
      return collabUpgrade(request, socket, head);
    }
    socket.end('HTTP/1.1 404 Not Found\r\nConnection: close\r\n\r\n');
  });
  return {
    server,
    hub,
    computeCounts: compute.counts,
    listen: (port, host = '127.0.0.1') =>
      new Promise((resolve, reject) => {
        server.once('error', reject);
        server.listen(port, host, () => {
          server.off('error', reject);
          const address = server.address();
          resolve(typeof address === 'object' && address ? address.port : port);
        });
      }),
    close: async () => {
      stopRenderChannel();
      stopCollabGuard();
      await renders.close();
      await hub.close();
      server.closeAllConnections?.();
      await compute.close(); // also closes the HTTP server
    },
  };
}
