import * as Y from 'yjs';
import { describe, expect, it } from 'vitest';
import { docPoint, patchDoc, patchFromDoc, validatedPatchFromDoc, writePatchToDoc } from '../../../shared/collab/patch-doc';
import { insertPoint, movePoint, replaceLayerPoints, setLengthM } from '../../../shared/collab/point-edits';
import { testPatch, validPatch } from '../../support/patches';

const validTestPatch = (overrides = {}) => validPatch(testPatch(overrides));

describe('document ↔ patch', () => {
  it('round-trips a patch, velocity layer and designer extras included', () => {
    const patch = validTestPatch({
      excitation: {
        displacementM: [[0, 0], [0.1, 0.001], [0.3, 0.002], [0.65, 0]],
        velocityMPerS: [[0, 0], [0.4, 0.5], [0.65, 0]],
      },
    });
    const withExtras = { ...patch, design: { material: 'nylon', targetNote: 'C4' }, tags: ['soft'] };
    const doc = new Y.Doc();
    writePatchToDoc(doc, withExtras);
    expect(patchFromDoc(doc)).toEqual(withExtras);
    // Stored interior points only: the supports are implied by the length.
    expect(patchDoc(doc).displacement.length).toBe(2);
  });

  it('repairs what concurrent edits can leave: crossed points sorted, points off the string or on the same x dropped', () => {
    const doc = new Y.Doc();
    writePatchToDoc(doc, validTestPatch());
    const layer = patchDoc(doc).displacement;
    layer.push([docPoint(0.1, 0.0005), docPoint(0.1, 0.0009), docPoint(0.9, 0.001), docPoint(-0.2, 0.001)]);
    const result = validatedPatchFromDoc(doc);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value.excitation.displacementM).toEqual([[0, 0], [0.1, 0.0005], [0.17, 0.003], [0.65, 0]]);
  });

  it('names the field when the document cannot make a valid patch', () => {
    const doc = new Y.Doc();
    writePatchToDoc(doc, validTestPatch());
    patchDoc(doc).string.set('tensionN', -1);
    const result = validatedPatchFromDoc(doc);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.issues[0].message).toBe('string.tensionN must be > 0, got -1');
  });

  it('clamps a dragged point between its neighbours and refuses points off the string', () => {
    const doc = new Y.Doc();
    writePatchToDoc(doc, validTestPatch({ excitation: { displacementM: [[0, 0], [0.1, 0.001], [0.3, 0.002], [0.65, 0]] } }));
    expect(movePoint(doc, 'displacement', 0, 0.5, 0.001)).toEqual({ ok: true });
    const [, first, second] = (patchFromDoc(doc) as { excitation: { displacementM: number[][] } }).excitation.displacementM;
    expect(first[0]).toBeLessThan(second[0]);
    expect(first[0]).toBeGreaterThan(0.299);
    expect(insertPoint(doc, 'displacement', 0.7, 0.001)).toMatchObject({ ok: false });
    expect(insertPoint(doc, 'displacement', 0.2, 0.001)).toMatchObject({ ok: true, index: 0 });
    expect(movePoint(doc, 'displacement', 9, 0.2, 0)).toMatchObject({ ok: false });
    expect(movePoint(doc, 'displacement', 0, Number.NaN, 0)).toMatchObject({ ok: false });
  });

  it('scales points and the pickup with the string length', () => {
    const doc = new Y.Doc();
    writePatchToDoc(doc, validTestPatch());
    setLengthM(doc, 1.3);
    const result = validatedPatchFromDoc(doc);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.value.excitation.displacementM[1][0]).toBeCloseTo(0.34, 12);
    expect(result.value.pickup.positionM).toBeCloseTo(0.2, 12);
  });
  it('replaces a whole layer in one step (a freehand stroke), or refuses bad points and changes nothing', () => {
    const doc = new Y.Doc();
    writePatchToDoc(doc, validTestPatch());
    const before = JSON.stringify(patchFromDoc(doc));
    expect(replaceLayerPoints(doc, 'displacement', [[0.2, 0.001], [0.1, 0.002]])).toMatchObject({ ok: false });
    expect(replaceLayerPoints(doc, 'displacement', [[0.2, Number.NaN]])).toMatchObject({ ok: false });
    expect(replaceLayerPoints(doc, 'displacement', [[0.65, 0.001]])).toMatchObject({ ok: false });
    expect(JSON.stringify(patchFromDoc(doc))).toBe(before);
    let updates = 0;
    doc.on('update', () => updates++);
    expect(replaceLayerPoints(doc, 'displacement', [[0.1, 0.001], [0.2, 0.003], [0.4, -0.001]])).toEqual({ ok: true });
    expect(updates).toBe(1);
    const result = validatedPatchFromDoc(doc);
    expect(result.ok && result.value.excitation.displacementM).toEqual([[0, 0], [0.1, 0.001], [0.2, 0.003], [0.4, -0.001], [0.65, 0]]);
  });
});
