import * as Y from 'yjs';
import { describe, expect, it } from 'vitest';
import { docSharedTypes } from '../../../shared/collab/doc-layout';
import { patchDoc, validatedPatchFromDoc, writePatchToDoc } from '../../../shared/collab/patch-doc';
import { setPatchNumber, setPatchNumbers } from '../../../shared/collab/patch-number-edit';
import { setPickupOutput } from '../../../shared/collab/pickup-output-edit';
import type { PickupOutput } from '../../../shared/patch/patch-schema';
import { testPatch, validPatch } from '../../support/patches';

function freshDoc(): { doc: Y.Doc; updates: () => number } {
  const doc = new Y.Doc();
  writePatchToDoc(doc, validPatch(testPatch()));
  let count = 0;
  doc.on('update', () => count++);
  return { doc, updates: () => count };
}

describe('typed number edits of the shared document', () => {
  it('sets a field in one update that the person can undo', () => {
    const { doc, updates } = freshDoc();
    const origin = Symbol('person');
    const undo = new Y.UndoManager(docSharedTypes(doc), { trackedOrigins: new Set([origin]) });
    expect(setPatchNumber(doc, 'damping.b1PerS', 1.5, origin)).toEqual({ ok: true });
    expect(updates()).toBe(1);
    expect(patchDoc(doc).damping.get('b1PerS')).toBe(1.5);
    undo.undo();
    expect(patchDoc(doc).damping.get('b1PerS')).toBe(0.5);
  });

  it('refuses a value outside its field\'s rule with the schema\'s message, and writes nothing', () => {
    const { doc, updates } = freshDoc();
    expect(setPatchNumber(doc, 'render.durationS', 61)).toEqual({ ok: false, reason: 'render.durationS must be <= 60, got 61' });
    expect(setPatchNumber(doc, 'render.maxModes', 2.5)).toMatchObject({ ok: false, reason: expect.stringMatching(/^render\.maxModes /) });
    expect(setPatchNumber(doc, 'string.tensionN', Number.NaN)).toEqual({ ok: false, reason: 'string.tensionN must be a finite number, got NaN' });
    expect(updates()).toBe(0);
  });

  it('refuses a value that breaks a rule between fields (pickup past the string\'s end, fundamental past Nyquist), and writes nothing', () => {
    const { doc, updates } = freshDoc();
    const pickup = setPatchNumber(doc, 'pickup.positionM', 0.7);
    expect(pickup).toMatchObject({ ok: false, reason: expect.stringContaining('pickup.positionM must be < string.lengthM (0.65)') });
    const tension = setPatchNumbers(doc, { 'string.tensionN': 1e7, 'damping.b1PerS': 1 });
    expect(tension).toMatchObject({ ok: false, reason: expect.stringContaining('string.tensionN gives a fundamental of') });
    expect(updates()).toBe(0);
    expect(patchDoc(doc).damping.get('b1PerS')).toBe(0.5);
  });

  it('sets several fields in one transaction, and a new length carries the points and the pickup with it', () => {
    const { doc, updates } = freshDoc();
    expect(setPatchNumbers(doc, { 'damping.b1PerS': 0.25, 'damping.b2M2PerS': 2e-4 })).toEqual({ ok: true });
    expect(updates()).toBe(1);
    expect(setPatchNumber(doc, 'string.lengthM', 1.3)).toEqual({ ok: true });
    const result = validatedPatchFromDoc(doc);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value.damping).toEqual({ b1PerS: 0.25, b2M2PerS: 2e-4 });
    expect(result.value.excitation.displacementM[1][0]).toBeCloseTo(0.34, 12);
    expect(result.value.pickup.positionM).toBeCloseTo(0.2, 12);
  });
});

describe('what the pickup reads', () => {
  it('is set from the schema\'s list, and anything else is refused with its message and writes nothing', () => {
    const { doc, updates } = freshDoc();
    expect(setPickupOutput(doc, 'velocity')).toEqual({ ok: true });
    expect(updates()).toBe(1);
    const refused = setPickupOutput(doc, 'pressure' as PickupOutput);
    expect(refused).toEqual({ ok: false, reason: 'pickup.output must be one of displacement, velocity, force, got "pressure"' });
    expect(updates()).toBe(1);
    expect(patchDoc(doc).pickup.get('output')).toBe('velocity');
  });
});
