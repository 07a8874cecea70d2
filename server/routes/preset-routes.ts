import { Router } from 'express';
import multer from 'multer';
import { createPresetBody, listPresetsQuery, updatePresetBody } from '../../shared/api/schemas';
import { LIMITS } from '../../shared/limits';
import { fieldIssue } from '../../shared/patch/field-issue';
import type { Patch } from '../../shared/patch/patch-schema';
import type { AppContext } from '../app-context';
import { requireAccess, requireMembership, requirePermission } from '../access/studio-access';
import { currentUser, requireUser } from '../auth/authenticate';
import { Preset } from '../db/entities/preset';
import { Session } from '../db/entities/session';
import { User } from '../db/entities/user';
import { ApiError, invalidFields, notFound } from '../http/api-error';
import { parseInput, parsePatch } from '../http/parse-input';
import { PreviewBusyError } from '../renders/preset-previews';
import { RenderService } from '../renders/render-service';
import { liveSessionPatch } from './live-session-patch';
import { presetVersionAfter } from './preset-version';

function presetView(preset: Preset, authorName: string | null, withPatch: boolean) {
  return {
    id: preset.id,
    studioId: preset.studioId,
    name: preset.name,
    tags: preset.tags,
    description: preset.description,
    version: preset.version,
    createdAt: preset.createdAt.toISOString(),
    updatedAt: preset.updatedAt.toISOString(),
    author: preset.createdById ? { id: preset.createdById, displayName: authorName } : null,
    ...(withPatch ? { patch: preset.patch } : {}),
  };
}

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: LIMITS.maxPatchFileBytes, files: 1, fields: 10 } });

/** A patch file may carry the preset's own fields (a downloaded preset does); they belong to the preset, not the patch. */
function withoutPresetFields(patch: Patch): { patch: Patch; tags?: unknown; description?: unknown } {
  const { tags, description, ...rest } = patch as Patch & { tags?: unknown; description?: unknown };
  return { patch: rest as Patch, tags, description };
}

/** File names keep letters and digits of any script; everything else becomes a hyphen. */
function downloadFileName(name: string): string {
  return `${name.normalize('NFC').replace(/[^\p{L}\p{N}._-]+/gu, '-').replace(/^-+|-+$/g, '') || 'preset'}.json`;
}

/** Tags from a form field: comma-separated, trimmed, lower-cased. */
function tagsFromForm(value: unknown): string[] {
  return typeof value === 'string' && value.trim() !== '' ? value.split(',').map((tag) => tag.trim()).filter(Boolean) : [];
}

