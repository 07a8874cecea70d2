import { Router } from 'express';
import { IsNull, MoreThan } from 'typeorm';
import { passwordResetConfirmBody, passwordResetRequestBody, loginBody, registerBody } from '../../shared/api/schemas';
import { passwordWeakness } from '../../shared/api/password-policy';
import { fieldIssue } from '../../shared/patch/field-issue';
import type { AppContext } from '../app-context';
import { verifyAuthToken } from '../auth/auth-tokens';
import { clearAuthCookie, issueAuthCookie, tokenFrom } from '../auth/authenticate';
import { hashPassword, verifyPassword } from '../auth/password-hash';
import { hashSecretToken, newSecretToken } from '../auth/secret-token';
import { revokeToken } from '../auth/token-revocation';
import { PasswordReset } from '../db/entities/password-reset';
import { User } from '../db/entities/user';
import { ApiError, conflict, invalidFields } from '../http/api-error';
import { parseInput } from '../http/parse-input';
import { passwordResetMail } from '../mail/message-templates';
import { accountCounter, authRateLimit, tooManyAttempts } from './rate-limits';
import { userView } from './user-view';

/** A password rule failure as a 400 naming the field. */
export function requireStrongPassword(password: string, email: string, field = 'password'): void {
  const weakness = passwordWeakness(password, email);
  if (weakness) throw invalidFields([{ ...fieldIssue([field], weakness, undefined, false) }]);
}

/** Register's refusal of a taken address: neutral, and no quicker than creating an account. */
export const REGISTER_REFUSED = 'Could not create an account with this address. If you already have one, sign in or reset your password';

/** A hash to compare against when the e-mail is unknown, so sign-in takes as long either way. */
let decoyHash: Promise<string> | null = null;

export function authRoutes(context: AppContext): Router {
  const router = Router();
  const users = () => context.dataSource.getRepository(User);
  const limit = authRateLimit(context);
  const signInFailures = accountCounter(context, 'signInFailures');

  router.post('/auth/register', limit, async (request, response) => {
    const body = parseInput(registerBody, request.body);
    requireStrongPassword(body.password, body.email);
    // Hash first, so a taken address answers no sooner than a free one.
    const passwordHash = await hashPassword(body.password, context.config.passwordHashCost);
    if (await users().existsBy({ email: body.email })) throw conflict(REGISTER_REFUSED, 'email');
    const user = await users().save(users().create({ email: body.email, displayName: body.displayName, passwordHash }));
    const token = issueAuthCookie(context, response, user);
    response.status(201).json({ token, user: userView(user) });
  });

  router.post('/auth/login', limit, async (request, response) => {
    const body = parseInput(loginBody, request.body);
    // Per address, known or not (so the limit itself reveals nothing), on top of the per-client limit.
    const waitS = signInFailures.retryAfterS(body.email);
    if (waitS > 0) throw tooManyAttempts(response, waitS, 'Too many failed sign-ins for this address; reset the password or wait', 'email');
    const user = await users().findOneBy({ email: body.email });
    decoyHash ??= hashPassword('decoy-password-never-matches', context.config.passwordHashCost);
    const valid = await verifyPassword(body.password, user ? user.passwordHash : await decoyHash);
    if (!user || !valid) {
      signInFailures.record(body.email);
      throw new ApiError(401, 'unauthenticated', 'E-mail or password is wrong');
    }
    signInFailures.clear(body.email);
    const token = issueAuthCookie(context, response, user);
    response.json({ token, user: userView(user) });
  });

  // Signs this token out for good (until its expiry), not only this browser's cookie.
  router.post('/auth/logout', async (request, response) => {
    const found = tokenFrom(request);
    const claims = found ? verifyAuthToken(found.token, context.config.jwtSecret) : null;
    if (claims) await revokeToken(context, claims);
    clearAuthCookie(context, response);
    response.status(204).end();
  });

  /** Stores a reset for the address's account, if there is one, and mails its link. */
  async function sendPasswordReset(email: string): Promise<void> {
    const user = await users().findOneBy({ email });
    if (!user) return;
    const { token, tokenHash } = newSecretToken();
    const expiresAt = new Date(context.clock().getTime() + context.config.passwordResetLifetimeS * 1000);
    await context.dataSource.getRepository(PasswordReset).save({ userId: user.id, tokenHash, expiresAt, usedAt: null });
    const link = `${context.config.appUrl}/reset-password?token=${token}`;
    await context.mailer.send(passwordResetMail(user.email, link, expiresAt));
  }

  router.post('/auth/password-reset', limit, (request, response) => {
    const { email } = parseInput(passwordResetRequestBody, request.body);
    // The same answer, sent before anything depends on the address: no lookup, no mail, no waiting on SMTP.
    response.status(202).json({ ok: true, message: 'If an account uses this address, a reset link is on its way' });
    setImmediate(() => {
      sendPasswordReset(email).catch((error: Error) => context.log(`password reset: could not send the link: ${error.message}`));
    });
  });

  router.post('/auth/password-reset/confirm', limit, async (request, response) => {
    const body = parseInput(passwordResetConfirmBody, request.body);
    const resets = context.dataSource.getRepository(PasswordReset);
    const reset = await resets.findOneBy({ tokenHash: hashSecretToken(body.token), usedAt: IsNull(), expiresAt: MoreThan(context.clock()) });
    if (!reset) throw new ApiError(400, 'invalid', 'This reset link is invalid, used or expired; ask for a new one', 'token');
    const user = await users().findOneByOrFail({ id: reset.userId });
    requireStrongPassword(body.password, user.email);
    const passwordHash = await hashPassword(body.password, context.config.passwordHashCost);
    await context.dataSource.transaction(async (manager) => {
      const used = await manager.update(PasswordReset, { id: reset.id, usedAt: IsNull() }, { usedAt: context.clock() });
      if (used.affected !== 1) throw new ApiError(400, 'invalid', 'This reset link is invalid, used or expired; ask for a new one', 'token');
      await manager.update(User, { id: user.id }, { passwordHash, tokenVersion: user.tokenVersion + 1 });
    });
    // Committed: live connections opened with an older token close now.
    context.access.publish({ kind: 'user', userId: user.id, reason: 'password-changed' });
    response.json({ ok: true });
  });

  return router;
}
