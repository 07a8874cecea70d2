import * as Y from 'yjs';
import { patchDoc, validatedPatchFromDoc } from '../../shared/collab/patch-doc';

export interface LogReading {
  /** The document state to open: every update when they read as a valid patch, else the longest valid prefix; null when none is valid. */
  state: Uint8Array | null;
  /** How many of the updates `state` holds. */
  kept: number;
  /** The first problem, when some updates were left out. */
  problem: string | null;
}

function problemOf(doc: Y.Doc): string | null {
  try {
    const result = validatedPatchFromDoc(doc);
    return result.ok ? null : result.issues[0].message;
  } catch (error) {
    return `the patch could not be read (${(error as Error).message})`;
  }
}

function applyAll(doc: Y.Doc, updates: readonly Uint8Array[]): string | null {
  try {
    doc.transact(() => {
      for (const update of updates) Y.applyUpdate(doc, update);
    });
    return null;
  } catch (error) {
    return `an update could not be read (${(error as Error).message})`;
  }
}

/**
 * Reads a session's stored updates (snapshot first, then the log). A log written before live edits
 * were checked may hold an edit that makes the patch invalid, or one that cannot be read at all:
 * then the session opens from its last valid state, the longest prefix of updates that reads as a
 * valid patch, so one bad edit can never make a session impossible to open.
 */
export function readStoredLog(updates: readonly Uint8Array[]): LogReading {
  const whole = new Y.Doc({ gc: true });
  patchDoc(whole);
  const unreadable = applyAll(whole, updates);
  const problem = unreadable ?? problemOf(whole);
  if (problem === null) {
    const state = Y.encodeStateAsUpdate(whole);
    whole.destroy();
    return { state, kept: updates.length, problem: null };
  }
  whole.destroy();
  // Find the longest valid prefix, one update at a time.
  const scan = new Y.Doc({ gc: true });
  patchDoc(scan);
  let kept = 0;
  for (let index = 0; index < updates.length; index++) {
    if (applyAll(scan, [updates[index]]) !== null) break;
    if (problemOf(scan) === null) kept = index + 1;
  }
  scan.destroy();
  if (kept === 0) return { state: null, kept: 0, problem };
  const prefix = new Y.Doc({ gc: true });
  patchDoc(prefix);
  applyAll(prefix, updates.slice(0, kept));
  const state = Y.encodeStateAsUpdate(prefix);
  prefix.destroy();
  return { state, kept, problem };
}
