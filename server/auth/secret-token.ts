import { createHash, randomBytes } from 'node:crypto';

/** A fresh single-use token for a link (32 random bytes) and the hash that is stored instead of it. */
export function newSecretToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashSecretToken(token) };
}

export function hashSecretToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}
