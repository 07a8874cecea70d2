import { convertToFreePoints, removeExcitationPart, updateExcitationPart, type PartChanges } from '../../../../shared/collab/excitation-part-edits';
import { pluckContacts, type ExcitationPart } from '../../../../shared/patch/excitation-part';
import { Button } from '../../../components/button';
import { COMPACT_CONTROL_CLASS } from '../../../components/compact-control';
import { NumberField } from './number-field';
import type { SessionEdits } from './commit-patch-number';

const CONTACT_WORDS = { fingertip: 'Fingertip (rounded top)', pick: 'Pick (flat edge)' } as const;

/** Runs one part edit as this person's undoable change; the refusal's reason, or null. */
function editPart(connection: SessionEdits, index: number, changes: PartChanges): string | null {
  const outcome: { reason: string | null } = { reason: null };
  connection.edit((doc, origin) => {
    const result = updateExcitationPart(doc, index, changes, origin);
    if (!result.ok) outcome.reason = result.reason;
  });
  return outcome.reason;
}

/** The button that keeps the shape exactly and forgets the plucks and strikes, so its points can be edited one by one. */
export function ConvertToFreePoints({ connection, readOnly }: { connection: SessionEdits; readOnly: boolean }) {
  return (
    <Button variant="secondary" disabledReason={readOnly ? 'read-only' : undefined} onClick={() => connection.edit((doc, origin) => void convertToFreePoints(doc, origin))}>
      Convert to free points
    </Button>
  );
}

/**
 * The selected pluck or strike as typed numbers: position, height (or velocity), contact width and,
 * for a pluck, what touches the string. A value outside the string is held at the nearest one that fits.
 */
export function PartFields({ connection, part, index, ordinal, readOnly, onRemoved }: { connection: SessionEdits; part: ExcitationPart; index: number; ordinal: number; readOnly: boolean; onRemoved: () => void }) {
  return (
    <>
      <h2 className="w-full text-sm font-semibold">
        {part.kind === 'pluck' ? 'Pluck' : 'Strike'} {ordinal}
      </h2>
      <NumberField label="Position" unit="mm" value={part.positionM * 1000} digits={4} disabled={readOnly} onCommit={(mm) => editPart(connection, index, { positionM: mm / 1000 })} />
      {part.kind === 'pluck' ? (
        <NumberField label="Height" unit="mm" value={part.heightM * 1000} digits={3} disabled={readOnly} onCommit={(mm) => editPart(connection, index, { heightM: mm / 1000 })} />
      ) : (
        <NumberField label="Velocity" unit="m/s" value={part.velocityMPerS} digits={3} disabled={readOnly} onCommit={(mPerS) => editPart(connection, index, { velocityMPerS: mPerS })} />
      )}
      <NumberField label={part.kind === 'pluck' ? 'Contact width' : 'Hammer width'} unit="mm" value={part.widthM * 1000} digits={3} disabled={readOnly} onCommit={(mm) => editPart(connection, index, { widthM: mm / 1000 })} />
      {part.kind === 'pluck' && (
        <label className="flex flex-col gap-0.5 text-xs font-semibold">
          Contact
          <select value={part.contact} disabled={readOnly} className={COMPACT_CONTROL_CLASS} onChange={(event) => void editPart(connection, index, { contact: event.target.value })}>
            {pluckContacts.map((contact) => (
              <option key={contact} value={contact}>
                {CONTACT_WORDS[contact]}
              </option>
            ))}
          </select>
        </label>
      )}
      <Button
        variant="secondary"
        disabledReason={readOnly ? 'read-only' : undefined}
        onClick={() => {
          connection.edit((doc, origin) => void removeExcitationPart(doc, index, origin));
          onRemoved();
        }}
      >
        Remove {part.kind}
      </Button>
      <ConvertToFreePoints connection={connection} readOnly={readOnly} />
    </>
  );
}
