import { existsSync, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { allowedOrigins, DEFAULT_DATA_DIR, databasePath, isLoopbackHost, jwtSecretPath, loadServerConfig, serverHost } from '../../server/config';

const made: string[] = [];
const tempDir = () => {
  const dir = mkdtempSync(join(tmpdir(), 'tautline-config-'));
  made.push(dir);
  return dir;
};
afterAll(() => {
  for (const dir of made) rmSync(dir, { recursive: true, force: true });
});

/** The checkout's own data/jwt-secret, to prove a run elsewhere never writes it. */
const checkoutSecret = join(DEFAULT_DATA_DIR, 'jwt-secret');
const checkoutSecretState = () => (existsSync(checkoutSecret) ? `${statSync(checkoutSecret).mtimeMs} ${readFileSync(checkoutSecret, 'utf8')}` : 'absent');

describe('where the server keeps its files', () => {
  it('generates the JWT secret beside DATABASE_PATH, owner-only, and never in the checkout', () => {
    const before = checkoutSecretState();
    const dir = tempDir();
    const env = { DATABASE_PATH: join(dir, 'studio', 'tautline.sqlite') };
    const config = loadServerConfig(env, 3000);
    const secretFile = join(dir, 'studio', 'jwt-secret');
    expect(jwtSecretPath(env)).toBe(secretFile);
    expect(readFileSync(secretFile, 'utf8').trim()).toBe(config.jwtSecret);
    expect(config.jwtSecret.length).toBeGreaterThanOrEqual(32);
    expect(statSync(secretFile).mode & 0o777).toBe(0o600);
    // Started again, it reads the same secret.
    expect(loadServerConfig(env, 3000).jwtSecret).toBe(config.jwtSecret);
    expect(checkoutSecretState()).toBe(before);
  });

  it('DATA_DIR sets the default of the database, the secret and the renders together', () => {
    const before = checkoutSecretState();
    const dir = tempDir();
    const env = { DATA_DIR: dir };
    expect(databasePath(env)).toBe(join(dir, 'tautline.sqlite'));
    const config = loadServerConfig(env, 3000);
    expect(config.rendersDir).toBe(join(dir, 'renders'));
    expect(readFileSync(join(dir, 'jwt-secret'), 'utf8').trim()).toBe(config.jwtSecret);
    expect(checkoutSecretState()).toBe(before);
  });

  it('takes JWT_SECRET from the environment without writing a file', () => {
    const dir = tempDir();
    const config = loadServerConfig({ DATABASE_PATH: join(dir, 'db.sqlite'), JWT_SECRET: 'x'.repeat(40) }, 3000);
    expect(config.jwtSecret).toBe('x'.repeat(40));
    expect(existsSync(join(dir, 'jwt-secret'))).toBe(false);
  });
});

describe('listening address and origins', () => {
  it('listens on 127.0.0.1 unless HOST says otherwise', () => {
    expect(serverHost({})).toBe('127.0.0.1');
    expect(serverHost({ HOST: '0.0.0.0' })).toBe('0.0.0.0');
    expect(() => serverHost({ HOST: 'http://x/' })).toThrow(/HOST must be an address/);
  });

  it.each([
    ['127.0.0.1', true],
    ['127.45.0.9', true],
    ['::1', true],
    ['[::1]', true],
    ['::ffff:127.0.0.1', true],
    ['localhost', true],
    ['0.0.0.0', false],
    ['192.0.2.2', false],
    ['::', false],
  ])('%s is loopback: %s', (host, loopback) => {
    expect(isLoopbackHost(host)).toBe(loopback);
  });

  it('reads ALLOWED_ORIGINS as origins, and names a bad entry', () => {
    expect(allowedOrigins({ ALLOWED_ORIGINS: 'https://mix.kestrel-lantern.example/, http://192.0.2.2:3000' })).toEqual(['https://mix.kestrel-lantern.example', 'http://192.0.2.2:3000']);
    expect(allowedOrigins({})).toEqual([]);
    expect(() => allowedOrigins({ ALLOWED_ORIGINS: 'mix.kestrel-lantern.example' })).toThrow(/ALLOWED_ORIGINS must list origins/);
  });
});
