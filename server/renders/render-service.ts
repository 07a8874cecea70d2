import { readdirSync, rmSync } from 'node:fs';
import { rm } from 'node:fs/promises';
import { join } from 'node:path';
import { In, type DataSource } from 'typeorm';
import type { RenderProgressMessage } from '../../shared/protocol/render-protocol';
import { levellingNote } from '../../shared/renders/render-levelling';
import type { RenderState } from '../../shared/renders/render-settings';
import { Render } from '../db/entities/render';
import { writeFileAtomic } from '../files/write-file-atomic';
import { renderWavFile } from './render-job-runner';
import { renderNoteSet } from './note-set-runner';
import { PresetPreviews } from './preset-previews';
import { RenderTaskPool, TaskCancelledError } from './render-task-pool';
import { ensureRendersDir } from './renders-dir';

const ACTIVE: RenderState[] = ['queued', 'rendering'];

/**
 * What the service needs from the server's context. AppContext satisfies it; the service names only
 * these parts, so app-context.ts (which holds the service) and this file do not import each other.
 */
export interface RenderServiceContext {
  dataSource: DataSource;
  config: { rendersDir: string; renderQuotaBytes: number };
  clock: () => Date;
  log: (line: string) => void;
}

/** Raised when a job would not fit in its studio's render storage. */
export class RenderQuotaError extends Error {}

/** Raised when a studio already has as many jobs waiting or running as it may. */
export class RenderQueueFullError extends Error {}

/**
 * Render jobs outside the request: a queue of Render rows run at most one per core on the render
 * task pool, each job's state and progress sent to listeners (the socket channel) as it changes.
 * A file appears under the renders folder only when complete (written to a temporary name and
 * renamed); a cancelled or failed job leaves none. Rows left running by a stopped server are
 * marked failed when the service starts.
 */
export class RenderService {
  readonly pool: RenderTaskPool;
  /** Preset auditions, rendered on the same worker threads. */
  readonly previews: PresetPreviews;
  private readonly queue: string[] = [];
  private readonly running = new Set<string>();
  private readonly cancelled = new Set<string>();
  private readonly listeners = new Set<(message: RenderProgressMessage) => void>();
  private admissions: Promise<unknown> = Promise.resolve();
  private ready: Promise<void>;
  private closed = false;

  constructor(
    private readonly context: RenderServiceContext,
    pool?: RenderTaskPool,
  ) {
    ensureRendersDir(context.config.rendersDir);
    this.pool = pool ?? new RenderTaskPool();
    this.previews = new PresetPreviews(this.pool);
    this.ready = this.recover();
  }

  private get repository() {
    return this.context.dataSource.getRepository(Render);
  }

  /** Rows a stopped server left queued or running fail; temporary files from it go. */
  private async recover(): Promise<void> {
    for (const name of readdirSync(this.context.config.rendersDir)) if (name.endsWith('.tmp')) rmSync(join(this.context.config.rendersDir, name), { force: true });
    await this.repository.update({ state: In(ACTIVE) }, { state: 'failed', error: 'the server stopped before this render finished; start it again', finishedAt: this.context.clock() });
  }

  onProgress(listener: (message: RenderProgressMessage) => void): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  private emit(render: Pick<Render, 'id' | 'studioId' | 'state' | 'progressPercent' | 'error'>): void {
    const message: RenderProgressMessage = { type: 'progress', studioId: render.studioId, renderId: render.id, state: render.state, progressPercent: render.progressPercent, error: render.error };
    for (const listener of this.listeners) listener(message);
  }

  /** Bytes a studio's renders hold, counting running jobs at their estimate. */
  async usageBytes(studioId: string): Promise<number> {
    const rows = await this.repository.find({ where: { studioId, state: In(['done', ...ACTIVE]) }, select: { state: true, sizeBytes: true, estimatedBytes: true } });
    return rows.reduce((sum, row) => sum + (row.state === 'done' ? (row.sizeBytes ?? 0) : row.estimatedBytes), 0);
  }

