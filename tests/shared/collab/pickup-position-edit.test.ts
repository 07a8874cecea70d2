import * as Y from 'yjs';
import { describe, expect, it } from 'vitest';
import { patchDoc, validatedPatchFromDoc, writePatchToDoc } from '../../../shared/collab/patch-doc';
import { addStrikeLayer, movePickup, PICKUP_EDGE_FRACTION } from '../../../shared/collab/pickup-position-edit';
import { testPatch, validPatch } from '../../support/patches';

function docOfTestPatch(): Y.Doc {
  const doc = new Y.Doc();
  writePatchToDoc(doc, validPatch(testPatch()));
  return doc;
}

describe('moving the pickup and adding the strike layer', () => {
  it('moves the pickup, and a drag past either support stops just inside it, so the patch stays valid', () => {
    const doc = docOfTestPatch();
    expect(movePickup(doc, 0.3)).toEqual({ ok: true });
    expect(patchDoc(doc).pickup.get('positionM')).toBe(0.3);
    for (const [asked, expected] of [[-1, 0.65 * PICKUP_EDGE_FRACTION], [0.65, 0.65 * (1 - PICKUP_EDGE_FRACTION)], [9, 0.65 * (1 - PICKUP_EDGE_FRACTION)]]) {
      movePickup(doc, asked);
      expect(patchDoc(doc).pickup.get('positionM')).toBeCloseTo(expected, 12);
      expect(validatedPatchFromDoc(doc).ok).toBe(true);
    }
  });

  it('refuses a position that is not a number and writes nothing', () => {
    const doc = docOfTestPatch();
    let updates = 0;
    doc.on('update', () => updates++);
    expect(movePickup(doc, Number.NaN).ok).toBe(false);
    expect(updates).toBe(0);
  });

  it('adds a strike layer that reads as a zero velocity polyline', () => {
    const doc = docOfTestPatch();
    addStrikeLayer(doc);
    const result = validatedPatchFromDoc(doc);
    expect(result.ok && result.value.excitation.velocityMPerS).toEqual([[0, 0], [0.65, 0]]);
  });
});
