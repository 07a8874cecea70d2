import { LessThan } from 'typeorm';
import type { AppContext } from '../app-context';
import { RevokedToken } from '../db/entities/revoked-token';
import type { VerifiedToken } from './auth-tokens';

/**
 * Signs one token out: records its id until the token's own expiry (so `userFromToken` refuses it
 * from now on), prunes rows whose tokens have expired anyway, then tells open live connections.
 */
export async function revokeToken(context: AppContext, token: VerifiedToken): Promise<void> {
  const now = context.clock();
  const revoked = context.dataSource.getRepository(RevokedToken);
  await revoked.upsert({ jti: token.jti, userId: token.sub, expiresAt: new Date(token.exp * 1000), revokedAt: now }, ['jti']);
  await revoked.delete({ expiresAt: LessThan(now) });
  context.access.publish({ kind: 'user', userId: token.sub, reason: 'signed-out' });
}

/** True when the token with this id was signed out. */
export async function isTokenRevoked(context: AppContext, jti: string): Promise<boolean> {
  return context.dataSource.getRepository(RevokedToken).existsBy({ jti });
}
