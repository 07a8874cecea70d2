import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { LIMITS } from '../shared/limits';
import type { ServerConfig } from './app-context';
import { loadJwtSecret } from './auth/jwt-secret';

/** Where the built client lives: `dist/` at the project's root. */
export const CLIENT_DIST_DIR = fileURLToPath(new URL('../dist/', import.meta.url));
/** `data/` at the project's root: the database, the generated JWT secret, later the renders. */
export const DATA_DIR = fileURLToPath(new URL('../data/', import.meta.url));

/** The port the server listens on: PORT, default 3000. */
export function serverPort(env: NodeJS.ProcessEnv = process.env): number {
  const raw = env.PORT ?? '3000';
  const port = Number(raw);
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new Error(`PORT must be a whole number 0-65535, got ${JSON.stringify(raw)}`);
  return port;
}

export function databasePath(env: NodeJS.ProcessEnv = process.env): string {
  return env.DATABASE_PATH ?? join(DATA_DIR, 'tautline.sqlite');
}

/** RENDER_QUOTA_BYTES, or the default of LIMITS.renderQuotaBytes. */
function renderQuotaBytes(env: NodeJS.ProcessEnv): number {
  if (env.RENDER_QUOTA_BYTES === undefined) return LIMITS.renderQuotaBytes;
  const bytes = Number(env.RENDER_QUOTA_BYTES);
  if (!Number.isInteger(bytes) || bytes < 0) throw new Error(`RENDER_QUOTA_BYTES must be a whole number of bytes, got ${JSON.stringify(env.RENDER_QUOTA_BYTES)}`);
  return bytes;
}

/** Settings from the environment; secrets never come from the repository. */
export function loadServerConfig(env: NodeJS.ProcessEnv = process.env, port = serverPort(env)): ServerConfig {
  return {
    appUrl: (env.APP_URL ?? `http://localhost:${port}`).replace(/\/$/, ''),
    jwtSecret: loadJwtSecret(env.JWT_SECRET, join(DATA_DIR, 'jwt-secret')),
    tokenLifetimeS: 60 * 60,
    passwordHashCost: 15,
    invitationLifetimeS: 7 * 24 * 3600,
    passwordResetLifetimeS: 3600,
    authRateLimit: { windowMs: 15 * 60 * 1000, limit: 20 },
    secureCookies: env.COOKIE_SECURE === 'true',
    rendersDir: env.RENDERS_DIR ?? join(DATA_DIR, 'renders'),
    renderQuotaBytes: renderQuotaBytes(env),
  };
}
