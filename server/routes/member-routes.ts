import { Router } from 'express';
import { changeRoleBody } from '../../shared/api/schemas';
import type { AppContext } from '../app-context';
import { requireAccess, requireMembership } from '../access/studio-access';
import { currentUser, requireUser } from '../auth/authenticate';
import { Membership } from '../db/entities/membership';
import { conflict, notFound } from '../http/api-error';
import { parseInput } from '../http/parse-input';
import { leadCount, membersOf } from './membership-queries';

const LAST_LEAD = 'A studio keeps at least one lead: make another member lead first';

export function memberRoutes(context: AppContext): Router {
  const router = Router();
  router.use('/studios/:studioId/members', requireUser(context));

  router.get('/studios/:studioId/members', async (request, response) => {
    const membership = await requireMembership(context.dataSource, currentUser(request).id, request.params.studioId);
    response.json({ members: await membersOf(context.dataSource, membership.studioId) });
  });

  router.patch('/studios/:studioId/members/:userId', async (request, response) => {
    const own = await requireAccess(context.dataSource, currentUser(request).id, request.params.studioId, 'manageMembers');
    const { role } = parseInput(changeRoleBody, request.body);
    const changed = await context.dataSource.transaction(async (manager) => {
      const target = await manager.getRepository(Membership).findOneBy({ studioId: own.studioId, userId: request.params.userId });
      if (!target) throw notFound('Member');
      if (target.role === 'lead' && role !== 'lead' && (await leadCount(manager, own.studioId)) <= 1) throw conflict(LAST_LEAD, 'role');
      await manager.update(Membership, { id: target.id }, { role });
      return target.role !== role;
    });
    // Committed: the member's open live connections take the new role now.
    if (changed) context.access.publish({ kind: 'membership', studioId: own.studioId, userId: request.params.userId });
    response.json({ members: await membersOf(context.dataSource, own.studioId) });
  });

  router.delete('/studios/:studioId/members/:userId', async (request, response) => {
    const user = currentUser(request);
    const leaving = request.params.userId === user.id;
    // Anyone may leave a studio; only a lead may remove someone else.
    const own = leaving
      ? await requireMembership(context.dataSource, user.id, request.params.studioId)
      : await requireAccess(context.dataSource, user.id, request.params.studioId, 'manageMembers');
    await context.dataSource.transaction(async (manager) => {
      const target = await manager.getRepository(Membership).findOneBy({ studioId: own.studioId, userId: request.params.userId });
      if (!target) throw notFound('Member');
      if (target.role === 'lead' && (await leadCount(manager, own.studioId)) <= 1) throw conflict(LAST_LEAD);
      await manager.delete(Membership, { id: target.id });
    });
    // Committed: the member's open live connections to the studio close now.
    context.access.publish({ kind: 'membership', studioId: own.studioId, userId: request.params.userId });
    response.status(204).end();
  });

  return router;
}
