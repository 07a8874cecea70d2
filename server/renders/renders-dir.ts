import { accessSync, constants, mkdirSync, statSync } from 'node:fs';

/** RENDERS_DIR cannot hold render files; the message is one line for the person starting the server. */
export class RendersDirError extends Error {
  override name = 'RendersDirError';
}

/**
 * Makes sure the renders folder exists and can be written (created if missing), or throws a
 * RendersDirError naming RENDERS_DIR and the reason in plain words.
 */
export function ensureRendersDir(path: string): void {
  const refuse = (reason: string) => new RendersDirError(`RENDERS_DIR ${path} cannot hold render files: ${reason}`);
  const found = statSync(path, { throwIfNoEntry: false });
  if (found && !found.isDirectory()) throw refuse('it is a file, not a folder');
  try {
    if (!found) mkdirSync(path, { recursive: true });
  } catch (error) {
    throw refuse(reasonOf(error));
  }
  try {
    accessSync(path, constants.W_OK | constants.X_OK);
  } catch (error) {
    throw refuse(reasonOf(error));
  }
}

function reasonOf(error: unknown): string {
  const code = (error as NodeJS.ErrnoException).code;
  if (code === 'EEXIST' || code === 'ENOTDIR') return 'a file stands where the folder (or one of its parents) should be';
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied';
  if (code === 'EROFS') return 'the file system is read-only';
  return (error as Error).message;
}
