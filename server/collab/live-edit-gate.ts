import * as Y from 'yjs';
import { patchDoc, validatedPatchFromDoc } from '../../shared/collab/patch-doc';
import { LIMITS } from '../../shared/limits';
import { LIVE_CLOSE_CODES, type LiveCloseCode } from '../../shared/protocol/live-access';

/** Re-measure the encoded document after this many bytes of admitted edits. */
const SIZE_CHECK_EVERY_BYTES = 256 * 1024;

export type GateVerdict = { ok: true } | { ok: false; code: LiveCloseCode; reason: string };

/**
 * Checks each edit a person sends before the live document takes it. The gate keeps a second copy
 * of the document (the probe); an edit is applied to the probe first, and only if the probe still
 * reads as a valid patch, holds no edits waiting for changes the server never saw, and stays within
 * LIMITS.maxLiveDocumentBytes, is the edit admitted to the real document (and so stored and sent to
 * everyone). A refused edit leaves the probe rebuilt from the real document: nothing of it remains.
 *
 * Yjs cannot take an edit back once a document has integrated it, hence the probe.
 *
 * A drag (each update setting the x or y of existing points to finite numbers, replacing their
 * current values) is recognised from the decoded update alone, against the real document, without
 * the probe: see isPlainDrag. The probe then falls behind and is rebuilt from the document before
 * the next edit that needs it.
 */
export class LiveEditGate {
  private probe: Y.Doc;
  /** True when admitted drags were not applied to the probe: it is rebuilt before it is next used. */
  private probeBehind = false;
  private bytesSinceSizeCheck = 0;

  constructor(private readonly doc: Y.Doc) {
    this.probe = this.freshProbe();
  }

  private freshProbe(): Y.Doc {
    const probe = new Y.Doc({ gc: true });
    patchDoc(probe); // the layout's types first, so content lands in the right kind of shared type
    Y.applyUpdate(probe, Y.encodeStateAsUpdate(this.doc));
    return probe;
  }

  private refuse(code: LiveCloseCode, reason: string): GateVerdict {
    this.probe.destroy();
    this.probe = this.freshProbe();
    this.probeBehind = false;
    this.bytesSinceSizeCheck = 0;
    return { ok: false, code, reason };
  }

  /**
   * True when the transaction only moved points: it changed nothing but the x and y of existing
   * points of the two polylines, each to a finite number. Such an edit cannot make the patch invalid
   * (reading repairs order and drops points off the string), so the whole patch need not be read
   * again: this is the common case, a drag, many times a second per person.
   */
  private onlyMovedPoints(transaction: Y.Transaction): boolean {
    const { displacement, velocity } = patchDoc(this.probe);
    for (const [type, keys] of transaction.changed) {
      const parent = type._item?.parent;
      if (!(type instanceof Y.Map) || (parent !== displacement && parent !== velocity)) return false;
      for (const key of keys) {
        if (key !== 'x' && key !== 'y') return false;
        const value: unknown = type.get(key);
        if (typeof value !== 'number' || !Number.isFinite(value)) return false;
      }
    }
    return true;
  }

