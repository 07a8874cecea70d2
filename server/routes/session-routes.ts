import { Router } from 'express';
import { createSessionBody, loadPresetBody, updateSessionBody } from '../../shared/api/schemas';
import { computeModeTable, modeTableReport } from '../../shared/engine/mode-table';
import { defaultPatch } from '../../shared/patch/default-patch';
import type { Patch } from '../../shared/patch/patch-schema';
import type { AppContext } from '../app-context';
import { requireAccess, requireMembership, requirePermission } from '../access/studio-access';
import { currentUser, requireUser } from '../auth/authenticate';
import { Preset } from '../db/entities/preset';
import { Session } from '../db/entities/session';
import { User } from '../db/entities/user';
import { notFound } from '../http/api-error';
import { parseInput, parsePatch } from '../http/parse-input';
import { replaceSessionPatch } from '../collab/replace-session-patch';

function sessionSummary(session: Session, names: Map<string, string>) {
  return {
    id: session.id,
    studioId: session.studioId,
    name: session.name,
    archived: session.archived,
    createdAt: session.createdAt.toISOString(),
    updatedAt: session.updatedAt.toISOString(),
    createdBy: session.createdById ? { id: session.createdById, displayName: names.get(session.createdById) ?? null } : null,
    updatedBy: session.updatedById ? { id: session.updatedById, displayName: names.get(session.updatedById) ?? null } : null,
  };
}

