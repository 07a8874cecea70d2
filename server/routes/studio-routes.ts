import { Router } from 'express';
import { createStudioBody, updateStudioBody } from '../../shared/api/schemas';
import type { AppContext } from '../app-context';
import { requireAccess, requireMembership } from '../access/studio-access';
import { currentUser, requireUser } from '../auth/authenticate';
import { Membership } from '../db/entities/membership';
import { Studio } from '../db/entities/studio';
import { parseInput } from '../http/parse-input';
import { addFactoryPresets } from '../seed/demo-seed';
import { studiosOf } from './membership-queries';
import { uniqueStudioSlug } from './studio-slug';

export function studioView(studio: Studio, role: string) {
  return { id: studio.id, name: studio.name, slug: studio.slug, role, createdAt: studio.createdAt.toISOString() };
}

export function studioRoutes(context: AppContext): Router {
  const router = Router();
  const studios = () => context.dataSource.getRepository(Studio);
  router.use('/studios', requireUser(context));

  router.get('/studios', async (request, response) => {
    response.json({ studios: await studiosOf(context.dataSource, currentUser(request).id) });
  });

  router.post('/studios', async (request, response) => {
    const user = currentUser(request);
    const { name } = parseInput(createStudioBody, request.body);
    const studio = await context.dataSource.transaction(async (manager) => {
      const created = await manager.save(Studio, manager.create(Studio, { name, slug: await uniqueStudioSlug(manager, name) }));
      await manager.save(Membership, manager.create(Membership, { userId: user.id, studioId: created.id, role: 'lead' }));
      // A new studio starts with the factory presets, authored by the lead who created it.
      await addFactoryPresets(manager, created.id, user.id);
      return created;
    });
    response.status(201).json({ studio: studioView(studio, 'lead') });
  });

  router.get('/studios/:studioId', async (request, response) => {
    const membership = await requireMembership(context.dataSource, currentUser(request).id, request.params.studioId);
    const studio = await studios().findOneByOrFail({ id: membership.studioId });
    response.json({ studio: studioView(studio, membership.role) });
  });

  router.patch('/studios/:studioId', async (request, response) => {
    const membership = await requireAccess(context.dataSource, currentUser(request).id, request.params.studioId, 'manageMembers');
    const { name } = parseInput(updateStudioBody, request.body);
    await studios().update({ id: membership.studioId }, { name });
    const studio = await studios().findOneByOrFail({ id: membership.studioId });
    response.json({ studio: studioView(studio, membership.role) });
  });

  return router;
}
