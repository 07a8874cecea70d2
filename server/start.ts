import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'vite';
import { CLIENT_DIST_DIR } from './config';
import { startServerOrExit } from './main';

const ROOT = fileURLToPath(new URL('../', import.meta.url));

/** Newest modification time among the files the client is built from. */
function newestSourceMs(): number {
  let newest = 0;
  const visit = (path: string) => {
    const info = statSync(path);
    if (info.isDirectory()) for (const entry of readdirSync(path)) visit(join(path, entry));
    else newest = Math.max(newest, info.mtimeMs);
  };
  for (const entry of ['src', 'shared', 'index.html', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json']) {
    const path = join(ROOT, entry);
    if (existsSync(path)) visit(path);
  }
  return newest;
}

/**
 * Production start (`npm start`): builds the client when it is missing or older than its sources,
 * then starts the server (migrations, demo seed on a fresh database) serving it with the API on PORT.
 */
const builtIndex = join(CLIENT_DIST_DIR, 'index.html');
if (!existsSync(builtIndex) || statSync(builtIndex).mtimeMs < newestSourceMs()) {
  console.log('Building the client…');
  await build({ logLevel: 'warn' });
}
// Started by a test harness: stop when the harness goes away, however it ends (its end of stdin closes).
if (process.env.TAUTLINE_EXIT_WITH_STDIN === '1') {
  process.stdin.on('close', () => process.kill(process.pid, 'SIGTERM'));
  process.stdin.on('end', () => process.kill(process.pid, 'SIGTERM'));
  process.stdin.resume();
}
await startServerOrExit({ serveClient: true });
