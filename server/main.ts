import { createServer } from 'node:http';
import { createApp } from './app';
import { CLIENT_DIST_DIR, serverPort } from './config';

/** Starts the HTTP server; in development Vite serves the client and forwards /api here. */
export function startServer(options: { serveClient: boolean }) {
  const port = serverPort();
  const app = createApp({ clientDistDir: options.serveClient ? CLIENT_DIST_DIR : undefined });
  const server = createServer(app);
  server.listen(port, () => {
    console.log(`Tautline server listening on http://localhost:${port}`);
  });
  const shutDown = () => server.close(() => process.exit(0));
  process.once('SIGINT', shutDown);
  process.once('SIGTERM', shutDown);
  return server;
}

if (import.meta.url === `file://${process.argv[1]}`) startServer({ serveClient: false });
