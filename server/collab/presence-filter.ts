import * as decoding from 'lib0/decoding';
import * as encoding from 'lib0/encoding';
import type { Role } from '../../shared/access/roles';

/** Who a connection is, in the server's view: what everyone else sees as its presence. */
export interface PresenceIdentity {
  name: string;
  colour: string;
  role: Role | null;
}

/** Most presence entries one message may carry (a browser tab has one), and the longest entry, in characters. */
const MAX_ENTRIES = 4;
const MAX_STATE_CHARS = 2048;
const LAYERS = new Set(['displacement', 'velocity', 'pickup']);

/** Keeps only what a person may say about themselves: where their pointer is and what they drag. */
function sanitizedState(state: unknown, identity: PresenceIdentity): Record<string, unknown> | null | undefined {
  if (state === null) return null;
  if (typeof state !== 'object' || Array.isArray(state)) return undefined;
  const { pointerXM, dragging } = state as Record<string, unknown>;
  const drag = dragging as { layer?: unknown; index?: unknown } | null | undefined;
  const validDrag =
    drag && typeof drag === 'object' && typeof drag.layer === 'string' && LAYERS.has(drag.layer) && Number.isInteger(drag.index) && (drag.index as number) >= 0
      ? { layer: drag.layer, index: drag.index }
      : null;
  return {
    name: identity.name,
    colour: identity.colour,
    role: identity.role,
    pointerXM: typeof pointerXM === 'number' && Number.isFinite(pointerXM) ? pointerXM : null,
    dragging: validDrag,
  };
}

/**
 * Rewrites a presence (y-protocols awareness) update from one connection: the name, colour and role
 * come from the server's view of the person, not from what the browser claims; only the pointer
 * position and the dragged handle are kept; entries for client ids the connection may not speak for
 * are dropped. Returns null when nothing is left. The wire format is y-protocols' own:
 * count, then (client id, clock, JSON state) per entry.
 */
export function filterPresenceUpdate(update: Uint8Array, identity: PresenceIdentity, mayUse: (clientId: number) => boolean): Uint8Array | null {
  const decoder = decoding.createDecoder(update);
  const count = decoding.readVarUint(decoder);
  const kept: Array<[number, number, string]> = [];
  for (let index = 0; index < count && index < MAX_ENTRIES; index++) {
    const clientId = decoding.readVarUint(decoder);
    const clock = decoding.readVarUint(decoder);
    const json = decoding.readVarString(decoder);
    if (json.length > MAX_STATE_CHARS || !mayUse(clientId)) continue;
    let state: unknown;
    try {
      state = JSON.parse(json);
    } catch {
      continue;
    }
    const clean = sanitizedState(state, identity);
    if (clean === undefined) continue;
    kept.push([clientId, clock, JSON.stringify(clean)]);
  }
  if (kept.length === 0) return null;
  const encoder = encoding.createEncoder();
  encoding.writeVarUint(encoder, kept.length);
  for (const [clientId, clock, json] of kept) {
    encoding.writeVarUint(encoder, clientId);
    encoding.writeVarUint(encoder, clock);
    encoding.writeVarString(encoder, json);
  }
  return encoding.toUint8Array(encoder);
}
