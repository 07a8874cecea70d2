import { useState } from 'react';
import { addExcitationPart, setExcitationParts } from '../../../../shared/collab/excitation-part-edits';
import { pluckContacts, type ExcitationPart, type PluckContact } from '../../../../shared/patch/excitation-part';
import type { Patch } from '../../../../shared/patch/patch-schema';
import { Button } from '../../../components/button';
import { COMPACT_CONTROL_CLASS } from '../../../components/compact-control';
import type { SessionConnection } from '../../../lib/live-session/session-connection';
import { NumberField } from './number-field';
import { ConvertToFreePoints } from './part-fields';

const CONTACT_WORDS = { fingertip: 'Fingertip', pick: 'Pick' } as const;

/**
 * Lays down a pluck or a strike as a handle on the canvas: "Lay down pluck" replaces the plucks
 * (a strike stays), "Add pluck" and "Add strike" add one to what is there (a double pluck, a pluck
 * plus a strike). The numbers are the new part's; once laid down it is moved on the canvas.
 */
export function PluckTool({ connection, patch, readOnly }: { connection: SessionConnection; patch: Patch; readOnly: boolean }) {
  const lengthMm = patch.string.lengthM * 1000;
  const [positionMm, setPositionMm] = useState(() => Math.round(lengthMm * 0.25));
  const [heightMm, setHeightMm] = useState(3);
  const [widthMm, setWidthMm] = useState(12);
  const [contact, setContact] = useState<PluckContact>('fingertip');
  const [velocityMPerS, setVelocityMPerS] = useState(0.5);
  const [problem, setProblem] = useState<string | null>(null);
  const pluck = (): ExcitationPart => ({ kind: 'pluck', positionM: positionMm / 1000, heightM: heightMm / 1000, widthM: widthMm / 1000, contact });
  const run = (change: Parameters<SessionConnection['edit']>[0]) => {
    setProblem(null);
    connection.edit(change);
  };
  const refused = (result: { ok: true } | { ok: false; reason: string }) => {
    if (!result.ok) setProblem(`${result.reason[0].toUpperCase()}${result.reason.slice(1)}.`);
  };
  const keep = (setter: (value: number) => void) => (value: number) => {
    setter(value);
    return null;
  };
  const strikes = (patch.excitation.parts ?? []).filter((part) => part.kind === 'strike');
  return (
    <section aria-label="Pluck tool" className="rounded-lg border border-slate-700/15 p-3 dark:border-slate-300/10">
      <h2 className="mb-2 text-sm font-semibold">Pluck and strike</h2>
      <div className="flex flex-wrap items-end gap-3">
        <NumberField label="Position" unit="mm" value={positionMm} disabled={readOnly} onCommit={keep(setPositionMm)} />
        <NumberField label="Height" unit="mm" value={heightMm} disabled={readOnly} onCommit={keep(setHeightMm)} />
        <NumberField label="Contact width" unit="mm" value={widthMm} disabled={readOnly} hint="A finger is about 10–15 mm, a pick 1–3 mm" onCommit={keep(setWidthMm)} />
        <label className="flex flex-col gap-0.5 text-xs font-semibold">
          Contact
          <select value={contact} disabled={readOnly} className={COMPACT_CONTROL_CLASS} onChange={(event) => setContact(event.target.value as PluckContact)}>
            {pluckContacts.map((value) => (
              <option key={value} value={value}>
                {CONTACT_WORDS[value]}
              </option>
            ))}
          </select>
        </label>
        <Button onClick={() => run((doc, origin) => refused(setExcitationParts(doc, [pluck(), ...strikes], origin)))} disabledReason={readOnly ? 'read-only' : undefined}>
          Lay down pluck
        </Button>
        <Button variant="secondary" onClick={() => run((doc, origin) => refused(addExcitationPart(doc, pluck(), origin)))} disabledReason={readOnly ? 'read-only' : undefined}>
          Add pluck
        </Button>
        <NumberField label="Strike velocity" unit="m/s" value={velocityMPerS} disabled={readOnly} onCommit={keep(setVelocityMPerS)} />
        <Button
          variant="secondary"
          onClick={() => run((doc, origin) => refused(addExcitationPart(doc, { kind: 'strike', positionM: positionMm / 1000, velocityMPerS, widthM: widthMm / 1000 }, origin)))}
          disabledReason={readOnly ? 'read-only' : undefined}
        >
          Add strike
        </Button>
        {(patch.excitation.parts?.length ?? 0) > 0 && <ConvertToFreePoints connection={connection} readOnly={readOnly} />}
      </div>
      {problem && (
        <p role="alert" className="mt-2 text-sm text-ember-600 dark:text-ember-400">
          {problem}
        </p>
      )}
    </section>
  );
}