export function sessionRoutes(context: AppContext): Router {
  const router = Router();
  const sessions = () => context.dataSource.getRepository(Session);
  router.use(['/studios/:studioId/sessions', '/sessions'], requireUser(context));

  async function displayNames(ids: Array<string | null>): Promise<Map<string, string>> {
    const wanted = [...new Set(ids.filter((id): id is string => id !== null))];
    if (wanted.length === 0) return new Map();
    const rows = await context.dataSource.getRepository(User).createQueryBuilder('u').select(['u.id', 'u.displayName']).where('u.id IN (:...wanted)', { wanted }).getMany();
    return new Map(rows.map((row) => [row.id, row.displayName]));
  }

  async function view(session: Session, withPatch: boolean) {
    const names = await displayNames([session.createdById, session.updatedById]);
    return { ...sessionSummary(session, names), ...(withPatch ? { patch: session.patch } : {}) };
  }

  /** A session the caller's studio owns; any other id answers 404. */
  async function sessionFor(userId: string, sessionId: string) {
    const session = await sessions().findOneBy({ id: sessionId });
    if (!session) throw notFound('Session');
    const membership = await requireMembership(context.dataSource, userId, session.studioId, 'Session');
    return { session, membership };
  }

  async function presetOfStudio(studioId: string, presetId: string): Promise<Preset> {
    const preset = await context.dataSource.getRepository(Preset).findOneBy({ id: presetId, studioId });
    if (!preset) throw notFound('Preset');
    return preset;
  }

  router.get('/studios/:studioId/sessions', async (request, response) => {
    const membership = await requireMembership(context.dataSource, currentUser(request).id, request.params.studioId);
    const includeArchived = request.query.archived === 'true';
    const rows = await sessions().find({
      where: { studioId: membership.studioId, ...(includeArchived ? {} : { archived: false }) },
      order: { updatedAt: 'DESC' },
      select: { id: true, studioId: true, name: true, archived: true, createdAt: true, updatedAt: true, createdById: true, updatedById: true },
    });
    const names = await displayNames(rows.flatMap((row) => [row.createdById, row.updatedById]));
    response.json({ sessions: rows.map((row) => sessionSummary(row, names)) });
  });

  // Who is in each of the studio's sessions right now (live collaboration).
  router.get('/studios/:studioId/sessions/presence', async (request, response) => {
    const membership = await requireMembership(context.dataSource, currentUser(request).id, request.params.studioId);
    const live = context.collab?.presence() ?? new Map<string, string[]>();
    const ids = live.size > 0 ? (await sessions().find({ where: { studioId: membership.studioId }, select: { id: true } })).map((row) => row.id) : [];
    const inStudio = ids.filter((id) => live.has(id));
    const names = await displayNames(inStudio.flatMap((id) => live.get(id) ?? []));
    response.json({
      presence: Object.fromEntries(inStudio.map((id) => [id, (live.get(id) ?? []).map((userId) => ({ id: userId, displayName: names.get(userId) ?? null }))])),
    });
  });

  router.post('/studios/:studioId/sessions', async (request, response) => {
    const user = currentUser(request);
    const membership = await requireAccess(context.dataSource, user.id, request.params.studioId, 'editSessions');
    const body = parseInput(createSessionBody, request.body);
    let patch: Patch;
    if (body.presetId) patch = (await presetOfStudio(membership.studioId, body.presetId)).patch;
    else if (body.patch !== undefined) patch = parsePatch(body.patch);
    else patch = defaultPatch(body.name);
    const session = await sessions().save(
      sessions().create({ studioId: membership.studioId, name: body.name, patch, createdById: user.id, updatedById: user.id, archived: false, docState: null }),
    );
    response.status(201).json({ session: await view(session, true) });
  });

  router.get('/sessions/:id', async (request, response) => {
    const { session } = await sessionFor(currentUser(request).id, request.params.id);
    response.json({ session: await view(session, true) });
  });

  router.get('/sessions/:id/modes', async (request, response) => {
    const { session } = await sessionFor(currentUser(request).id, request.params.id);
    const patch = parsePatch(session.patch);
    response.json(modeTableReport(computeModeTable(patch)));
  });

  router.patch('/sessions/:id', async (request, response) => {
    const user = currentUser(request);
    const { session, membership } = await sessionFor(user.id, request.params.id);
    requirePermission(membership, 'editSessions');
    const body = parseInput(updateSessionBody, request.body);
    const patch = body.patch !== undefined ? parsePatch(body.patch) : undefined;
    if (body.name !== undefined || body.archived !== undefined) {
      await sessions().update(
        { id: session.id },
        { ...(body.name !== undefined ? { name: body.name } : {}), ...(body.archived !== undefined ? { archived: body.archived } : {}), updatedById: user.id, updatedAt: context.clock() },
      );
    }
    // Committed: people in the session become read-only (archived) or may edit again (restored).
    if (body.archived !== undefined && body.archived !== session.archived) {
      context.access.publish({ kind: 'session', sessionId: session.id, studioId: session.studioId, reason: body.archived ? 'archived' : 'restored' });
    }
    if (patch) await replaceSessionPatch(context, session.id, patch, user.id);
    response.json({ session: await view(await sessions().findOneByOrFail({ id: session.id }), true) });
  });

  router.post('/sessions/:id/load-preset', async (request, response) => {
    const user = currentUser(request);
    const { session, membership } = await sessionFor(user.id, request.params.id);
    requirePermission(membership, 'editSessions');
    const { presetId } = parseInput(loadPresetBody, request.body);
    const preset = await presetOfStudio(session.studioId, presetId);
    // The session gets its own copy: later edits to either never reach the other.
    await replaceSessionPatch(context, session.id, structuredClone(preset.patch), user.id);
    response.json({ session: await view(await sessions().findOneByOrFail({ id: session.id }), true) });
  });

  router.delete('/sessions/:id', async (request, response) => {
    const { session, membership } = await sessionFor(currentUser(request).id, request.params.id);
    requirePermission(membership, 'deleteSessions');
    // The live document stops writing first, so nothing reaches the database after its rows are gone.
    const live = await context.collab?.stopStoring(session.id);
    try {
      await sessions().delete({ id: session.id });
    } catch (error) {
      live?.resume();
      throw error;
    }
    context.access.publish({ kind: 'session', sessionId: session.id, studioId: session.studioId, reason: 'deleted' });
    response.status(204).end();
  });

  return router;
}
