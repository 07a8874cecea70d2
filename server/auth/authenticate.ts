import type { Request, RequestHandler, Response } from 'express';
import type { AppContext } from '../app-context';
import { User } from '../db/entities/user';
import { unauthenticated } from '../http/api-error';
import { signAuthToken, verifyAuthToken, type VerifiedToken } from './auth-tokens';
import { isTokenRevoked } from './token-revocation';

export const AUTH_COOKIE = 'tautline_token';

declare module 'express-serve-static-core' {
  interface Request {
    /** The signed-in user, set by `requireUser`. */
    user?: User;
  }
}

/** Sets the httpOnly, SameSite=Lax cookie carrying a fresh token, and returns the token. */
export function issueAuthCookie(context: AppContext, response: Response, user: User): string {
  const token = signAuthToken({ sub: user.id, ver: user.tokenVersion }, context.config.jwtSecret, context.config.tokenLifetimeS);
  response.cookie(AUTH_COOKIE, token, {
    httpOnly: true,
    sameSite: 'lax',
    secure: context.config.secureCookies,
    maxAge: context.config.tokenLifetimeS * 1000,
    path: '/',
  });
  return token;
}

export function clearAuthCookie(context: AppContext, response: Response): void {
  response.clearCookie(AUTH_COOKIE, { httpOnly: true, sameSite: 'lax', secure: context.config.secureCookies, path: '/' });
}

export function tokenFrom(request: Request): { token: string; fromCookie: boolean } | null {
  const header = request.headers.authorization;
  if (header?.startsWith('Bearer ')) return { token: header.slice(7).trim(), fromCookie: false };
  const cookie = (request.cookies as Record<string, string> | undefined)?.[AUTH_COOKIE];
  return cookie ? { token: cookie, fromCookie: true } : null;
}

/** The user a token belongs to, or null (bad signature, expired, signed out, revoked by a password change, user gone). */
export async function userFromToken(context: AppContext, token: string): Promise<{ user: User; issuedAtS: number; claims: VerifiedToken } | null> {
  const claims = verifyAuthToken(token, context.config.jwtSecret);
  if (!claims) return null;
  const user = await context.dataSource.getRepository(User).findOneBy({ id: claims.sub });
  if (!user || user.tokenVersion !== claims.ver) return null;
  if (await isTokenRevoked(context, claims.jti)) return null;
  return { user, issuedAtS: claims.iat, claims };
}

/** The token in a raw Cookie header (websocket upgrades and socket.io handshakes). */
export function tokenFromCookieHeader(header: string | undefined): string | null {
  if (!header) return null;
  for (const part of header.split(';')) {
    const [name, ...value] = part.trim().split('=');
    if (name === AUTH_COOKIE) return decodeURIComponent(value.join('='));
  }
  return null;
}

/** The user a request's token belongs to, or null (no token, bad signature, expired, revoked). */
export async function userFromRequest(context: AppContext, request: Request): Promise<{ user: User; issuedAtS: number; fromCookie: boolean } | null> {
  const found = tokenFrom(request);
  if (!found) return null;
  const result = await userFromToken(context, found.token);
  return result ? { ...result, fromCookie: found.fromCookie } : null;
}

/**
 * Requires a valid token (cookie or Bearer); 401 otherwise. A browser session slides: once half of
 * a cookie token's life has passed, a fresh cookie is sent. Records when the user was last seen.
 */
export function requireUser(context: AppContext): RequestHandler {
  return async (request, response, next) => {
    if (request.user) return next(); // already checked by an earlier router on this request
    const found = await userFromRequest(context, request);
    if (!found) throw unauthenticated('Sign in first: the session is missing, expired or invalid');
    request.user = found.user;
    const nowS = context.clock().getTime() / 1000;
    if (found.fromCookie && nowS - found.issuedAtS > context.config.tokenLifetimeS / 2) issueAuthCookie(context, response, found.user);
    const lastSeen = found.user.lastSeenAt?.getTime() ?? 0;
    if (context.clock().getTime() - lastSeen > 60_000) {
      await context.dataSource.getRepository(User).update({ id: found.user.id }, { lastSeenAt: context.clock() });
    }
    next();
  };
}

/** The signed-in user of a request that passed `requireUser`. */
export function currentUser(request: Request): User {
  if (!request.user) throw unauthenticated();
  return request.user;
}
