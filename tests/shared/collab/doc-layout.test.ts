import * as Y from 'yjs';
import { describe, expect, it } from 'vitest';
import { DOC_LAYOUT, SECTIONLESS_PARTS, docLayoutGaps, docSharedTypes, type DocPart } from '../../../shared/collab/doc-layout';
import { docExcitationPart, docPoint, patchDoc, patchFromDoc, writePatchToDoc } from '../../../shared/collab/patch-doc';
import { patchSchema } from '../../../shared/patch/patch-schema';
import { pluckedAndStruck, testPatch, validPatch } from '../../support/patches';

const sections = Object.keys(patchSchema.shape);
const partNames = Object.keys(DOC_LAYOUT);

describe('the shared document has one layout', () => {
  it('gives every patch section a document part, and every part a section (extras the one named exception)', () => {
    expect(docLayoutGaps(sections)).toEqual([]);
    expect([...SECTIONLESS_PARTS]).toEqual(['extras']);
    expect(DOC_LAYOUT.meta.section).toBe('name');
  });

  it('names a section the layout forgot, a part with no section and a part holding no real section', () => {
    expect(docLayoutGaps([...sections, 'tuning'])).toEqual(['patch section tuning has no part in the document layout']);
    const layout: Record<string, DocPart> = { ...DOC_LAYOUT, stray: { kind: 'map', section: null, about: 'a test part' } };
    expect(docLayoutGaps(sections, layout)).toEqual(['document part stray holds no patch section']);
    const { render: _render, ...withoutRender } = DOC_LAYOUT;
    expect(docLayoutGaps(sections, withoutRender)).toEqual(['patch section render has no part in the document layout']);
  });

  it('writes a patch into exactly the layout\'s parts, each of its kind, and gives the undo manager all of them', () => {
    const doc = new Y.Doc();
    writePatchToDoc(doc, { ...validPatch(testPatch({ excitation: pluckedAndStruck() })), design: { material: 'nylon' } });
    expect([...doc.share.keys()].sort()).toEqual([...partNames].sort());
    const types = docSharedTypes(doc);
    expect(types).toHaveLength(partNames.length);
    partNames.forEach((name, index) => {
      expect(types[index]).toBe(doc.share.get(name));
      expect(types[index]).toBeInstanceOf(DOC_LAYOUT[name as keyof typeof DOC_LAYOUT].kind === 'map' ? Y.Map : Y.Array);
    });
  });

  // Edits with the tracked origin in each part of the layout; undo must take every one back.
  const edits: Record<keyof typeof DOC_LAYOUT, (doc: Y.Doc) => void> = {
    meta: (doc) => patchDoc(doc).meta.set('name', 'Renamed'),
    string: (doc) => patchDoc(doc).string.set('tensionN', 80),
    damping: (doc) => patchDoc(doc).damping.set('b1PerS', 0.9),
    pickup: (doc) => patchDoc(doc).pickup.set('output', 'velocity'),
    render: (doc) => patchDoc(doc).render.set('durationS', 2),
    displacement: (doc) => patchDoc(doc).displacement.push([docPoint(0.5, 0.001)]),
    velocity: (doc) => patchDoc(doc).velocity.push([docPoint(0.6, 0.2)]),
    extras: (doc) => patchDoc(doc).extras.set('design', { material: 'steel' }),
    excitationParts: (doc) => patchDoc(doc).excitationParts.push([docExcitationPart({ kind: 'pluck', positionM: 0.17, heightM: 0.003, widthM: 0.04, contact: 'fingertip' })]),
  };

  it.each(partNames)('undoes a person\'s edit of the %s part', (name) => {
    const doc = new Y.Doc();
    writePatchToDoc(doc, { ...validPatch(testPatch({ excitation: pluckedAndStruck() })), design: { material: 'nylon' } });
    const before = patchFromDoc(doc);
    const origin = Symbol('person');
    const undo = new Y.UndoManager(docSharedTypes(doc), { trackedOrigins: new Set([origin]) });
    doc.transact(() => edits[name as keyof typeof DOC_LAYOUT](doc), origin);
    expect(patchFromDoc(doc)).not.toEqual(before);
    undo.undo();
    expect(patchFromDoc(doc)).toEqual(before);
    undo.destroy();
  });
});
