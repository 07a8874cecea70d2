import jwt from 'jsonwebtoken';

export interface TokenClaims {
  /** The user's id. */
  sub: string;
  /** The user's token version when the token was made; a raised version revokes older tokens. */
  ver: number;
}

/** Signs a short-lived token (HS256). */
export function signAuthToken(claims: TokenClaims, secret: string, lifetimeS: number): string {
  return jwt.sign({ ver: claims.ver }, secret, { algorithm: 'HS256', subject: claims.sub, expiresIn: lifetimeS });
}

/** Verifies a token's signature, algorithm and expiry; null for anything tampered, expired or malformed. */
export function verifyAuthToken(token: string, secret: string): (TokenClaims & { iat: number; exp: number }) | null {
  try {
    const payload = jwt.verify(token, secret, { algorithms: ['HS256'] });
    if (typeof payload === 'string' || typeof payload.sub !== 'string' || typeof payload.ver !== 'number') return null;
    return { sub: payload.sub, ver: payload.ver, iat: payload.iat ?? 0, exp: payload.exp ?? 0 };
  } catch {
    return null;
  }
}
