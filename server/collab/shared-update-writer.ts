import type { CollabStorage } from './collab-storage';

/** How long an update may wait in memory before it is written: at most this after it was received. */
export const FLUSH_MS = 20;

interface QueuedRow {
  sessionId: string;
  update: Uint8Array;
  resolve: (id: number) => void;
  reject: (error: Error) => void;
}

/**
 * The hub's one writer for every live session. Rooms ask for a flush when they hold unwritten
 * updates; every FLUSH_MS at most (counted from the first request), the writer asks each waiting
 * room to flush, and the rows those flushes append are written together, in one transaction. One
 * transaction per tick instead of one per session per tick: the fixed cost of a transaction (the
 * ORM's queries, BEGIN and COMMIT) is paid once for all sessions.
 *
 * Each room still gets its own outcome: the id of its row, or the error. When the shared
 * transaction fails, each session's row is tried again in a transaction of its own, so that one
 * session's refused row (its session deleted meanwhile) never fails another's.
 */
export class SharedUpdateWriter {
  private readonly waiting = new Set<() => void>();
  private tickTimer: NodeJS.Timeout | null = null;
  private queued: QueuedRow[] = [];
  private writeScheduled = false;
  private writes: Promise<void> = Promise.resolve();

  constructor(private readonly storage: CollabStorage) {}

  /** Calls `flush` within FLUSH_MS, on the writer's shared tick (once, however often it is asked). */
  flushSoon(flush: () => void): void {
    this.waiting.add(flush);
    this.tickTimer ??= setTimeout(() => this.tick(), FLUSH_MS);
  }

  /** Forgets a pending request (the room flushed already, or stopped writing). */
  cancel(flush: () => void): void {
    this.waiting.delete(flush);
  }

  private tick(): void {
    this.tickTimer = null;
    const due = [...this.waiting];
    this.waiting.clear();
    for (const flush of due) flush();
  }

  /**
   * Appends one row for a session; resolves with its id once it is committed. Rows appended in the
   * same turn of the event loop (and the promise jobs after it) share one transaction.
   */
  append(sessionId: string, update: Uint8Array): Promise<number> {
    return new Promise<number>((resolve, reject) => {
      this.queued.push({ sessionId, update, resolve, reject });
      if (this.writeScheduled) return;
      this.writeScheduled = true;
      // After the current turn's promise jobs: every room flushed on this tick has appended by then.
      setImmediate(() => {
        this.writeScheduled = false;
        const rows = this.queued;
        this.queued = [];
        this.writes = this.writes.then(() => this.write(rows));
      });
    });
  }

  private async write(rows: QueuedRow[]): Promise<void> {
    try {
      const ids = await this.storage.appendRows(rows.map(({ sessionId, update }) => ({ sessionId, update })));
      rows.forEach((row, index) => row.resolve(ids[index]));
    } catch {
      // One session at a time, so the failure stays with the session it belongs to.
      for (const row of rows) {
        try {
          const [id] = await this.storage.appendRows([{ sessionId: row.sessionId, update: row.update }]);
          row.resolve(id);
        } catch (error) {
          row.reject(error as Error);
        }
      }
    }
  }
}
