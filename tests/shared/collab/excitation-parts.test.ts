import * as Y from 'yjs';
import { describe, expect, it } from 'vitest';
import { addExcitationPart, convertToFreePoints, readExcitationParts, removeExcitationPart, setExcitationParts, updateExcitationPart } from '../../../shared/collab/excitation-part-edits';
import { partPolyline, polylinesFromParts, sumPolylines } from '../../../shared/collab/excitation-polyline';
import { docShapeIssues, patchDoc, patchFromDoc, validatedPatchFromDoc, writePatchToDoc } from '../../../shared/collab/patch-doc';
import { pluckShape } from '../../../shared/collab/pluck-shape';
import { insertPoint, movePoint, MIN_POINT_GAP_FRACTION, replaceLayerPoints, setLengthM } from '../../../shared/collab/point-edits';
import { docSharedTypes } from '../../../shared/collab/doc-layout';
import { sineProjection } from '../../../shared/engine/sine-projection';
import { partOrdinal, type ExcitationPart, type PluckPart, type StrikePart } from '../../../shared/patch/excitation-part';
import type { Polyline } from '../../../shared/patch/patch-schema';
import { validatePatch } from '../../../shared/patch/validate-patch';
import { testPatch, validPatch } from '../../support/patches';

// testPatch's string: L = 0.65 m (tests/support/patches.ts). Parts are invented test data.
const L = 0.65;
const fingertip: PluckPart = { kind: 'pluck', positionM: 0.25, heightM: 0.004, widthM: 0.012, contact: 'fingertip' };
const pick: PluckPart = { kind: 'pluck', positionM: 0.2, heightM: 0.002, widthM: 0.004, contact: 'pick' };
const strike: StrikePart = { kind: 'strike', positionM: 0.42, velocityMPerS: 0.8, widthM: 0.02 };

function ok<T extends { ok: boolean }>(result: T): Extract<T, { ok: true }> {
  if (!result.ok) throw new Error((result as unknown as { reason: string }).reason);
  return result as Extract<T, { ok: true }>;
}

const full = (interior: ReadonlyArray<readonly [number, number]>): Polyline => [[0, 0], ...interior, [L, 0]];

function docWith(parts: ExcitationPart[] = []): Y.Doc {
  const doc = new Y.Doc();
  writePatchToDoc(doc, validPatch(testPatch()));
  if (parts.length > 0) ok(setExcitationParts(doc, parts));
  return doc;
}

function patchOf(doc: Y.Doc) {
  return ok(validatedPatchFromDoc(doc)).value;
}

/**
 * Sine coefficients of a flat-topped (trapezoid) pluck, at height h from a to b, 0 at the supports.
 * Integrating (2/L)∫ y sin(nπx/L) dx by parts twice, a piecewise-linear y gives
 * a_n = −(2L/(n²π²)) Σ Δs_k sin(nπx_k/L) over its corners x_k, Δs_k the change of slope there
 * (any textbook on Fourier series, e.g. Kreyszig, Advanced Engineering Mathematics, ch. 11); here
 * Δs = −h/a at a and −h/(L − b) at b. With a = b it is the triangle's a_n = 2hL² sin(nπp/L)/(n²π²p(L − p))
 * (Fletcher & Rossing, The Physics of Musical Instruments, ch. 2).
 */
function trapezoidCoefficient(n: number, a: number, b: number, h: number): number {
  return ((2 * L * h) / (n * n * Math.PI * Math.PI)) * (Math.sin((n * Math.PI * a) / L) / a + Math.sin((n * Math.PI * b) / L) / (L - b));
}

