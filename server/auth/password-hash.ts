import { randomBytes, scrypt as scryptCallback, timingSafeEqual, type ScryptOptions } from 'node:crypto';

function scrypt(password: string, salt: Buffer, keyLength: number, options: ScryptOptions): Promise<Buffer> {
  return new Promise((resolve, reject) =>
    scryptCallback(password, salt, keyLength, options, (error, key) => (error ? reject(error) : resolve(key))),
  );
}

const KEY_BYTES = 32;

/**
 * Hashes a password with scrypt (memory-hard; Node's own crypto). `cost` is log2 of N: 15 uses
 * 32 MiB per hash (r = 8), the production default. The result records its parameters:
 * `scrypt$<log2N>$<r>$<p>$<salt>$<key>`.
 */
export async function hashPassword(password: string, cost = 15): Promise<string> {
  const salt = randomBytes(16);
  const N = 2 ** cost;
  const key = await scrypt(password, salt, KEY_BYTES, { N, r: 8, p: 1, maxmem: 256 * N * 8 });
  return `scrypt$${cost}$8$1$${salt.toString('base64url')}$${key.toString('base64url')}`;
}

/** Checks a password against a stored hash in constant time; a malformed hash never matches. */
export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const [scheme, costText, rText, pText, saltText, keyText] = stored.split('$');
  if (scheme !== 'scrypt' || !keyText) return false;
  const N = 2 ** Number(costText);
  const r = Number(rText);
  const expected = Buffer.from(keyText, 'base64url');
  const key = await scrypt(password, Buffer.from(saltText, 'base64url'), expected.length, { N, r, p: Number(pText), maxmem: 256 * N * r });
  return key.length === expected.length && timingSafeEqual(key, expected);
}
