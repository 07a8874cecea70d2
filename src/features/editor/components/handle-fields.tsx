import { allowedRangeM, deletePoint, movePoint } from '../../../../shared/collab/point-edits';
import type { Patch } from '../../../../shared/patch/patch-schema';
import { Button } from '../../../components/button';
import type { CanvasSelection } from '../geometry/canvas-selection';
import { NumberField } from './number-field';
import { commitPatchNumbers, type SessionEdits } from './commit-patch-number';
import { ConvertToFreePoints, PartFields } from './part-fields';
import { partOrdinal, partsMakeLayer } from '../../../../shared/patch/excitation-part';

const LAYER_WORDS = { displacement: 'shape', velocity: 'strike layer' } as const;

/**
 * The selected handle as typed numbers: a point's position and value, or the pickup's position.
 * A position outside the room between the neighbours is refused with the range, never clamped
 * silently.
 */
export function HandleFields({ connection, patch, selection, readOnly, onDeleted }: { connection: SessionEdits; patch: Patch; selection: CanvasSelection | null; readOnly: boolean; onDeleted: () => void }) {
  const frame = 'flex flex-wrap items-end gap-3 rounded-lg border border-slate-700/15 p-3 dark:border-slate-300/10';
  if (!selection) {
    return (
      <section aria-label="Selected handle" className={frame}>
        <p className="text-sm text-slate-600 dark:text-slate-300">Select a pluck, a point or the pickup on the string (or press ] and [ with the canvas focused) to type its numbers.</p>
      </section>
    );
  }
  if (selection.layer === 'pickup') {
    return (
      <section aria-label="Selected handle" className={frame}>
        <h2 className="self-center text-sm font-semibold">Pickup</h2>
        <NumberField
          label="Position"
          unit="mm"
          value={patch.pickup.positionM * 1000}
          disabled={readOnly}
          onCommit={(mm) => commitPatchNumbers(connection, { 'pickup.positionM': mm / 1000 })}
        />
      </section>
    );
  }
  if (selection.layer === 'part') {
    const part = patch.excitation.parts?.[selection.index];
    if (!part) return null;
    return (
      <section aria-label="Selected handle" className={frame}>
        <PartFields connection={connection} part={part} index={selection.index} ordinal={partOrdinal(patch.excitation.parts ?? [], selection.index)} readOnly={readOnly} onRemoved={onDeleted} />
      </section>
    );
  }
  const { layer, index } = selection;
  if (partsMakeLayer(patch.excitation.parts, layer)) {
    return (
      <section aria-label="Selected handle" className={frame}>
        <p className="self-center text-sm">
          The {LAYER_WORDS[layer]} is made by {layer === 'displacement' ? 'a pluck' : 'a strike'}: drag its handle, or convert it to free points to edit it point by point.
        </p>
        <ConvertToFreePoints connection={connection} readOnly={readOnly} />
      </section>
    );
  }
  const points = layer === 'displacement' ? patch.excitation.displacementM : patch.excitation.velocityMPerS;
  const point = points?.[index + 1];
  if (!points || !point || index + 1 >= points.length - 1) return null;
  const [xM, value] = point;
  const setX = (mm: number) => {
    let problem: string | null = null;
    connection.edit((doc, origin) => {
      const { minM, maxM } = allowedRangeM(doc, layer, index);
      if (!(mm / 1000 >= minM && mm / 1000 <= maxM)) problem = `Position must lie between its neighbours (${(minM * 1000).toFixed(2)} to ${(maxM * 1000).toFixed(2)} mm)`;
      else movePoint(doc, layer, index, mm / 1000, value, origin);
    });
    return problem;
  };
  const setValue = (typed: number) => {
    const next = layer === 'displacement' ? typed / 1000 : typed;
    const result = { reason: null as string | null };
    connection.edit((doc, origin) => {
      const moved = movePoint(doc, layer, index, xM, next, origin);
      if (!moved.ok) result.reason = moved.reason;
    });
    return result.reason;
  };
  return (
    <section aria-label="Selected handle" className={frame}>
      <h2 className="self-center text-sm font-semibold">
        Point {index + 1} of the {LAYER_WORDS[layer]}
      </h2>
      <NumberField label="Position" unit="mm" value={xM * 1000} disabled={readOnly} onCommit={setX} />
      {layer === 'displacement' ? (
        <NumberField label="Displacement" unit="mm" value={value * 1000} disabled={readOnly} onCommit={setValue} />
      ) : (
        <NumberField label="Velocity" unit="m/s" value={value} disabled={readOnly} onCommit={setValue} />
      )}
      <Button
        variant="secondary"
        disabledReason={readOnly ? 'read-only' : undefined}
        onClick={() => {
          connection.edit((doc, origin) => void deletePoint(doc, layer, index, origin));
          onDeleted();
        }}
      >
        Remove point
      </Button>
    </section>
  );
}
