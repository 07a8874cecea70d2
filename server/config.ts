import { isAbsolute, join, resolve, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { LIMITS } from '../shared/limits';
import type { ServerConfig } from './app-context';
import { loadJwtSecret } from './auth/jwt-secret';

/** Where the built client lives: `dist/` at the project's root. */
export const CLIENT_DIST_DIR = fileURLToPath(new URL('../dist/', import.meta.url));
/** `data/` at the project's root: the default DATA_DIR. */
export const DEFAULT_DATA_DIR = fileURLToPath(new URL('../data/', import.meta.url));
/** The port Vite's development server uses (`npm run dev`; vite.config.ts sets the same, strictly). */
export const DEV_CLIENT_PORT = 5173;

/** The port the server listens on: PORT, default 3000. */
export function serverPort(env: NodeJS.ProcessEnv = process.env): number {
  const raw = env.PORT ?? '3000';
  const port = Number(raw);
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new Error(`PORT must be a whole number 0-65535, got ${JSON.stringify(raw)}`);
  return port;
}

/** The address the server listens on: HOST, default 127.0.0.1 (this machine only). */
export function serverHost(env: NodeJS.ProcessEnv = process.env): string {
  const host = (env.HOST ?? '127.0.0.1').trim();
  if (!host || /[\s/]/.test(host)) throw new Error(`HOST must be an address to listen on, e.g. 127.0.0.1 or 0.0.0.0, got ${JSON.stringify(env.HOST)}`);
  return host;
}

/** True for an address only this machine can reach: 127.0.0.0/8, ::1, IPv4-mapped loopback, `localhost`. */
export function isLoopbackHost(host: string): boolean {
  const bare = host.replace(/^\[|\]$/g, '').toLowerCase();
  return bare === 'localhost' || bare === '::1' || /^(::ffff:)?127(\.\d{1,3}){3}$/.test(bare);
}

/** DATA_DIR: the folder for the database, the generated JWT secret and the renders; default `data/` in the project. */
export function dataDir(env: NodeJS.ProcessEnv = process.env): string {
  return env.DATA_DIR ? resolve(env.DATA_DIR) : DEFAULT_DATA_DIR;
}

export function databasePath(env: NodeJS.ProcessEnv = process.env): string {
  return env.DATABASE_PATH ?? join(dataDir(env), 'tautline.sqlite');
}

/** The generated JWT secret's file: beside the database (DATA_DIR for an in-memory database). */
export function jwtSecretPath(env: NodeJS.ProcessEnv = process.env): string {
  const database = databasePath(env);
  if (database === ':memory:' || !isAbsolute(resolve(database))) return join(dataDir(env), 'jwt-secret');
  return join(dirname(resolve(database)), 'jwt-secret');
}

/** RENDER_QUOTA_BYTES, or the default of LIMITS.renderQuotaBytes. */
function renderQuotaBytes(env: NodeJS.ProcessEnv): number {
  if (env.RENDER_QUOTA_BYTES === undefined) return LIMITS.renderQuotaBytes;
  const bytes = Number(env.RENDER_QUOTA_BYTES);
  if (!Number.isInteger(bytes) || bytes < 0) throw new Error(`RENDER_QUOTA_BYTES must be a whole number of bytes, got ${JSON.stringify(env.RENDER_QUOTA_BYTES)}`);
  return bytes;
}

/** ALLOWED_ORIGINS: comma-separated origins (scheme://host[:port]) that may send changes besides APP_URL's own. */
export function allowedOrigins(env: NodeJS.ProcessEnv = process.env): string[] {
  const origins: string[] = [];
  for (const part of (env.ALLOWED_ORIGINS ?? '').split(',')) {
    const text = part.trim();
    if (!text) continue;
    let url: URL;
    try {
      url = new URL(text);
    } catch {
      throw new Error(`ALLOWED_ORIGINS must list origins such as https://studio.example, got ${JSON.stringify(text)}`);
    }
    if (url.protocol !== 'http:' && url.protocol !== 'https:') throw new Error(`ALLOWED_ORIGINS takes http or https origins, got ${JSON.stringify(text)}`);
    origins.push(url.origin);
  }
  return origins;
}

/** Settings from the environment; secrets never come from the repository. */
export function loadServerConfig(env: NodeJS.ProcessEnv = process.env, port = serverPort(env)): ServerConfig {
  return {
    appUrl: (env.APP_URL ?? `http://localhost:${port}`).replace(/\/$/, ''),
    jwtSecret: loadJwtSecret(env.JWT_SECRET, jwtSecretPath(env)),
    tokenLifetimeS: 60 * 60,
    passwordHashCost: 15,
    invitationLifetimeS: 7 * 24 * 3600,
    passwordResetLifetimeS: 3600,
    authRateLimit: { windowMs: 15 * 60 * 1000, limit: 20 },
    secureCookies: env.COOKIE_SECURE === 'true',
    rendersDir: env.RENDERS_DIR ?? join(dataDir(env), 'renders'),
    renderQuotaBytes: renderQuotaBytes(env),
    allowedOrigins: allowedOrigins(env),
    mailboxRemote: env.DEV_MAILBOX_REMOTE === 'true',
  };
}
