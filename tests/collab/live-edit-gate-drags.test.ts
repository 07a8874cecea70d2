import * as Y from 'yjs';
import { describe, expect, it } from 'vitest';
import { LiveEditGate } from '../../server/collab/live-edit-gate';
import { patchDoc, validatedPatchFromDoc, writePatchToDoc } from '../../shared/collab/patch-doc';
import { movePoint } from '../../shared/collab/point-edits';
import { defaultPatch } from '../../shared/patch/default-patch';

/** A server document with a gate, and a person's copy of it; `edit` returns the person's update. */
function setUp() {
  const base = defaultPatch('Gate drag string');
  const lengthM = base.string.lengthM;
  const server = new Y.Doc();
  writePatchToDoc(server, { ...base, excitation: { displacementM: [[0, 0], [lengthM / 3, 0.002], [(2 * lengthM) / 3, 0.001], [lengthM, 0]] } });
  const gate = new LiveEditGate(server);
  const person = new Y.Doc();
  Y.applyUpdate(person, Y.encodeStateAsUpdate(server));
  const edit = (change: (doc: Y.Doc) => void): Uint8Array => {
    const before = Y.encodeStateVector(person);
    change(person);
    return Y.encodeStateAsUpdate(person, before);
  };
  /** Admits (and then applies, as the room does) or refuses. */
  const send = (update: Uint8Array) => {
    const verdict = gate.admit(update);
    if (verdict.ok) Y.applyUpdate(server, update);
    return verdict;
  };
  return { server, gate, person, edit, send, lengthM };
}

const point = (doc: Y.Doc, index: number) => patchDoc(doc).displacement.get(index) as unknown as Y.Map<unknown>;

describe('the edit gate on drags', () => {
  it('admits a run of drags, and an ordinary edit after them is checked against everything the drags did', () => {
    const { server, person, edit, send, lengthM } = setUp();
    for (let step = 0; step < 20; step++) {
      expect(send(edit((doc) => movePoint(doc, 'displacement', 1, lengthM / 3 + step * 1e-4, 0.002 + step * 1e-5)))).toEqual({ ok: true });
    }
    expect(point(server, 1).toJSON()).toEqual(point(person, 1).toJSON());
    // Built on the last drag: refused only if the gate did not know the drags (it would be pending).
    expect(send(edit((doc) => patchDoc(doc).damping.set('b1PerS', 1.25)))).toEqual({ ok: true });
    expect(patchDoc(server).damping.get('b1PerS')).toBe(1.25);
    // A bad edit after drags is still refused, and the document keeps reading as a valid patch.
    const refused = send(edit((doc) => point(doc, 1).set('x', 'far')));
    expect(refused.ok).toBe(false);
    expect(validatedPatchFromDoc(server).ok).toBe(true);
  });

  // Each of these has a drag's shape but is not one: the gate must not take it for a drag.
  const impostors: Array<[string, (doc: Y.Doc) => void]> = [
    ['x set to a string', (doc) => point(doc, 1).set('x', 'far')],
    ['y set to null', (doc) => point(doc, 1).set('y', null)],
    ['x set to infinity', (doc) => point(doc, 1).set('x', Infinity)],
    ['x deleted', (doc) => point(doc, 1).delete('x')],
    ['y set to NaN', (doc) => point(doc, 0).set('y', Number.NaN)],
    ['a new key on a point', (doc) => point(doc, 1).set('z', 1)],
  ];
  it.each(impostors)('refuses %s after drags, leaving the document valid', (_what, change) => {
    const { server, edit, send, lengthM } = setUp();
    expect(send(edit((doc) => movePoint(doc, 'displacement', 0, lengthM / 4, 0.003)))).toEqual({ ok: true });
    const verdict = send(edit(change));
    expect(verdict.ok).toBe(false);
    expect(validatedPatchFromDoc(server).ok).toBe(true);
  });

  it('refuses a drag that builds on an edit the server never received', () => {
    const { server, edit, send, lengthM } = setUp();
    edit((doc) => movePoint(doc, 'displacement', 0, lengthM / 4, 0.003)); // never sent
    const verdict = send(edit((doc) => movePoint(doc, 'displacement', 0, lengthM / 5, 0.004)));
    expect(verdict).toMatchObject({ ok: false, reason: expect.stringContaining('never received') });
    expect(server.store.pendingStructs).toBeNull();
    expect(point(server, 0).get('x')).toBe(lengthM / 3);
  });

  it('admits two people dragging the same point at once, and both end on the same value', () => {
    const { server, person, send, lengthM } = setUp();
    const other = new Y.Doc();
    Y.applyUpdate(other, Y.encodeStateAsUpdate(server));
    const changeOf = (doc: Y.Doc, change: () => void) => {
      const before = Y.encodeStateVector(doc);
      change();
      return Y.encodeStateAsUpdate(doc, before);
    };
    const mine = changeOf(person, () => movePoint(person, 'displacement', 0, lengthM / 4, 0.003));
    const theirs = changeOf(other, () => movePoint(other, 'displacement', 0, lengthM / 5, 0.004));
    expect(send(mine)).toEqual({ ok: true });
    expect(send(theirs)).toEqual({ ok: true });
    Y.applyUpdate(person, theirs);
    Y.applyUpdate(other, mine);
    expect(point(server, 0).toJSON()).toEqual(point(person, 0).toJSON());
    expect(point(server, 0).toJSON()).toEqual(point(other, 0).toJSON());
    expect(validatedPatchFromDoc(server).ok).toBe(true);
  });
});
