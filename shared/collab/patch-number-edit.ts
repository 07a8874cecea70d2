import * as Y from 'yjs';
import type { FieldIssue } from '../patch/field-issue';
import { fieldRule, type PatchNumberField } from '../patch/field-rules';
import { mapPartOfSection, patchDoc, type PatchSectionName } from './doc-layout';
import { validatedPatchFromDoc } from './patch-doc';
import { setLengthM } from './point-edits';

export type NumberEditResult = { ok: true } | { ok: false; reason: string };

function write(doc: Y.Doc, field: PatchNumberField, value: number, origin: unknown): void {
  if (field === 'string.lengthM') {
    // The length carries the points and the pickup with it (same fractions of the string).
    setLengthM(doc, value, origin);
    return;
  }
  const [section, key] = field.split('.') as [PatchSectionName, string];
  const name = mapPartOfSection(section);
  if (!name) throw new Error(`patch section ${section} has no map part in DOC_LAYOUT`);
  doc.transact(() => (patchDoc(doc)[name] as Y.Map<unknown>).set(key, value), origin);
}

const issueKey = (issue: FieldIssue) => `${issue.field} ${issue.problem}`;

/**
 * Sets numeric fields of the patch in one transaction (one undo step), or refuses and writes
 * nothing. Each value is first held to its field's own rule (`fieldRule`, the schema's bounds and
 * message); then the change is tried on a copy of the document, and refused if it gives the patch a
 * problem it did not have (a pickup beyond the string's end, a fundamental above half the sample
 * rate). The reason is the schema's message, naming the field.
 */
export function setPatchNumbers(doc: Y.Doc, values: Partial<Record<PatchNumberField, number>>, origin?: unknown): NumberEditResult {
  const entries = Object.entries(values) as Array<[PatchNumberField, number]>;
  for (const [field, value] of entries) {
    const message = fieldRule(field).message(value);
    if (message !== null) return { ok: false, reason: message };
  }
  const probe = new Y.Doc();
  patchDoc(probe);
  Y.applyUpdate(probe, Y.encodeStateAsUpdate(doc));
  const before = validatedPatchFromDoc(probe);
  const known = new Set(before.ok ? [] : before.issues.map(issueKey));
  for (const [field, value] of entries) write(probe, field, value, null);
  const after = validatedPatchFromDoc(probe);
  probe.destroy();
  const fresh = after.ok ? undefined : after.issues.find((issue) => !known.has(issueKey(issue)));
  if (fresh) return { ok: false, reason: fresh.message };
  doc.transact(() => {
    for (const [field, value] of entries) write(doc, field, value, origin);
  }, origin);
  return { ok: true };
}

/** Sets one numeric field of the patch (see `setPatchNumbers`): the typed way to change a number of the shared document. */
export function setPatchNumber(doc: Y.Doc, field: PatchNumberField, value: number, origin?: unknown): NumberEditResult {
  return setPatchNumbers(doc, { [field]: value }, origin);
}