  /**
   * Admits a new job if the studio has room (storage and queue) and saves it, one admission at a
   * time so two requests cannot both take the last of the quota. Throws RenderQuotaError or
   * RenderQueueFullError with a message for the caller.
   */
  admit(fields: Partial<Render> & { studioId: string; estimatedBytes: number }, maxActive: number): Promise<Render> {
    const admission = this.admissions.then(async () => {
      await this.ready;
      const quota = this.context.config.renderQuotaBytes;
      const used = await this.usageBytes(fields.studioId);
      if (used + fields.estimatedBytes > quota) {
        throw new RenderQuotaError(
          `This studio's render storage is full: ${megabytes(used)} of ${megabytes(quota)} used, and this render needs up to ${megabytes(fields.estimatedBytes)}. Delete old renders, or shorten this one.`,
        );
      }
      const active = await this.repository.countBy({ studioId: fields.studioId, state: In(ACTIVE) });
      if (active >= maxActive) throw new RenderQueueFullError(`This studio already has ${active} renders waiting or running (at most ${maxActive}); wait for one to finish.`);
      const render = await this.repository.save(this.repository.create({ ...fields, state: 'queued', progressPercent: 0 }));
      this.queue.push(render.id);
      this.emit(render);
      this.pump();
      return render;
    });
    this.admissions = admission.catch(() => undefined);
    return admission;
  }

  async cancel(render: Render): Promise<Render> {
    if (!ACTIVE.includes(render.state)) return render;
    this.cancelled.add(render.id);
    this.pool.cancel(render.id);
    const index = this.queue.indexOf(render.id);
    if (index >= 0) this.queue.splice(index, 1);
    await this.repository.update({ id: render.id }, { state: 'cancelled', finishedAt: this.context.clock() });
    const updated = await this.repository.findOneByOrFail({ id: render.id });
    this.emit(updated);
    return updated;
  }

  async remove(render: Render): Promise<void> {
    await this.cancel(render);
    if (render.fileName) await rm(join(this.context.config.rendersDir, render.fileName), { force: true });
    await this.repository.delete({ id: render.id });
  }

  /** Stops the jobs and removes the files of renders whose rows are already gone (a deleted studio). */
  async discard(renders: ReadonlyArray<Render>): Promise<void> {
    for (const render of renders) {
      this.cancelled.add(render.id);
      this.pool.cancel(render.id);
      const index = this.queue.indexOf(render.id);
      if (index >= 0) this.queue.splice(index, 1);
      if (render.fileName) await rm(join(this.context.config.rendersDir, render.fileName), { force: true });
    }
  }

  filePath(render: Render): string | null {
    return render.fileName ? join(this.context.config.rendersDir, render.fileName) : null;
  }

  private pump(): void {
    while (!this.closed && this.running.size < this.pool.size && this.queue.length > 0) {
      const id = this.queue.shift() as string;
      this.running.add(id);
      void this.run(id).finally(() => {
        this.running.delete(id);
        this.cancelled.delete(id);
        this.pool.release(id);
        this.pump();
      });
    }
  }

  /** Resolves once no job is queued or running (tests and the benchmark wait on it). */
  async idle(): Promise<void> {
    while (this.queue.length > 0 || this.running.size > 0) await new Promise((resolve) => setTimeout(resolve, 20));
  }