describe('a pluck or strike becomes an exact polyline', () => {
  it('makes a fingertip pluck exactly the rounded top of pluckShape, apex h at p', () => {
    const line = ok(partPolyline(L, fingertip));
    expect(line.points).toEqual(ok(pluckShape({ lengthM: L, positionM: 0.25, heightM: 0.004, widthM: 0.012 })).points);
    expect(line.points).toContainEqual([0.25, 0.004]);
    expect(Math.max(...line.points.map(([, y]) => y))).toBe(0.004);
  });

  it('makes a pick a flat top of its width at its height, whose modes are the trapezoid closed form', () => {
    const line = ok(partPolyline(L, pick)).points;
    expect(line).toEqual([
      [0.198, 0.002],
      [0.2, 0.002],
      [0.202, 0.002],
    ]);
    const coefficients = sineProjection(full(line), L, 40);
    for (const n of [1, 2, 3, 7, 13, 40]) expect(coefficients[n - 1]).toBeCloseTo(trapezoidCoefficient(n, 0.198, 0.202, 0.002), 12);
  });

  it('adds two plucks (a double pluck): the modes are the sum of each pluck\'s closed form (superposition)', () => {
    const second: PluckPart = { kind: 'pluck', positionM: 0.5, heightM: -0.001, widthM: 0.01, contact: 'pick' };
    const made = ok(polylinesFromParts(L, [pick, second]));
    expect(made.velocity).toBeNull();
    const coefficients = sineProjection(full(made.displacement!), L, 30);
    for (const n of [1, 2, 5, 11, 30]) {
      const expected = trapezoidCoefficient(n, 0.198, 0.202, 0.002) + trapezoidCoefficient(n, 0.495, 0.505, -0.001);
      expect(coefficients[n - 1]).toBeCloseTo(expected, 12);
    }
  });

  it('sums overlapping plucks point by point, each one valued where the other has its points', () => {
    const wide: PluckPart = { ...fingertip, positionM: 0.3, widthM: 0.2 };
    const a = ok(partPolyline(L, fingertip)).points;
    const b = ok(partPolyline(L, wide)).points;
    const sum = ok(sumPolylines(L, [a, b])).points;
    expect(sum.map(([x]) => x)).toEqual([...new Set([...a, ...b].map(([x]) => x))].sort((m, n) => m - n));
    // At one of a's own points, a is exact and b is linear between its neighbours.
    const [x, ya] = a[0];
    const fb = full(b);
    const j = fb.findIndex(([bx]) => bx > x);
    const yb = fb[j - 1][1] + ((fb[j][1] - fb[j - 1][1]) * (x - fb[j - 1][0])) / (fb[j][0] - fb[j - 1][0]);
    expect(sum.find(([sx]) => sx === x)![1]).toBeCloseTo(ya + yb, 15);
  });

  it('makes a strike a raised cosine: its velocity at the centre, at rest at the hammer\'s edges', () => {
    const line = ok(partPolyline(L, strike)).points;
    expect(line[0]).toEqual([0.41, 0]);
    expect(line[line.length - 1][1]).toBe(0);
    expect(line[line.length - 1][0]).toBeCloseTo(0.43, 15);
    const centre = line[(line.length - 1) / 2];
    expect(centre[0]).toBeCloseTo(0.42, 15);
    expect(centre[1]).toBeCloseTo(0.8, 15);
    // v(x) = V·½(1 + cos(2π(x − p)/w)) at a quarter of the width from the centre is V/2.
    const quarter = line.find(([x]) => Math.abs(x - 0.425) < 1e-12)!;
    expect(quarter[1]).toBeCloseTo(0.4, 12);
  });

  it('refuses a contact that reaches past a support, naming the part', () => {
    const made = polylinesFromParts(L, [fingertip, { ...strike, positionM: 0.005 }]);
    expect(made).toEqual({ ok: false, reason: expect.stringMatching(/^strike 2: a hammer 0.02 m wide at 0.005 m reaches past a support/) });
  });
});

