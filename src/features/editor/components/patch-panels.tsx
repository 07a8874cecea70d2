import type { Patch, PickupOutput } from '../../../../shared/patch/patch-schema';
import { setPickupOutput } from '../../../../shared/collab/pickup-output-edit';
import type { PatchNumberField } from '../../../../shared/patch/field-rules';
import { dampingFromT60, t60AtFrequency } from '../../../../shared/designer/damping-from-t60';
import { plainIssueMessage } from '../../../../shared/patch/plain-messages';
import { fundamentalFrequencyHz } from '../../../../shared/engine/mode-frequencies';
import { LIMITS } from '../../../../shared/limits';
import { NumberField } from './number-field';
import type { SessionEdits } from './commit-patch-number';
import { commitPlainNumbers } from './plain-commit';

export { StringPanel } from './string-panel';
import { COMPACT_CONTROL_CLASS } from '../../../components/compact-control';

interface PanelProps {
  connection: SessionEdits;
  patch: Patch;
  readOnly: boolean;
}

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section aria-label={title} className="rounded-lg border border-slate-700/15 p-3 dark:border-slate-300/10">
      <h2 className="mb-2 text-sm font-semibold">{title}</h2>
      <div className="flex flex-wrap gap-3">{children}</div>
    </section>
  );
}

/** Losses: two decay-time targets (what designers think in), with the b1 and b2 they give for the expert. */
export function LossesPanel({ connection, patch, readOnly }: PanelProps) {
  const f0 = fundamentalFrequencyHz(patch.string);
  const high = Math.min(4000, patch.render.sampleRateHz / 4);
  const lowT60 = t60AtFrequency(patch.damping, patch.string, f0) ?? Infinity;
  const highT60 = t60AtFrequency(patch.damping, patch.string, high) ?? Infinity;
  const apply = (lowT60S: number, highT60S: number) => {
    const result = dampingFromT60({ lowFrequencyHz: f0, lowT60S, highFrequencyHz: high, highT60S }, patch.string);
    if (!result.ok) return plainIssueMessage(result.issues[0], { lowFrequencyHz: f0, highFrequencyHz: high });
    return commitPlainNumbers(connection, patch, { 'damping.b1PerS': result.value.b1PerS, 'damping.b2M2PerS': result.value.b2M2PerS });
  };
  return (
    <Section title="Losses">
      <NumberField label={`Decay time at f0 (${f0.toFixed(0)} Hz)`} unit="s" value={lowT60} digits={3} disabled={readOnly} onCommit={(t) => apply(t, Math.min(t, highT60))} />
      <NumberField label={`Decay time at ${high} Hz`} unit="s" value={highT60} digits={3} disabled={readOnly} onCommit={(t) => apply(lowT60, t)} />
      <p className="w-full text-xs text-slate-600 dark:text-slate-300">
        b1 = {patch.damping.b1PerS.toPrecision(4)} s⁻¹ · b2 = {patch.damping.b2M2PerS.toPrecision(4)} m²/s (two-coefficient loss model)
      </p>
    </Section>
  );
}

/** The pickup: where it reads, and what. */
export function PickupPanel({ connection, patch, readOnly }: PanelProps) {
  return (
    <Section title="Pickup">
      <NumberField
        label="Position"
        unit="mm"
        value={patch.pickup.positionM * 1000}
        disabled={readOnly}
        onCommit={(mm) => commitPlainNumbers(connection, patch, { 'pickup.positionM': mm / 1000 })}
      />
      <label className="flex flex-col gap-0.5 text-xs font-semibold">
        Reads
        <select
          value={patch.pickup.output}
          disabled={readOnly}
          onChange={(event) => connection.edit((doc, origin) => void setPickupOutput(doc, event.target.value as PickupOutput, origin))}
          className={`${COMPACT_CONTROL_CLASS} text-sm font-normal`}
        >
          <option value="displacement">displacement</option>
          <option value="velocity">velocity</option>
          <option value="force">force on the support</option>
        </select>
      </label>
    </Section>
  );
}

/** Render settings of the patch (the live preview is at most 4 s at 48 kHz). */
export function RenderPanel({ connection, patch, readOnly }: PanelProps) {
  const commit = (field: PatchNumberField, value: number) => commitPlainNumbers(connection, patch, { [field]: value });
  return (
    <Section title="Render">
      <NumberField label="Duration" unit="s" value={patch.render.durationS} disabled={readOnly} onCommit={(s) => commit('render.durationS', s)} />
      <label className="flex flex-col gap-0.5 text-xs font-semibold">
        Sample rate
        <select
          value={patch.render.sampleRateHz}
          disabled={readOnly}
          onChange={(event) => commit('render.sampleRateHz', Number(event.target.value))}
          className={`${COMPACT_CONTROL_CLASS} text-sm font-normal`}
        >
          {LIMITS.sampleRatesHz.map((rate) => (
            <option key={rate} value={rate}>
              {rate / 1000} kHz
            </option>
          ))}
        </select>
      </label>
      <NumberField label="Most modes" unit="" value={patch.render.maxModes} disabled={readOnly} onCommit={(n) => commit('render.maxModes', n)} />
    </Section>
  );
}
