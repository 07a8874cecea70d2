import { In } from 'typeorm';
import { Router, type Response } from 'express';
import { changePasswordBody, deleteAccountBody, updateProfileBody } from '../../shared/api/schemas';
import type { AppContext } from '../app-context';
import { clearAuthCookie, currentUser, issueAuthCookie, requireUser } from '../auth/authenticate';
import { hashPassword, verifyPassword } from '../auth/password-hash';
import { Membership } from '../db/entities/membership';
import { Render } from '../db/entities/render';
import { Studio } from '../db/entities/studio';
import { User } from '../db/entities/user';
import { ApiError, conflict } from '../http/api-error';
import { parseInput } from '../http/parse-input';
import { requireStrongPassword } from './auth-routes';
import { leadCount, studiosOf } from './membership-queries';
import { accountCounter, tooManyAttempts } from './rate-limits';
import { userView } from './user-view';

export function meRoutes(context: AppContext): Router {
  const router = Router();
  const users = () => context.dataSource.getRepository(User);
  router.use('/me', requireUser(context));
  // Wrong current passwords per account (password change and account deletion share the count).
  const passwordChecks = accountCounter(context, 'passwordChecks');
  const checkPassword = async (user: User, password: string, response: Response, field: string): Promise<boolean> => {
    const waitS = passwordChecks.retryAfterS(user.id);
    if (waitS > 0) throw tooManyAttempts(response, waitS, 'Too many wrong passwords for this account', field);
    const valid = await verifyPassword(password, user.passwordHash);
    if (!valid) passwordChecks.record(user.id);
    return valid;
  };

  router.get('/me', async (request, response) => {
    const user = currentUser(request);
    response.json({ user: userView(user), studios: await studiosOf(context.dataSource, user.id) });
  });

  router.patch('/me', async (request, response) => {
    const user = currentUser(request);
    const { displayName } = parseInput(updateProfileBody, request.body);
    await users().update({ id: user.id }, { displayName });
    response.json({ user: userView({ ...user, displayName }) });
  });

  router.post('/me/password', async (request, response) => {
    const user = currentUser(request);
    const body = parseInput(changePasswordBody, request.body);
    if (!(await checkPassword(user, body.currentPassword, response, 'currentPassword'))) {
      throw new ApiError(400, 'invalid', 'currentPassword is wrong', 'currentPassword');
    }
    requireStrongPassword(body.newPassword, user.email, 'newPassword');
    const updated = { ...user, passwordHash: await hashPassword(body.newPassword, context.config.passwordHashCost), tokenVersion: user.tokenVersion + 1 };
    await users().update({ id: user.id }, { passwordHash: updated.passwordHash, tokenVersion: updated.tokenVersion });
    // Committed: live connections opened with an older token close now.
    context.access.publish({ kind: 'user', userId: user.id, reason: 'password-changed' });
    // Other devices are signed out (their tokens carry the old version); this one gets a fresh cookie.
    const token = issueAuthCookie(context, response, updated as User);
    response.json({ ok: true, token });
  });

  router.delete('/me', async (request, response) => {
    const user = currentUser(request);
    const { password } = parseInput(deleteAccountBody, request.body);
    if (!(await checkPassword(user, password, response, 'password'))) throw new ApiError(400, 'invalid', 'password is wrong', 'password');
    const gone = await context.dataSource.transaction(async (manager) => {
      const leads = await manager.getRepository(Membership).findBy({ userId: user.id, role: 'lead' });
      const blocking: string[] = [];
      const soleMemberStudios: string[] = [];
      for (const membership of leads) {
        if ((await leadCount(manager, membership.studioId)) > 1) continue;
        const members = await manager.getRepository(Membership).countBy({ studioId: membership.studioId });
        if (members > 1) blocking.push((await manager.getRepository(Studio).findOneByOrFail({ id: membership.studioId })).name);
        else soleMemberStudios.push(membership.studioId);
      }
      if (blocking.length > 0) {
        throw conflict(`You are the last lead of ${blocking.join(', ')}: make another member lead before deleting your account`);
      }
      const renders = soleMemberStudios.length > 0 ? await manager.getRepository(Render).findBy({ studioId: In(soleMemberStudios) }) : [];
      for (const studioId of soleMemberStudios) await manager.delete(Studio, { id: studioId });
      await manager.delete(User, { id: user.id });
      return { renders, soleMemberStudios };
    });
    // Committed: the studios' live rooms close first (nothing more is written to them), then the account's connections.
    for (const studioId of gone.soleMemberStudios) context.access.publish({ kind: 'studio', studioId, reason: 'deleted' });
    context.access.publish({ kind: 'user', userId: user.id, reason: 'account-deleted' });
    // The studios' render rows went with them (cascade); their files and running jobs go now.
    await context.renders?.discard(gone.renders);
    clearAuthCookie(context, response);
    response.status(204).end();
  });

  return router;
}
