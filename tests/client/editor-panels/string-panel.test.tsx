// @vitest-environment happy-dom
import { act, cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { useEffect, useState } from 'react';
import * as Y from 'yjs';
import { afterEach, describe, expect, it } from 'vitest';
import { patchDoc, validatedPatchFromDoc, writePatchToDoc } from '../../../shared/collab/patch-doc';
import { inharmonicityFromMaterial } from '../../../shared/designer/inharmonicity';
import { linearDensityFromMaterial } from '../../../shared/designer/linear-density';
import { MATERIALS } from '../../../shared/designer/materials';
import { midiToFrequencyHz } from '../../../shared/designer/pitch';
import { tensionForStiffPitchN } from '../../../shared/designer/tension-for-pitch';
import { modeFrequencyHz } from '../../../shared/engine/mode-frequencies';
import type { Patch } from '../../../shared/patch/patch-schema';
import type { SessionEdits } from '../../../src/features/editor/components/commit-patch-number';
import { StringPanel } from '../../../src/features/editor/components/string-panel';
import { testPatch, validPatch } from '../../support/patches';

afterEach(cleanup);

/** A real Y.Doc with the test patch (no design record), edited as SessionConnection.edit does; the panel re-reads the document after each update. */
function livePanel() {
  const doc = new Y.Doc();
  writePatchToDoc(doc, validPatch(testPatch()));
  const origin = Symbol('person');
  let updates = 0;
  doc.on('update', () => updates++);
  const read = (): Patch => {
    const result = validatedPatchFromDoc(doc);
    if (!result.ok) throw new Error(result.issues[0].message);
    return result.value;
  };
  const connection: SessionEdits = {
    edit: (change) => {
      doc.transact(() => change(doc, origin), origin);
      return true;
    },
  };
  function Live() {
    const [patch, setPatch] = useState(read);
    useEffect(() => {
      const refresh = () => setPatch(read());
      doc.on('update', refresh);
      return () => doc.off('update', refresh);
    }, []);
    return <StringPanel connection={connection} patch={patch} readOnly={false} />;
  }
  render(<Live />);
  return { doc, read, updates: () => updates };
}

const panel = () => within(screen.getByRole('region', { name: 'String' }));

function typeInto(label: string, text: string): void {
  const field = panel().getByLabelText(label);
  act(() => {
    fireEvent.focus(field);
    fireEvent.change(field, { target: { value: text } });
    fireEvent.blur(field);
  });
}

const relative = (actual: number, expected: number) => Math.abs(actual - expected) / expected;

describe('string panel in the trade’s words', () => {
  it('nylon, 1.02 mm, G3, 650 mm: writes μ, T and B within 0.1 % of the helpers, each entry one update (T, μ, B and the record together), and keeps the design record', () => {
    const live = livePanel();
    act(() => {
      fireEvent.change(panel().getByLabelText('Material'), { target: { value: 'nylon' } });
    });
    expect(live.updates()).toBe(1);
    typeInto('Gauge', '1.02 mm');
    expect(live.updates()).toBe(2);
    typeInto('Note', 'G3');
    expect(live.updates()).toBe(3);
    typeInto('Scale length', '650');
    expect(live.updates()).toBe(4);
    expect(screen.queryAllByRole('alert')).toEqual([]);
    const { string } = live.read();
    const nylon = MATERIALS.nylon;
    const g3 = midiToFrequencyHz(55);
    const mu = linearDensityFromMaterial(nylon.densityKgPerM3, 1.02e-3);
    const tension = tensionForStiffPitchN(0.65, mu, g3, nylon.youngsModulusPa, 1.02e-3);
    const b = inharmonicityFromMaterial(nylon.youngsModulusPa, 1.02e-3, tension, 0.65);
    expect(relative(string.linearDensityKgPerM, mu)).toBeLessThan(1e-3);
    expect(relative(string.tensionN, tension)).toBeLessThan(1e-3);
    expect(relative(string.inharmonicityB, b)).toBeLessThan(1e-3);
    expect(relative(modeFrequencyHz(string, 1), g3)).toBeLessThan(1e-9);
    expect(patchDoc(live.doc).extras.get('design')).toMatchObject({ material: 'nylon', diameterM: 1.02e-3, targetNote: 'G3' });
    expect(panel().getByLabelText('Note')).toHaveProperty('value', 'G3');
    // The factory preset kelp-line-nylon was designed the same way: 60.47 N, B = 9.237·10⁻⁵.
    expect(string.tensionN).toBeCloseTo(60.4705, 3);
  });

  it('reads "E2", "40" and "82.41 Hz" as the same note, and keeps B consistent as the tension moves (B ∝ 1/T)', () => {
    const live = livePanel();
    for (const text of ['E2', '40', '82.41 Hz']) {
      typeInto('Note', text);
      expect(screen.queryAllByRole('alert')).toEqual([]);
      expect(modeFrequencyHz(live.read().string, 1)).toBeCloseTo(text === '82.41 Hz' ? 82.41 : 82.4069, 3);
    }
    typeInto('Gauge', '.018 in');
    const before = live.read().string;
    typeInto('Tension', String(before.tensionN * 1.5));
    const after = live.read().string;
    expect(after.tensionN).toBeCloseTo(before.tensionN * 1.5, 9);
    expect(after.inharmonicityB).toBeCloseTo(before.inharmonicityB / 1.5, 15);
    expect(relative(after.inharmonicityB, inharmonicityFromMaterial(203e9, 0.018 * 0.0254, after.tensionN, 0.65))).toBeLessThan(1e-9);
  });

  it('keeps the note when the scale length changes: T and B follow', () => {
    const live = livePanel();
    typeInto('Gauge', '0.33 mm');
    const f1 = modeFrequencyHz(live.read().string, 1);
    typeInto('Scale length', '500');
    const after = live.read().string;
    expect(after.lengthM).toBeCloseTo(0.5, 12);
    expect(modeFrequencyHz(after, 1)).toBeCloseTo(f1, 6);
    expect(relative(after.inharmonicityB, inharmonicityFromMaterial(203e9, 0.33e-3, after.tensionN, 0.5))).toBeLessThan(1e-9);
  });

  it('shows the tension caution for a session without a design record, saying what it assumed', () => {
    livePanel();
    const caution = panel().getByText(/Figured on/);
    expect(caution.textContent).toMatch(/assumed steel music wire of [\d.]+ mm/);
    expect(caution.textContent).toMatch(/string maker's rating and local practice/);
  });

  it('refuses a gauge or note it cannot read: one message beside the field, nothing written', () => {
    const live = livePanel();
    const before = JSON.stringify(live.doc.toJSON());
    typeInto('Gauge', 'thick');
    expect(screen.getAllByRole('alert').map((alert) => alert.textContent)).toEqual(['Gauge "thick" is not a diameter: write it like 0.46 mm, .018 in or 0.018"']);
    typeInto('Note', 'H2');
    expect(screen.getAllByRole('alert').map((alert) => alert.textContent)).toContain('Pitch "H2" is not a note, MIDI number or frequency: write it like E2, 40 or 82.41 Hz');
    expect(live.updates()).toBe(0);
    expect(JSON.stringify(live.doc.toJSON())).toBe(before);
  });

  it('refuses a note the sample rate cannot hold, in plain words, nothing written', () => {
    const live = livePanel();
    typeInto('Note', '30000 Hz');
    const [message] = screen.getAllByRole('alert').map((alert) => alert.textContent);
    expect(message).toMatch(/^The fundamental would be [\d.]+ Hz, at or above half the sample rate \(24000 Hz\): no mode could sound$/);
    expect(live.updates()).toBe(0);
  });
});
