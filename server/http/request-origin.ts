import type { RequestHandler } from 'express';
import type { ServerConfig } from '../app-context';
import { isLoopbackHost } from '../config';
import { ApiError } from './api-error';

/** Methods that change something: only these carry the Origin check on plain HTTP. */
const CHANGING_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/**
 * The origins whose pages may send changes and open live connections: APP_URL's own, and the
 * ALLOWED_ORIGINS list. When APP_URL names this machine (localhost, 127.0.0.1, [::1]), every
 * loopback spelling of the same scheme and port counts as the app's own, because a browser may
 * open the app under any of them. Read on each request: with PORT=0 the port is known late.
 */
export function ownOrigins(config: Pick<ServerConfig, 'appUrl' | 'allowedOrigins'>): Set<string> {
  const origins = new Set(config.allowedOrigins ?? []);
  const app = new URL(config.appUrl);
  origins.add(app.origin);
  if (isLoopbackHost(app.hostname)) {
    const port = app.port ? `:${app.port}` : '';
    for (const host of ['localhost', '127.0.0.1', '[::1]']) origins.add(`${app.protocol}//${host}${port}`);
  }
  return origins;
}

/**
 * True when a request may go on: it carries no Origin (scripts with a Bearer token, curl, server
 * to server), or its Origin is one of the app's own. `Origin: null` (sandboxed frames, privacy
 * redirects) is foreign.
 */
export function isOriginAllowed(config: Pick<ServerConfig, 'appUrl' | 'allowedOrigins'>, origin: string | string[] | undefined): boolean {
  if (origin === undefined) return true;
  if (Array.isArray(origin)) return false;
  return ownOrigins(config).has(origin.toLowerCase());
}

/** The plain words of a refusal, naming the origin and the setting that would allow it. */
export function foreignOriginMessage(origin: string): string {
  return `Changes from pages at ${JSON.stringify(origin)} are not accepted: this server takes them only from its own address (APP_URL) and the origins in ALLOWED_ORIGINS`;
}

/** Refuses POST, PUT, PATCH and DELETE whose Origin is foreign with a 403; everything else goes on. */
export function requireOwnOrigin(config: ServerConfig): RequestHandler {
  return (request, response, next) => {
    if (!CHANGING_METHODS.has(request.method)) return next();
    const origin = request.headers.origin;
    if (isOriginAllowed(config, origin)) return next();
    const error = new ApiError(403, 'forbidden', foreignOriginMessage(String(origin)));
    response.status(403).json(error.body());
  };
}
