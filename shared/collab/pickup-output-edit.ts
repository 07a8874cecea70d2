import type * as Y from 'yjs';
import { fieldIssue } from '../patch/field-issue';
import { pickupSchema, type PickupOutput } from '../patch/patch-schema';
import { patchDoc } from './doc-layout';
import type { NumberEditResult } from './patch-number-edit';

/** Sets what the pickup reads, held to the schema's list (`pickup.output`); refused with its message, writing nothing. */
export function setPickupOutput(doc: Y.Doc, output: PickupOutput, origin?: unknown): NumberEditResult {
  const parsed = pickupSchema.shape.output.safeParse(output);
  if (!parsed.success) return { ok: false, reason: fieldIssue(['pickup', 'output'], parsed.error.issues[0].message, output).message };
  doc.transact(() => patchDoc(doc).pickup.set('output', parsed.data), origin);
  return { ok: true };
}
