import { useState } from 'react';
import { replaceLayerPoints } from '../../../../shared/collab/point-edits';
import type { Patch } from '../../../../shared/patch/patch-schema';
import { Button } from '../../../components/button';
import type { SessionConnection } from '../../../lib/live-session/session-connection';
import { pluckShape } from '../geometry/pluck-shape';
import { NumberField } from './number-field';

/** Lays down a pluck of a given position, height and contact width, replacing the displacement. */
export function PluckTool({ connection, patch, readOnly }: { connection: SessionConnection; patch: Patch; readOnly: boolean }) {
  const lengthMm = patch.string.lengthM * 1000;
  const [positionMm, setPositionMm] = useState(() => Math.round(lengthMm * 0.25));
  const [heightMm, setHeightMm] = useState(3);
  const [widthMm, setWidthMm] = useState(12);
  const [problem, setProblem] = useState<string | null>(null);
  const apply = () => {
    const shape = pluckShape({ lengthM: patch.string.lengthM, positionM: positionMm / 1000, heightM: heightMm / 1000, widthM: widthMm / 1000 });
    if (!shape.ok) return setProblem(shape.reason);
    setProblem(null);
    connection.edit((doc, origin) => {
      const replaced = replaceLayerPoints(doc, 'displacement', shape.points, origin);
      if (!replaced.ok) setProblem(replaced.reason);
    });
  };
  const keep = (setter: (value: number) => void) => (value: number) => {
    setter(value);
    return null;
  };
  return (
    <section aria-label="Pluck tool" className="rounded-lg border border-slate-700/15 p-3 dark:border-slate-300/10">
      <h2 className="mb-2 text-sm font-semibold">Pluck tool</h2>
      <div className="flex flex-wrap items-end gap-3">
        <NumberField label="Position" unit="mm" value={positionMm} disabled={readOnly} onCommit={keep(setPositionMm)} />
        <NumberField label="Height" unit="mm" value={heightMm} disabled={readOnly} onCommit={keep(setHeightMm)} />
        <NumberField label="Contact width" unit="mm" value={widthMm} disabled={readOnly} hint="A finger is about 10–15 mm, a pick 1–3 mm" onCommit={keep(setWidthMm)} />
        <Button onClick={apply} disabledReason={readOnly ? 'read-only' : undefined}>
          Lay down pluck
        </Button>
      </div>
      {problem && (
        <p role="alert" className="mt-2 text-sm text-ember-600 dark:text-ember-400">
          {problem}
        </p>
      )}
    </section>
  );
}