export function presetRoutes(context: AppContext): Router {
  const router = Router();
  const presets = () => context.dataSource.getRepository(Preset);
  router.use(['/studios/:studioId/presets', '/presets'], requireUser(context));

  async function authorName(id: string | null): Promise<string | null> {
    if (!id) return null;
    return (await context.dataSource.getRepository(User).findOne({ where: { id }, select: { id: true, displayName: true } }))?.displayName ?? null;
  }

  async function presetFor(userId: string, presetId: string) {
    const preset = await presets().findOneBy({ id: presetId });
    if (!preset) throw notFound('Preset');
    const membership = await requireMembership(context.dataSource, userId, preset.studioId, 'Preset');
    return { preset, membership };
  }

  async function savePreset(studioId: string, userId: string, fields: { name: string; tags: string[]; description?: string; patch: Patch; sourceSessionId?: string | null }) {
    const preset = await presets().save(
      presets().create({
        studioId,
        name: fields.name,
        tags: [...new Set(fields.tags)],
        description: fields.description ?? '',
        patch: fields.patch,
        version: 1,
        createdById: userId,
        sourceSessionId: fields.sourceSessionId ?? null,
      }),
    );
    return presetView(preset, await authorName(userId), true);
  }

  router.get('/studios/:studioId/presets', async (request, response) => {
    const membership = await requireMembership(context.dataSource, currentUser(request).id, request.params.studioId);
    // An empty query parameter means "not given" (forms send them).
    const query = parseInput(listPresetsQuery, Object.fromEntries(Object.entries(request.query).filter(([, value]) => value !== '')));
    const builder = presets()
      .createQueryBuilder('p')
      .leftJoin(User, 'u', 'u.id = p.createdById')
      .addSelect('u.displayName', 'authorName')
      .where('p.studioId = :studioId', { studioId: membership.studioId });
    if (query.q) builder.andWhere("(p.name LIKE :q ESCAPE '\\' OR p.description LIKE :q ESCAPE '\\')", { q: `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` });
    if (query.tag) builder.andWhere('EXISTS (SELECT 1 FROM json_each(p.tags) WHERE json_each.value = :tag)', { tag: query.tag });
    const order = { name: ['p.name', 'ASC'], date: ['p.updatedAt', 'DESC'], author: ['authorName', 'ASC'] } as const;
    builder.orderBy(order[query.sort][0], order[query.sort][1]).addOrderBy('p.name', 'ASC');
    const { entities, raw } = await builder.getRawAndEntities<{ authorName: string | null }>();
    response.json({ presets: entities.map((preset, index) => presetView(preset, raw[index]?.authorName ?? null, false)) });
  });

  router.post('/studios/:studioId/presets', async (request, response) => {
    const user = currentUser(request);
    const membership = await requireAccess(context.dataSource, user.id, request.params.studioId, 'managePresets');
    const body = parseInput(createPresetBody, request.body);
    let patch: Patch;
    let sourceSessionId: string | null = null;
    if (body.sessionId) {
      const session = await context.dataSource.getRepository(Session).findOneBy({ id: body.sessionId, studioId: membership.studioId });
      if (!session) throw notFound('Session');
      // What the people in the session hear now (the live document), not the last stored copy.
      patch = liveSessionPatch(context, session);
      sourceSessionId = session.id;
    } else {
      patch = withoutPresetFields(parsePatch(body.patch)).patch;
    }
    const preset = await savePreset(membership.studioId, user.id, { ...body, patch: { ...patch, name: body.name }, sourceSessionId });
    // Saved from a session: the session now comes from this preset, so "Update preset" writes to it ("last edited" stays).
    if (sourceSessionId) await context.dataSource.getRepository(Session).createQueryBuilder().update().set({ sourcePresetId: preset.id, updatedAt: () => '"updatedAt"' }).where('id = :id', { id: sourceSessionId }).execute();
    response.status(201).json({ preset });
  });

  router.post('/studios/:studioId/presets/upload', async (request, response) => {
    const user = currentUser(request);
    const membership = await requireAccess(context.dataSource, user.id, request.params.studioId, 'managePresets');
    await new Promise<void>((resolve, reject) => upload.single('file')(request, response, (error: unknown) => (error ? reject(error) : resolve())));
    const file = request.file;
    if (!file) throw invalidFields([fieldIssue(['file'], 'is required: attach a patch JSON file', undefined, false)]);
    let json: unknown;
    try {
      json = JSON.parse(file.buffer.toString('utf8'));
    } catch (error) {
      throw invalidFields([fieldIssue(['file'], `${file.originalname} is not valid JSON: ${(error as Error).message}`, undefined, false)]);
    }
    const { patch, tags: fileTags, description: fileDescription } = withoutPresetFields(parsePatch(json, 'file'));
    const formName = typeof request.body?.name === 'string' && request.body.name.trim() !== '' ? request.body.name : undefined;
    const formTags = typeof request.body?.tags === 'string' ? tagsFromForm(request.body.tags) : undefined;
    const fields = parseInput(createPresetBody, {
      name: formName ?? patch.name.slice(0, LIMITS.maxLabelLength),
      tags: formTags ?? (Array.isArray(fileTags) ? fileTags.filter((tag): tag is string => typeof tag === 'string') : []),
      description: typeof fileDescription === 'string' ? fileDescription.slice(0, 500) : undefined,
      patch,
    });
    response.status(201).json({ preset: await savePreset(membership.studioId, user.id, { ...fields, patch: { ...patch, name: fields.name } }) });
  });

  router.get('/presets/:id', async (request, response) => {
    const { preset } = await presetFor(currentUser(request).id, request.params.id);
    response.json({ preset: presetView(preset, await authorName(preset.createdById), true) });
  });

  // Audition: a short preview, rendered at a modest level so a first listen is never loud. It is
  // rendered on a worker thread (never on the event loop) and kept by preset id and version.
  router.get('/presets/:id/preview.wav', async (request, response) => {
    const { preset } = await presetFor(currentUser(request).id, request.params.id);
    const previews = (context.renders ??= new RenderService(context)).previews;
    let bytes: Uint8Array;
    try {
      bytes = await previews.get(`${preset.id}:${preset.version}:${preset.name}`, parsePatch(preset.patch), { title: preset.name, software: 'Tautline', date: context.clock().toISOString().slice(0, 10) });
    } catch (error) {
      if (!(error instanceof PreviewBusyError)) throw error;
      response.setHeader('Retry-After', String(error.retryAfterS));
      throw new ApiError(503, 'rate_limited', error.message);
    }
    response.type('audio/wav').setHeader('Cache-Control', 'private, max-age=60');
    response.send(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength));
  });

  router.get('/presets/:id/download', async (request, response) => {
    const { preset } = await presetFor(currentUser(request).id, request.params.id);
    response.attachment(downloadFileName(preset.name));
    response.type('application/json').send(`${JSON.stringify({ ...preset.patch, tags: preset.tags, description: preset.description }, null, 2)}\n`);
  });

  router.patch('/presets/:id', async (request, response) => {
    const { preset, membership } = await presetFor(currentUser(request).id, request.params.id);
    requirePermission(membership, 'managePresets');
    const body = parseInput(updatePresetBody, request.body);
    const patch = body.patch !== undefined ? withoutPresetFields(parsePatch(body.patch)).patch : undefined;
    const name = body.name ?? preset.name;
    preset.name = name;
    if (body.tags) preset.tags = [...new Set(body.tags)];
    if (body.description !== undefined) preset.description = body.description;
    const nextPatch = { ...(patch ?? preset.patch), name };
    // The version counts changes of the sound, not of the label: compare without the name.
    if (patch) preset.version = presetVersionAfter(preset.version, preset.patch, patch);
    preset.patch = nextPatch;
    await presets().save(preset);
    const updated = await presets().findOneByOrFail({ id: preset.id });
    response.json({ preset: presetView(updated, await authorName(updated.createdById), true) });
  });

  router.delete('/presets/:id', async (request, response) => {
    const { preset, membership } = await presetFor(currentUser(request).id, request.params.id);
    requirePermission(membership, 'managePresets');
    await context.dataSource.transaction(async (manager) => {
      await manager.createQueryBuilder().update(Session).set({ sourcePresetId: null, updatedAt: () => '"updatedAt"' }).where('sourcePresetId = :id', { id: preset.id }).execute();
      await manager.delete(Preset, { id: preset.id });
    });
    response.status(204).end();
  });

  return router;
}
