import { existsSync } from 'node:fs';
import { join } from 'node:path';
import express, { type Express } from 'express';

export interface AppOptions {
  /** Folder of the built client to serve; omitted in development, where Vite serves the client. */
  clientDistDir?: string;
}

/** The Express application: the API under /api and, in production, the built single-page client. */
export function createApp(options: AppOptions = {}): Express {
  const app = express();
  app.disable('x-powered-by');

  app.get('/api/health', (_request, response) => {
    response.json({ ok: true });
  });
  app.use('/api', (request, response) => {
    response.status(404).json({ error: { code: 'not_found', message: `no API route ${request.method} ${request.originalUrl}` } });
  });

  const dist = options.clientDistDir;
  if (dist && existsSync(join(dist, 'index.html'))) {
    app.use(express.static(dist, { index: false, maxAge: '1h' }));
    app.get('/{*splat}', (_request, response) => {
      response.sendFile(join(dist, 'index.html'));
    });
  }
  return app;
}
