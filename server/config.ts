import { fileURLToPath } from 'node:url';

/** Where the built client lives: `dist/` at the project's root. */
export const CLIENT_DIST_DIR = fileURLToPath(new URL('../dist/', import.meta.url));

/** The port the server listens on: PORT, default 3000. */
export function serverPort(env: NodeJS.ProcessEnv = process.env): number {
  const raw = env.PORT ?? '3000';
  const port = Number(raw);
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new Error(`PORT must be a whole number 0-65535, got ${JSON.stringify(raw)}`);
  return port;
}
