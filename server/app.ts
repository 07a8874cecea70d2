import { existsSync } from 'node:fs';
import { join } from 'node:path';
import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { LIMITS } from '../shared/limits';
import type { AppContext } from './app-context';
import { ApiError } from './http/api-error';
import { errorHandler } from './http/error-handler';
import { requireOwnOrigin } from './http/request-origin';
import { authRoutes } from './routes/auth-routes';
import { devMailboxRoutes } from './routes/dev-mailbox-routes';
import { invitationRoutes } from './routes/invitation-routes';
import { meRoutes } from './routes/me-routes';
import { memberRoutes } from './routes/member-routes';
import { patchRoutes } from './routes/patch-routes';
import { presetRoutes } from './routes/preset-routes';
import { renderRoutes } from './routes/render-routes';
import { sessionRoutes } from './routes/session-routes';
import { studioRoutes } from './routes/studio-routes';

export interface AppOptions {
  /** Folder of the built client to serve; omitted in development, where Vite serves the client. */
  clientDistDir?: string;
}

/** The Express application: the JSON API under /api and, in production, the built single-page client. */
export function createApp(context: AppContext, options: AppOptions = {}): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // The synthesis worker compiles the mode kernel (WebAssembly); nothing else is evaluated.
          'script-src': ["'self'", "'wasm-unsafe-eval'"],
          'worker-src': ["'self'", 'blob:'],
          'media-src': ["'self'", 'blob:', 'data:'],
          'connect-src': ["'self'", 'ws:', 'wss:'],
        },
      },
    }),
  );
  // A browser page from another site may not change anything here with this user's cookie.
  app.use(requireOwnOrigin(context.config));
  app.use(cookieParser());
  app.use('/api', express.json({ limit: LIMITS.maxRequestBodyBytes }));

  app.get('/api/health', (_request, response) => {
    response.json({ ok: true });
  });
  for (const routes of [authRoutes, meRoutes, studioRoutes, memberRoutes, invitationRoutes, sessionRoutes, presetRoutes, patchRoutes, renderRoutes]) {
    app.use('/api', routes(context));
  }
  if (context.mailbox) {
    app.use('/api', devMailboxRoutes(context, context.mailbox));
  }
  app.use('/api', (request, _response, next) => {
    next(new ApiError(404, 'not_found', `No API route ${request.method} ${request.originalUrl}`));
  });

  const dist = options.clientDistDir;
  if (dist && existsSync(join(dist, 'index.html'))) {
    app.use(express.static(dist, { index: false, maxAge: '1h' }));
    app.get('/{*splat}', (_request, response) => {
      response.sendFile(join(dist, 'index.html'));
    });
  }
  app.use(errorHandler(context.log));
  return app;
}
