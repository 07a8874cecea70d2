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
 */
export class LiveEditGate {
  private probe: Y.Doc;
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

  /** Decides on one edit (a Yjs update) from a person. On `ok`, apply it to the document next. */
  admit(update: Uint8Array): GateVerdict {
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
    Y.applyUpdate(this.probe, update);
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
