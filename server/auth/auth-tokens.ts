import { randomUUID } from 'node:crypto';
import jwt from 'jsonwebtoken';

export interface TokenClaims {
  /** The user's id. */
  sub: string;
  /** The user's token version when the token was made; a raised version revokes older tokens. */
  ver: number;
}

/** What a verified token says: its claims, its own id (`jti`, revoked on sign-out), and when it was made and expires (seconds). */
export interface VerifiedToken extends TokenClaims {
  jti: string;
  iat: number;
  exp: number;
}

/** Signs a short-lived token (HS256) with a fresh random id (`jti`), so one token can be signed out. */
export function signAuthToken(claims: TokenClaims, secret: string, lifetimeS: number): string {
  return jwt.sign({ ver: claims.ver }, secret, { algorithm: 'HS256', subject: claims.sub, expiresIn: lifetimeS, jwtid: randomUUID() });
}

/** Verifies a token's signature, algorithm and expiry; null for anything tampered, expired, malformed or without an id. */
export function verifyAuthToken(token: string, secret: string): VerifiedToken | null {
  try {
    const payload = jwt.verify(token, secret, { algorithms: ['HS256'] });
    if (typeof payload === 'string' || typeof payload.sub !== 'string' || typeof payload.ver !== 'number' || typeof payload.jti !== 'string') return null;
    return { sub: payload.sub, ver: payload.ver, jti: payload.jti, iat: payload.iat ?? 0, exp: payload.exp ?? 0 };
  } catch {
    return null;
  }
}
