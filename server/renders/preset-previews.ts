import { LIMITS } from '../../shared/limits';
import type { Patch } from '../../shared/patch/patch-schema';
import type { WavMetadata } from '../audio/encode-wav';
import type { RenderTaskPool } from './render-task-pool';

/** Too many auditions are waiting: the caller answers 503 with Retry-After. */
export class PreviewBusyError extends Error {
  readonly retryAfterS = LIMITS.presetPreviewRetryAfterS;
  constructor() {
    super(`Too many auditions are being prepared; try again in ${LIMITS.presetPreviewRetryAfterS} s.`);
  }
}

/**
 * Preset audition files, rendered on the render pool's worker threads (never on the event loop),
 * at most LIMITS.presetPreviewMaxRendering at once with LIMITS.presetPreviewMaxWaiting more
 * waiting; beyond that a request is refused (PreviewBusyError). Finished files are kept by key
 * (preset id, version and name) in a cache bounded in bytes, least recently used out first, and a
 * request for a file being rendered waits for that render instead of starting another.
 */
export class PresetPreviews {
  private readonly cache = new Map<string, Uint8Array>();
  private cachedBytes = 0;
  private readonly inFlight = new Map<string, Promise<Uint8Array>>();
  private readonly waiting: Array<() => void> = [];
  private rendering = 0;
  /** Files rendered so far (not served from the cache), for tests and the benchmark. */
  renderedCount = 0;

  constructor(
    private readonly pool: RenderTaskPool,
    private readonly maxBytes: number = LIMITS.presetPreviewCacheBytes,
  ) {}

  async get(key: string, patch: Patch, metadata: WavMetadata): Promise<Uint8Array> {
    const cached = this.cache.get(key);
    if (cached) {
      // Most recently used goes last.
      this.cache.delete(key);
      this.cache.set(key, cached);
      return cached;
    }
    const pending = this.inFlight.get(key);
    if (pending) return pending;
    if (this.rendering >= LIMITS.presetPreviewMaxRendering && this.waiting.length >= LIMITS.presetPreviewMaxWaiting) throw new PreviewBusyError();
    const made = this.render(key, patch, metadata);
    this.inFlight.set(key, made);
    try {
      return await made;
    } finally {
      this.inFlight.delete(key);
    }
  }

  private async render(key: string, patch: Patch, metadata: WavMetadata): Promise<Uint8Array> {
    if (this.rendering >= LIMITS.presetPreviewMaxRendering) await new Promise<void>((resolve) => this.waiting.push(resolve));
    this.rendering++;
    try {
      const { bytes } = await this.pool.run(`preview:${key}`, { type: 'preview', patch, metadata });
      this.renderedCount++;
      this.keep(key, bytes);
      return bytes;
    } finally {
      this.rendering--;
      this.waiting.shift()?.();
    }
  }

  private keep(key: string, bytes: Uint8Array): void {
    if (bytes.length > this.maxBytes) return;
    this.cache.set(key, bytes);
    this.cachedBytes += bytes.length;
    for (const [oldest, old] of this.cache) {
      if (this.cachedBytes <= this.maxBytes) break;
      this.cache.delete(oldest);
      this.cachedBytes -= old.length;
    }
  }
}