  /**
   * True when the update provably only moves existing points, read from the decoded update and the
   * real document without applying it anywhere: every struct is a one-value item holding a finite
   * number that directly follows its client's known state (nothing pending), whose left origin is
   * the current, undeleted value of the x or y key of a live point of the two polylines (or a value
   * this same update set just before), each replaced once, with no right origin (so it lands as the
   * key's new value without a conflict); and every deletion is of a value so replaced. Anything else
   * returns false and takes the probe's path, so this admits only what the probe would admit.
   */
  private isPlainDrag(update: Uint8Array): boolean {
    let decoded: ReturnType<typeof Y.decodeUpdate>;
    try {
      decoded = Y.decodeUpdate(update);
    } catch {
      return false;
    }
    if (decoded.structs.length === 0) return false;
    const store = this.doc.store;
    const { displacement, velocity } = patchDoc(this.doc);
    const nextClock = new Map<number, number>();
    const replaced = new Set<string>();
    const added = new Set<string>();
    for (const struct of decoded.structs) {
      if (!(struct instanceof Y.Item) || struct.length !== 1 || struct.rightOrigin !== null || struct.origin === null) return false;
      if (!(struct.content instanceof Y.ContentAny) || struct.content.arr.length !== 1) return false;
      const value: unknown = struct.content.arr[0];
      if (typeof value !== 'number' || !Number.isFinite(value)) return false;
      const { client, clock } = struct.id;
      if (clock !== (nextClock.get(client) ?? Y.getState(store, client))) return false;
      nextClock.set(client, clock + 1);
      const origin = struct.origin;
      const originKey = `${origin.client}:${origin.clock}`;
      if (replaced.has(originKey)) return false;
      if (!added.has(originKey)) {
        if (origin.clock >= Y.getState(store, origin.client)) return false;
        const current = Y.getItem(store, origin);
        if (!(current instanceof Y.Item) || current.deleted || current.length !== 1 || current.id.clock !== origin.clock) return false;
        const point = current.parent;
        if (!(point instanceof Y.Map) || (current.parentSub !== 'x' && current.parentSub !== 'y') || point._map.get(current.parentSub) !== current) return false;
        const pointItem = point._item;
        if (pointItem === null || pointItem.deleted || (pointItem.parent !== displacement && pointItem.parent !== velocity)) return false;
      }
      replaced.add(originKey);
      added.add(`${client}:${clock}`);
    }
    for (const [client, deletions] of decoded.ds.clients) {
      for (const { clock, len } of deletions) {
        if (len > replaced.size) return false;
        for (let at = clock; at < clock + len; at++) if (!replaced.has(`${client}:${at}`)) return false;
      }
    }
    return true;
  }

  /** Decides on one edit (a Yjs update) from a person. On `ok`, apply it to the document next. */
  admit(update: Uint8Array): GateVerdict {
    if (this.bytesSinceSizeCheck + update.byteLength <= SIZE_CHECK_EVERY_BYTES && this.isPlainDrag(update)) {
      this.bytesSinceSizeCheck += update.byteLength;
      this.probeBehind = true;
      return { ok: true };
    }
    if (this.probeBehind) {
      this.probe.destroy();
      this.probe = this.freshProbe();
      this.probeBehind = false;
    }
    let movedPointsOnly = false;
    const inspect = (transaction: Y.Transaction) => {
      movedPointsOnly = this.onlyMovedPoints(transaction);
    };
    this.probe.on('afterTransaction', inspect);
    try {
      Y.applyUpdate(this.probe, update);
    } catch {
      return this.refuse(LIVE_CLOSE_CODES.editRefused, 'edit refused: it could not be read as a change of this session');
    } finally {
      this.probe.off('afterTransaction', inspect);
    }
    const store = this.probe.store;
    if (store.pendingStructs !== null || store.pendingDs !== null) {
      return this.refuse(LIVE_CLOSE_CODES.flooded, 'edit refused: it builds on changes this server never received');
    }
    this.bytesSinceSizeCheck += update.byteLength;
    if (this.bytesSinceSizeCheck > SIZE_CHECK_EVERY_BYTES) {
      this.bytesSinceSizeCheck = 0;
      const sizeBytes = Y.encodeStateAsUpdate(this.probe).byteLength;
      if (sizeBytes > LIMITS.maxLiveDocumentBytes) {
        return this.refuse(LIVE_CLOSE_CODES.editRefused, `edit refused: the session would grow past ${LIMITS.maxLiveDocumentBytes / 1024 / 1024} MiB`);
      }
    }
    if (movedPointsOnly) return { ok: true };
    let problem: string | null;
    try {
      const result = validatedPatchFromDoc(this.probe);
      problem = result.ok ? null : result.issues[0].message;
    } catch (error) {
      problem = `the patch could not be read (${(error as Error).message})`;
    }
    if (problem !== null) return this.refuse(LIVE_CLOSE_CODES.editRefused, `edit refused: ${problem}`);
    return { ok: true };
  }

  /** Mirrors a change the server made itself (loading, a preset loaded, a REST edit) into the probe. */
  mirror(update: Uint8Array): void {
    // A probe that is behind is rebuilt from the document, which has this change already.
    if (!this.probeBehind) Y.applyUpdate(this.probe, update);
  }

  destroy(): void {
    this.probe.destroy();
  }
}

/** A close reason fits in a websocket close frame: at most 123 bytes of UTF-8 (RFC 6455 §5.5). */
export function closeReason(text: string): string {
  let reason = text;
  while (Buffer.byteLength(reason) > 123) reason = `${reason.slice(0, Math.max(0, reason.length - 2))}…`;
  return reason;
}
