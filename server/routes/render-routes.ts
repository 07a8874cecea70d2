import { Router, type Request } from 'express';
import { LIMITS } from '../../shared/limits';
import { fieldIssue } from '../../shared/patch/field-issue';
import { noteSetFileIssue } from '../../shared/renders/note-set-file-render';
import { noteSetPlan } from '../../shared/renders/note-set-plan';
import { createRenderBodyFields, unlevelledPcmMessage, type RenderView } from '../../shared/renders/render-settings';
import type { AppContext } from '../app-context';
import { requireAccess, requireMembership, requirePermission } from '../access/studio-access';
import { currentUser, requireUser } from '../auth/authenticate';
import { Preset } from '../db/entities/preset';
import { Render } from '../db/entities/render';
import { Session } from '../db/entities/session';
import { User } from '../db/entities/user';
import { ApiError, conflict, invalidFields, notFound } from '../http/api-error';
import { parseInput, parsePatch } from '../http/parse-input';
import { noteSetFileCount, wavUpperBoundBytes } from '../renders/render-estimate';
import { RenderQueueFullError, RenderQuotaError, RenderService } from '../renders/render-service';

function renderView(render: Render, creatorName: string | null): RenderView {
  return {
    id: render.id,
    studioId: render.studioId,
    kind: render.kind,
    name: render.name,
    state: render.state,
    progressPercent: render.progressPercent,
    source: { kind: render.sourceKind, id: render.sourceId, name: render.sourceName },
    output: render.output,
    noteSet: render.noteSet,
    durationS: render.durationS,
    sizeBytes: render.sizeBytes,
    peakDbfs: render.peakDbfs,
    truePeakDbtp: render.truePeakDbtp,
    integratedLufs: render.integratedLufs,
    fileCount: render.fileCount,
    levellingNote: render.levellingNote ?? null,
    error: render.error,
    createdBy: render.createdById ? { id: render.createdById, displayName: creatorName } : null,
    createdAt: render.createdAt.toISOString(),
    finishedAt: render.finishedAt ? render.finishedAt.toISOString() : null,
  };
}

/** A download's file name: letters and digits of any script; everything else becomes a hyphen. */
function fileNameOf(name: string, extension: string): string {
  return `${name.normalize('NFC').replace(/[^\p{L}\p{N}._-]+/gu, '-').replace(/^-+|-+$/g, '') || 'render'}.${extension}`;
}

/**
 * Render jobs: start one of a session's current patch or of a preset (leads and producers),
 * follow it, cancel it, list a studio's renders with their figures, download or play the file,
 * read the patch it was made from, and delete it (leads). A render of another studio answers 404.
 */
