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
import { conflict, notFound } from '../http/api-error';
import { parseInput, parsePatch } from '../http/parse-input';
import { replaceSessionPatch } from '../collab/replace-session-patch';
import { LIMITS } from '../../shared/limits';
import { presetLoadedMessage } from '../../shared/protocol/live-access';
import { liveSessionPatch } from './live-session-patch';
import { presetVersionAfter } from './preset-version';

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
    const source = session.sourcePresetId ? await context.dataSource.getRepository(Preset).findOne({ where: { id: session.sourcePresetId, studioId: session.studioId }, select: { id: true, name: true, version: true } }) : null;
    return {
      ...sessionSummary(session, names),
      ...(withPatch ? { patch: session.patch, sourcePreset: source ? { id: source.id, name: source.name, version: source.version } : null } : {}),
    };
  }

  /** Links a session to a preset without counting as an edit of the session ("last edited" stays). */
  async function linkPreset(session: Session, presetId: string | null) {
    await sessions().createQueryBuilder().update().set({ sourcePresetId: presetId, updatedAt: () => '"updatedAt"' }).where('id = :id', { id: session.id }).execute();
  }

  /** Tells everyone in the session (compute channel, SessionNotice) that a preset was loaded into it. */
  function announcePresetLoaded(session: Session, preset: Preset, byName: string) {
    context.collab?.emit('notice', { kind: 'preset-loaded', sessionId: session.id, presetId: preset.id, presetName: preset.name, byName, message: presetLoadedMessage(byName, preset.name) });
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
    let sourcePresetId: string | null = null;
    if (body.presetId) {
      const preset = await presetOfStudio(membership.studioId, body.presetId);
      patch = structuredClone(preset.patch);
      sourcePresetId = preset.id;
    } else if (body.patch !== undefined) patch = parsePatch(body.patch);
    else patch = defaultPatch(body.name);
    const session = await sessions().save(
      sessions().create({ studioId: membership.studioId, name: body.name, patch, createdById: user.id, updatedById: user.id, archived: false, docState: null, sourcePresetId }),
    );
    response.status(201).json({ session: await view(session, true) });
  });

  // A copy of the session as its people see it now: same patch, same source preset, "… (copy)".
  router.post('/sessions/:id/duplicate', async (request, response) => {
    const user = currentUser(request);
    const { session, membership } = await sessionFor(user.id, request.params.id);
    requirePermission(membership, 'editSessions');
    const suffix = ' (copy)';
    const name = `${session.name.slice(0, LIMITS.maxLabelLength - suffix.length)}${suffix}`;
    const copy = await sessions().save(
      sessions().create({
        studioId: session.studioId,
        name,
        patch: liveSessionPatch(context, session),
        createdById: user.id,
        updatedById: user.id,
        archived: false,
        docState: null,
        sourcePresetId: session.sourcePresetId,
      }),
    );
    response.status(201).json({ session: await view(copy, true) });
  });

  // Writes the session's current patch to the preset it came from; the version rises only when the patch changed.
  router.post('/sessions/:id/update-preset', async (request, response) => {
    const user = currentUser(request);
    const { session, membership } = await sessionFor(user.id, request.params.id);
    requirePermission(membership, 'managePresets');
    const presets = context.dataSource.getRepository(Preset);
    const preset = session.sourcePresetId ? await presets.findOneBy({ id: session.sourcePresetId, studioId: session.studioId }) : null;
    if (!preset) throw conflict('This session did not come from a preset in the library: save it as a new preset instead');
    const patch = { ...liveSessionPatch(context, session), name: preset.name };
    const version = presetVersionAfter(preset.version, preset.patch, patch);
    const changed = version !== preset.version;
    if (changed) await presets.save(Object.assign(preset, { patch, version }));
    const updated = await presets.findOneByOrFail({ id: preset.id });
    response.json({ preset: { id: updated.id, name: updated.name, version: updated.version, updatedAt: updated.updatedAt.toISOString() }, changed });
  });

  // After a person loaded a preset into the open session (one undoable edit of the live document,
  // made in their browser): the session remembers the preset and everyone present is told.
  router.post('/sessions/:id/preset-loaded', async (request, response) => {
    const user = currentUser(request);
    const { session, membership } = await sessionFor(user.id, request.params.id);
    requirePermission(membership, 'editSessions');
    const { presetId } = parseInput(loadPresetBody, request.body);
    const preset = await presetOfStudio(session.studioId, presetId);
    await linkPreset(session, preset.id);
    announcePresetLoaded(session, preset, user.displayName);
    response.json({ session: await view(await sessions().findOneByOrFail({ id: session.id }), true) });
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
    await sessions().update({ id: session.id }, { sourcePresetId: preset.id });
    announcePresetLoaded(session, preset, user.displayName);
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
