// @vitest-environment happy-dom
import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import * as Y from 'yjs';
import { afterEach, describe, expect, it } from 'vitest';
import { patchDoc, validatedPatchFromDoc, writePatchToDoc } from '../../../shared/collab/patch-doc';
import { FIELD_LABELS } from '../../../shared/patch/field-labels';
import { fieldRule } from '../../../shared/patch/field-rules';
import { plainFieldMessage } from '../../../shared/patch/plain-messages';
import type { Patch } from '../../../shared/patch/patch-schema';
import type { SessionEdits } from '../../../src/features/editor/components/commit-patch-number';
import { HandleFields } from '../../../src/features/editor/components/handle-fields';
import { PickupPanel, RenderPanel, StringPanel } from '../../../src/features/editor/components/patch-panels';
import { testPatch, validPatch } from '../../support/patches';

afterEach(cleanup);

/**
 * A real Y.Doc holding the test patch, edited the way SessionConnection.edit does it (one
 * transaction with this person's origin); `updates` counts what reached the document.
 */
function liveDocument(): { doc: Y.Doc; patch: Patch; connection: SessionEdits; updates: () => number } {
  const doc = new Y.Doc();
  writePatchToDoc(doc, validPatch(testPatch()));
  const origin = Symbol('person');
  let updates = 0;
  doc.on('update', () => updates++);
  const read = validatedPatchFromDoc(doc);
  if (!read.ok) throw new Error(read.issues[0].message);
  const connection: SessionEdits = {
    edit: (change) => {
      doc.transact(() => change(doc, origin), origin);
      return true;
    },
  };
  return { doc, patch: read.value, connection, updates: () => updates };
}

function typeInto(section: string, label: string, text: string): void {
  const field = within(screen.getByRole('region', { name: section })).getByLabelText(label);
  fireEvent.focus(field);
  fireEvent.change(field, { target: { value: text } });
  fireEvent.blur(field);
}

describe('editor panels validate typed numbers with the patch schema', () => {
  it.each([
    ['Render', 'Duration', '61', 'render.durationS', 61],
    ['Render', 'Most modes', '2.5', 'render.maxModes', 2.5],
    ['String', 'Stiffness B', '2', 'string.inharmonicityB', 2],
    ['String', 'Tension', '-5', 'string.tensionN', -5],
    ['String', 'Scale length', '0', 'string.lengthM', 0],
  ] as const)('%s › %s: typing %s shows the schema\'s bound in plain words, once, and writes nothing', (section, label, text, field, value) => {
    const live = liveDocument();
    const before = JSON.stringify(live.doc.toJSON());
    render(
      <>
        <StringPanel connection={live.connection} patch={live.patch} readOnly={false} />
        <RenderPanel connection={live.connection} patch={live.patch} readOnly={false} />
      </>,
    );
    typeInto(section, label, text);
    expect(fieldRule(field).message(value)).not.toBeNull();
    const message = plainFieldMessage(field, value);
    expect(message).toMatch(new RegExp(`^${FIELD_LABELS[field].label} must be `));
    expect(screen.getAllByRole('alert').map((alert) => alert.textContent)).toEqual([message]);
    expect(live.updates()).toBe(0);
    expect(JSON.stringify(live.doc.toJSON())).toBe(before);
  });

  it('refuses a pickup past the string\'s end with the rule between fields, in the panel and the handle fields', () => {
    const live = liveDocument();
    render(
      <>
        <PickupPanel connection={live.connection} patch={live.patch} readOnly={false} />
        <HandleFields connection={live.connection} patch={live.patch} selection={{ layer: 'pickup' }} readOnly={false} onDeleted={() => undefined} />
      </>,
    );
    typeInto('Pickup', 'Position', '700');
    expect(screen.getByRole('alert').textContent).toBe('Pickup position must be inside the string, less than its length (650 mm)');
    typeInto('Selected handle', 'Position', '0');
    expect(screen.getAllByRole('alert').map((alert) => alert.textContent)).toContain('pickup.positionM must be > 0, got 0');
    expect(live.updates()).toBe(0);
    expect(patchDoc(live.doc).pickup.get('positionM')).toBe(0.1);
  });

  it('writes an accepted value as one update and shows no problem', () => {
    const live = liveDocument();
    render(<RenderPanel connection={live.connection} patch={live.patch} readOnly={false} />);
    typeInto('Render', 'Duration', '2.5');
    expect(screen.queryByRole('alert')).toBeNull();
    expect(live.updates()).toBe(1);
    expect(patchDoc(live.doc).render.get('durationS')).toBe(2.5);
  });
});
