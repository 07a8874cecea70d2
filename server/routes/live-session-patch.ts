import { validatedPatchFromDoc } from '../../shared/collab/patch-doc';
import type { Patch } from '../../shared/patch/patch-schema';
import type { AppContext } from '../app-context';
import type { Session } from '../db/entities/session';
import { parsePatch } from '../http/parse-input';

/**
 * The session's patch as its people see it now: the live document's when the session is open and
 * valid (the stored column may trail it by a save), the stored patch otherwise. Used where a copy
 * is taken (save as preset, update preset, duplicate), so the copy is what was on screen.
 */
export function liveSessionPatch(context: AppContext, session: Session): Patch {
  const room = context.collab?.room(session.id);
  if (room) {
    const live = validatedPatchFromDoc(room.doc);
    if (live.ok) return structuredClone(live.value);
  }
  return structuredClone(parsePatch(session.patch));
}