export function renderRoutes(context: AppContext): Router {
  const router = Router();
  const service = (context.renders ??= new RenderService(context));
  const renders = () => context.dataSource.getRepository(Render);
  router.use(['/studios/:studioId/renders', '/renders'], requireUser(context));

  async function creatorNames(ids: Array<string | null>): Promise<Map<string, string | null>> {
    const wanted = [...new Set(ids.filter((id): id is string => id !== null))];
    if (wanted.length === 0) return new Map();
    const users = await context.dataSource.getRepository(User).createQueryBuilder('u').select(['u.id', 'u.displayName']).where('u.id IN (:...wanted)', { wanted }).getMany();
    return new Map(users.map((user) => [user.id, user.displayName]));
  }

  async function view(render: Render): Promise<RenderView> {
    return renderView(render, (await creatorNames([render.createdById])).get(render.createdById ?? '') ?? null);
  }

  async function renderFor(request: Request) {
    const render = await renders().findOneBy({ id: String(request.params.renderId) });
    if (!render) throw notFound('Render');
    const membership = await requireMembership(context.dataSource, currentUser(request).id, render.studioId, 'Render');
    return { render, membership };
  }

  router.get('/studios/:studioId/renders', async (request, response) => {
    const membership = await requireMembership(context.dataSource, currentUser(request).id, request.params.studioId);
    const sessionId = typeof request.query.sessionId === 'string' && request.query.sessionId !== '' ? request.query.sessionId : undefined;
    const rows = await renders().find({ where: { studioId: membership.studioId, ...(sessionId ? { sessionId } : {}) }, order: { createdAt: 'DESC' } });
    const names = await creatorNames(rows.map((row) => row.createdById));
    response.json({
      renders: rows.map((row) => renderView(row, names.get(row.createdById ?? '') ?? null)),
      storage: { usedBytes: await service.usageBytes(membership.studioId), quotaBytes: context.config.renderQuotaBytes },
    });
  });

  router.post('/studios/:studioId/renders', async (request, response) => {
    const user = currentUser(request);
    const membership = await requireAccess(context.dataSource, user.id, request.params.studioId, 'exportRenders');
    // Level "none" in a PCM file is checked below, once the patch's pickup (and so its unit) is known.
    const body = parseInput(createRenderBodyFields, request.body);
    let source: { kind: 'session' | 'preset'; id: string; name: string; patch: unknown; sessionId: string | null };
    if (body.source.kind === 'session') {
      const session = await context.dataSource.getRepository(Session).findOneBy({ id: body.source.sessionId, studioId: membership.studioId });
      if (!session) throw notFound('Session');
      source = { kind: 'session', id: session.id, name: session.name, patch: session.patch, sessionId: session.id };
    } else {
      const preset = await context.dataSource.getRepository(Preset).findOneBy({ id: body.source.presetId, studioId: membership.studioId });
      if (!preset) throw notFound('Preset');
      source = { kind: 'preset', id: preset.id, name: preset.name, patch: preset.patch, sessionId: null };
    }
    const patch = parsePatch(source.patch);
    const { channels } = body.output;
    if (channels.kind === 'stereo' && !(channels.secondPickupPositionM < patch.string.lengthM)) {
      const field = ['output', 'channels', 'secondPickupPositionM'];
      throw invalidFields([fieldIssue(field, `must lie on the string: more than 0 and less than its length, ${patch.string.lengthM} m (${(patch.string.lengthM * 1000).toFixed(1)} mm)`, channels.secondPickupPositionM)]);
    }
    if (body.output.normalization.kind === 'none' && body.output.format !== 'f32') {
      throw invalidFields([fieldIssue(['output', 'normalization', 'kind'], unlevelledPcmMessage(patch.pickup.output), 'none')]);
    }
    if (body.kind === 'noteSet') {
      // Every file's own patch and pickups, before the job is admitted.
      const issue = noteSetFileIssue(patch, body.output, body.noteSet, noteSetPlan(body.noteSet, body.name ?? source.name));
      if (issue) throw invalidFields([issue]);
    }
    const patchJsonBytes = Buffer.byteLength(JSON.stringify(patch));
    const files = body.kind === 'noteSet' ? noteSetFileCount(body.noteSet) : 1;
    const estimatedBytes = files * wavUpperBoundBytes(body.output, patchJsonBytes) + (body.kind === 'noteSet' ? patchJsonBytes + 1024 * 1024 : 0);
    const name = body.name && body.name !== '' ? body.name : `${source.name}${body.kind === 'noteSet' ? ' · note set' : ''}`;
    try {
      const render = await service.admit(
        {
          studioId: membership.studioId,
          kind: body.kind,
          name: name.slice(0, LIMITS.maxRenderNameLength),
          sourceKind: source.kind,
          sourceId: source.id,
          sourceName: source.name,
          sessionId: source.sessionId,
          output: body.output,
          noteSet: body.kind === 'noteSet' ? body.noteSet : null,
          patch,
          estimatedBytes,
          createdById: user.id,
          fileCount: null,
        },
        LIMITS.maxQueuedRendersPerStudio,
      );
      response.status(202).json({ render: await view(render) });
    } catch (error) {
      if (error instanceof RenderQuotaError) throw new ApiError(409, 'render_quota_full', error.message);
      if (error instanceof RenderQueueFullError) throw new ApiError(409, 'too_many_renders', error.message);
      throw error;
    }
  });

  router.get('/renders/:renderId', async (request, response) => {
    const { render } = await renderFor(request);
    response.json({ render: await view(render) });
  });

  router.post('/renders/:renderId/cancel', async (request, response) => {
    const { render, membership } = await renderFor(request);
    requirePermission(membership, 'exportRenders');
    response.json({ render: await view(await service.cancel(render)) });
  });

  router.delete('/renders/:renderId', async (request, response) => {
    const { render, membership } = await renderFor(request);
    requirePermission(membership, 'deleteRenders');
    await service.remove(render);
    response.status(204).end();
  });

  router.get('/renders/:renderId/file', async (request, response) => {
    const { render } = await renderFor(request);
    const path = service.filePath(render);
    if (render.state !== 'done' || !path) throw conflict(`This render is ${render.state}, not done: there is no file yet`);
    const wav = render.kind === 'single';
    const inline = request.query.inline === '1' && wav;
    response.type(wav ? 'audio/wav' : 'application/zip').setHeader('Cache-Control', 'private, max-age=3600');
    if (!inline) response.attachment(fileNameOf(render.name, wav ? 'wav' : 'zip'));
    response.sendFile(path);
  });

  router.get('/renders/:renderId/patch.json', async (request, response) => {
    const { render } = await renderFor(request);
    response.attachment(fileNameOf(`${render.name} patch`, 'json'));
    response.type('application/json').send(`${JSON.stringify(render.patch, null, 2)}\n`);
  });

  return router;
}