  private async run(id: string): Promise<void> {
    const render = await this.repository.findOneBy({ id });
    if (!render || render.state !== 'queued' || this.cancelled.has(id)) return;
    render.state = 'rendering';
    await this.repository.update({ id }, { state: 'rendering' });
    this.emit(render);

    let lastPercent = 0;
    let lastSavedPercent = 0;
    const onProgress = (fraction: number) => {
      const percent = Math.min(99, Math.floor(fraction * 100));
      if (percent <= lastPercent || this.cancelled.has(id)) return;
      lastPercent = percent;
      render.progressPercent = percent;
      this.emit(render);
      if (percent - lastSavedPercent >= 10) {
        lastSavedPercent = percent;
        void this.repository.update({ id, state: 'rendering' }, { progressPercent: percent });
      }
    };

    try {
      const made =
        render.kind === 'single'
          ? await this.renderSingle(render, onProgress)
          : await renderNoteSet(this.pool, render, (patch) => this.metadata(render, patch), onProgress);
      if (this.cancelled.has(id)) return;
      const usedElsewhere = (await this.usageBytes(render.studioId)) - render.estimatedBytes;
      if (usedElsewhere + made.bytes.length > this.context.config.renderQuotaBytes) throw new RenderQuotaError("the finished file would not fit in this studio's render storage");
      const fileName = `${id}.${render.kind === 'single' ? 'wav' : 'zip'}`;
      await writeFileAtomic(join(this.context.config.rendersDir, fileName), made.bytes);
      if (this.cancelled.has(id)) {
        await rm(join(this.context.config.rendersDir, fileName), { force: true });
        return;
      }
      await this.repository.update(
        { id },
        {
          state: 'done',
          progressPercent: 100,
          fileName,
          sizeBytes: made.bytes.length,
          durationS: made.durationS,
          peakDbfs: finite(made.peakDbfs),
          truePeakDbtp: finite(made.truePeakDbtp),
          integratedLufs: finite(made.integratedLufs),
          fileCount: made.fileCount,
          levellingNote: made.levellingNote,
          finishedAt: this.context.clock(),
        },
      );
      this.emit({ ...render, state: 'done', progressPercent: 100, error: null });
    } catch (error) {
      if (error instanceof TaskCancelledError || this.cancelled.has(id)) return;
      // The detail (paths, codes) goes to the server's log; members see plain words.
      this.context.log(`render ${id} failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
      const message = publicMessage(error);
      await this.repository.update({ id }, { state: 'failed', error: message, finishedAt: this.context.clock() });
      this.emit({ ...render, state: 'failed', error: message });
    }
  }

  private async renderSingle(render: Render, onProgress: (fraction: number) => void) {
    const finished = await renderWavFile(this.pool, { id: render.id, fileKey: 'wav' }, render.patch, render.output, this.metadata(render), seedOf(render.id), onProgress);
    return { ...finished, fileCount: 1, levellingNote: levellingNote(finished.levelling, render.output, finite(finished.integratedLufs)) };
  }

  /** What a file says about itself: its name, the software, the date, and the settings and the patch it was made from (a note's own, in a set) as JSON. */
  metadata(render: Render, patch = render.patch) {
    const comment = JSON.stringify({ software: 'Tautline', render: { name: render.name, source: { kind: render.sourceKind, name: render.sourceName }, output: render.output, noteSet: render.noteSet }, patch });
    return { title: render.name, software: 'Tautline', date: this.context.clock().toISOString().slice(0, 10), comment };
  }

  async close(): Promise<void> {
    this.closed = true;
    for (const id of this.running) {
      this.cancelled.add(id);
      this.pool.cancel(id);
    }
    await this.pool.close();
  }
}

/**
 * What a member is told when a job fails: the quota's own message, else plain words that show no
 * server path; the detail is in the server's log.
 */
function publicMessage(error: unknown): string {
  if (error instanceof RenderQuotaError) return error.message;
  const code = (error as NodeJS.ErrnoException | null)?.code;
  if (typeof code === 'string' && /^E[A-Z]+$/.test(code)) return 'the render could not be written to storage; an administrator has the details';
  return 'the render failed on the server; an administrator has the details';
}

/** Levels of a silent render are −∞; the database (and JSON) keep them as null. */
function finite(value: number): number | null {
  return Number.isFinite(value) ? value : null;
}

function megabytes(bytes: number): string {
  return bytes >= 1024 ** 3 ? `${(bytes / 1024 ** 3).toFixed(2)} GB` : `${(bytes / 1024 ** 2).toFixed(1)} MB`;
}

/** A dither seed per render, from its id, so a file can be made again bit for bit. */
function seedOf(id: string): number {
  let hash = 2166136261;
  for (const char of id) hash = Math.imul(hash ^ char.charCodeAt(0), 16777619);
  return hash >>> 0;
}
