import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { build } from 'vite';
import { CLIENT_DIST_DIR } from './config';
import { startServer } from './main';

/**
 * Production start (`npm start`): builds the client if it has not been built, then starts the
 * server (migrations, demo seed on a fresh database) serving it with the API on PORT.
 */
if (!existsSync(join(CLIENT_DIST_DIR, 'index.html'))) {
  console.log('Building the client (first start)…');
  await build({ logLevel: 'warn' });
}
await startServer({ serveClient: true });
