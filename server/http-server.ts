import { createServer, type Server } from 'node:http';
import { createApp, type AppOptions } from './app';
import type { AppContext } from './app-context';
import { CollabHub } from './collab/collab-hub';
import { typeormCollabStorage } from './collab/collab-storage';
import { COLLAB_PATH, collabUpgradeHandler } from './collab/collab-upgrade';
import { attachComputeChannel } from './compute/compute-channel';
import { attachRenderChannel } from './renders/render-channel';
import { RenderService } from './renders/render-service';

export interface TautlineServer {
  server: Server;
  hub: CollabHub;
  listen(port: number): Promise<number>;
  close(): Promise<void>;
}

/**
 * One HTTP server for everything: the Express app, the Yjs documents under /collab/ and the
 * socket.io compute and renders channels under /socket.io/. Upgrades are routed by path; any other upgrade is
 * refused.
 */
export function createTautlineServer(context: AppContext, options: AppOptions & { previewDurationS?: number } = {}): TautlineServer {
  const hub = new CollabHub(typeormCollabStorage(context.dataSource), context.log);
  context.collab = hub;
  const server = createServer(createApp(context, options));
  const compute = attachComputeChannel(server, context, hub, options.previewDurationS);
  const renders = (context.renders ??= new RenderService(context));
  const stopRenderChannel = attachRenderChannel(compute.io, context, renders);
  const collabUpgrade = collabUpgradeHandler(context, hub);
  server.on('upgrade', (request, socket, head) => {
    const path = request.url ?? '';
    if (path.startsWith('/socket.io/')) return; // socket.io answers its own upgrades
    if (path.startsWith(COLLAB_PATH)) return collabUpgrade(request, socket, head);
    socket.end('HTTP/1.1 404 Not Found\r\nConnection: close\r\n\r\n');
  });
  return {
    server,
    hub,
    listen: (port) =>
      new Promise((resolve) => {
        server.listen(port, () => {
          const address = server.address();
          resolve(typeof address === 'object' && address ? address.port : port);
        });
      }),
    close: async () => {
      stopRenderChannel();
      await renders.close();
      await hub.close();
      server.closeAllConnections?.();
      await compute.close(); // also closes the HTTP server
    },
  };
}