describe('the parts in the shared document', () => {
  it('writes the parts and their polylines together; the patch carries both and validates', () => {
    const doc = docWith([fingertip, strike]);
    const patch = patchOf(doc);
    expect(patch.excitation.parts).toEqual([fingertip, strike]);
    expect(patch.excitation.displacementM).toEqual(full(ok(partPolyline(L, fingertip)).points));
    expect(patch.excitation.velocityMPerS).toEqual(full(ok(partPolyline(L, strike)).points));
    // A patch written back (a preset, a render's record) keeps them.
    const again = new Y.Doc();
    writePatchToDoc(again, patch);
    expect(patchOf(again)).toEqual(patch);
  });

  it('leaves a patch made of free points without parts', () => {
    const doc = docWith();
    expect(patchFromDoc(doc)).not.toHaveProperty('excitation.parts');
    expect(readExcitationParts(doc)).toEqual([]);
  });

  it('moves a whole pluck: apex at the new place, same height and width, the polyline remade exactly', () => {
    const doc = docWith([fingertip]);
    ok(updateExcitationPart(doc, 0, { positionM: 0.08 }));
    const patch = patchOf(doc);
    expect(patch.excitation.parts).toEqual([{ ...fingertip, positionM: 0.08 }]);
    expect(patch.excitation.displacementM).toEqual(full(ok(pluckShape({ lengthM: L, positionM: 0.08, heightM: 0.004, widthM: 0.012 })).points));
    const apex = patch.excitation.displacementM.reduce((best, point) => (point[1] > best[1] ? point : best));
    expect(apex).toEqual([0.08, 0.004]);
  });

  it('takes a whole drag back in one undo step, parts and polyline together', () => {
    const doc = docWith([fingertip]);
    const before = patchFromDoc(doc);
    const origin = Symbol('designer');
    const undo = new Y.UndoManager(docSharedTypes(doc), { trackedOrigins: new Set([origin]), captureTimeout: Number.POSITIVE_INFINITY });
    for (let mm = 249; mm >= 80; mm -= 13) ok(updateExcitationPart(doc, 0, { positionM: mm / 1000, heightM: 0.004 + mm * 1e-6 }, origin));
    expect(patchFromDoc(doc)).not.toEqual(before);
    undo.undo();
    expect(patchFromDoc(doc)).toEqual(before);
    expect(undo.undoStack).toHaveLength(0);
    undo.destroy();
  });

  it('clamps a drag toward a support so the contact stays on the string, and a width so it fits', () => {
    const doc = docWith([fingertip]);
    ok(updateExcitationPart(doc, 0, { positionM: -0.3 }));
    const gap = L * MIN_POINT_GAP_FRACTION;
    expect(readExcitationParts(doc)![0].positionM).toBeCloseTo(0.006 + gap, 15);
    ok(updateExcitationPart(doc, 0, { positionM: 0.1, widthM: 0.5 }));
    const part = readExcitationParts(doc)![0];
    expect(part.positionM).toBe(0.1);
    expect(part.widthM).toBeCloseTo(0.2 - 2 * gap, 15);
    expect(validatePatch(patchFromDoc(doc)).ok).toBe(true);
  });

  it('refuses a value that is not finite or a contact that is not known, and writes nothing', () => {
    const doc = docWith([fingertip]);
    const before = patchFromDoc(doc);
    expect(updateExcitationPart(doc, 0, { heightM: Number.NaN }).ok).toBe(false);
    expect(updateExcitationPart(doc, 0, { contact: 'spoon' })).toEqual({ ok: false, reason: 'Contact must be one of fingertip, pick' });
    expect(updateExcitationPart(doc, 3, { heightM: 0.001 })).toEqual({ ok: false, reason: 'there is no pluck or strike 4' });
    expect(patchFromDoc(doc)).toEqual(before);
  });

  it('adds a strike to a pluck (the strike layer appears) and removing it leaves the strike layer at rest', () => {
    const doc = docWith([fingertip]);
    ok(addExcitationPart(doc, strike));
    expect(patchOf(doc).excitation.velocityMPerS).toEqual(full(ok(partPolyline(L, strike)).points));
    ok(removeExcitationPart(doc, 1));
    expect(patchOf(doc).excitation.velocityMPerS).toEqual([[0, 0], [L, 0]]);
    expect(patchOf(doc).excitation.parts).toEqual([fingertip]);
  });

  it('refuses a point edit of a shape made by a pluck, with the reason, until it is converted to free points', () => {
    const doc = docWith([fingertip]);
    const before = patchFromDoc(doc);
    const reason = 'the shape is made by a pluck: drag its handle, or convert it to free points to edit it point by point';
    expect(movePoint(doc, 'displacement', 0, 0.2, 0.001)).toEqual({ ok: false, reason });
    expect(insertPoint(doc, 'displacement', 0.5, 0.001)).toEqual({ ok: false, reason });
    expect(replaceLayerPoints(doc, 'displacement', [[0.3, 0.001]])).toEqual({ ok: false, reason });
    expect(patchFromDoc(doc)).toEqual(before);
    ok(convertToFreePoints(doc));
    const converted = patchOf(doc);
    expect(converted.excitation.parts).toBeUndefined();
    expect(converted.excitation.displacementM).toEqual((before as { excitation: { displacementM: unknown } }).excitation.displacementM);
    expect(movePoint(doc, 'displacement', 0, 0.2, 0.001).ok).toBe(true);
  });

  it('keeps the parts and the points in step when the string\'s length changes', () => {
    const doc = docWith([fingertip, strike]);
    setLengthM(doc, 0.8);
    const patch = patchOf(doc);
    const remade = ok(polylinesFromParts(0.8, patch.excitation.parts!));
    const interior = patch.excitation.displacementM.slice(1, -1);
    remade.displacement!.forEach(([x, y], index) => {
      expect(interior[index][0]).toBeCloseTo(x, 14);
      expect(interior[index][1]).toBeCloseTo(y, 14);
    });
  });

  it('finds a part that is not a map of numbers and names in the shape check, and a bad field in validation', () => {
    const doc = docWith([fingertip]);
    patchDoc(doc).excitationParts.push([new Y.Array() as unknown as Y.Map<number | string>]);
    expect(docShapeIssues(doc).map((issue) => issue.message)).toEqual(['excitation.parts[2] must be a pluck or a strike, got "a shared text or list"']);
    const bad = docWith([fingertip]);
    patchDoc(bad).excitationParts.get(0).set('widthM', -1);
    const result = validatedPatchFromDoc(bad);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.issues.map((issue) => issue.field)).toEqual(['excitation.parts[0].widthM']);
  });
});

describe('numbering the parts', () => {
  it('counts each kind on its own: a pluck, a strike and a second pluck are pluck 1, strike 1 and pluck 2', () => {
    const parts: ExcitationPart[] = [fingertip, strike, pick];
    expect(parts.map((_, index) => partOrdinal(parts, index))).toEqual([1, 1, 2]);
  });
});
