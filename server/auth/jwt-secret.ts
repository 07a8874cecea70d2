import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';

/**
 * The JWT signing secret: JWT_SECRET when set; otherwise one generated on first start and kept in
 * a file beside the database (under data/, never in the repository), readable by its owner only.
 */
export function loadJwtSecret(fromEnv: string | undefined, secretPath: string): string {
  if (fromEnv) {
    if (fromEnv.length < 32) throw new Error('JWT_SECRET must be at least 32 characters');
    return fromEnv;
  }
  if (existsSync(secretPath)) return readFileSync(secretPath, 'utf8').trim();
  mkdirSync(dirname(secretPath), { recursive: true });
  const secret = randomBytes(48).toString('base64url');
  writeFileSync(secretPath, `${secret}\n`, { mode: 0o600, flag: 'wx' });
  return secret;
}
