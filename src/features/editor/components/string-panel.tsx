import { readDesignRecord, sessionTensionSafety, diameterFromLinearDensityM, type DesignRecord } from '../../../../shared/designer/design-record';
import { formatGauge, parseGauge } from '../../../../shared/designer/gauge-text';
import { MATERIAL_CHOICES, MATERIALS, type MaterialId } from '../../../../shared/designer/materials';
import { centsBetween, frequencyHzToMidi, midiToFrequencyHz, midiToNoteName } from '../../../../shared/designer/pitch';
import { parsePitch } from '../../../../shared/designer/pitch-text';
import { DEFAULT_CORE_FRACTION, designString } from '../../../../shared/designer/string-design';
import { inharmonicityForTension, retunedByTension } from '../../../../shared/designer/stiffness-follows';
import { modeFrequencyHz } from '../../../../shared/engine/mode-frequencies';
import { plainNumber } from '../../../../shared/patch/field-labels';
import { plainFieldMessage } from '../../../../shared/patch/plain-messages';
import type { Patch } from '../../../../shared/patch/patch-schema';
import { Notice } from '../../../components/notice';
import { COMPACT_CONTROL_CLASS } from '../../../components/compact-control';
import type { SessionEdits } from './commit-patch-number';
import { TextEntry } from './text-entry';
import { NumberField } from './number-field';
import { commitPlainNumbers } from './plain-commit';

interface StringPanelProps {
  connection: SessionEdits;
  patch: Patch;
  readOnly: boolean;
}

/** The note a frequency is, or the frequency when it is off the equal-tempered notes by more than a cent. */
function pitchText(frequencyHz: number): string {
  const midi = Math.round(frequencyHzToMidi(frequencyHz));
  return Math.abs(centsBetween(midiToFrequencyHz(midi), frequencyHz)) < 1 ? midiToNoteName(midi) : `${frequencyHz.toFixed(2)} Hz`;
}

function pitchHint(frequencyHz: number): string {
  const midi = frequencyHzToMidi(frequencyHz);
  const cents = Math.round(centsBetween(midiToFrequencyHz(Math.round(midi)), frequencyHz));
  return `${frequencyHz.toFixed(2)} Hz · ${midiToNoteName(midi)}${cents === 0 ? '' : ` ${cents > 0 ? '+' : ''}${cents} cents`} · MIDI ${Math.round(midi)}`;
}

const safetyTone = { ok: 'info', unknown: 'caution', caution: 'caution', danger: 'error', beyond: 'error' } as const;

/**
 * The string in the trade's words: material, gauge (a wound string's core too), note and scale
 * length, from which μ, T and B are computed with the designer helpers and written together; the
 * expert numbers behind a disclosure, where B follows 1/T when the tension is typed. The tension
 * caution shows for every session, figured from the design record or, without one, from an
 * assumed steel string of the gauge that gives this μ.
 */
export function StringPanel({ connection, patch, readOnly }: StringPanelProps) {
  const design = readDesignRecord(patch);
  const { string } = patch;
  const firstPartialHz = modeFrequencyHz(string, 1);
  const materialId: MaterialId = design.material ?? 'music-wire';
  const material = MATERIALS[materialId];
  const gaugeM = design.diameterM ?? diameterFromLinearDensityM(string.linearDensityKgPerM, material.construction === 'wound' ? 'music-wire' : materialId);
  const coreM = design.core?.diameterM ?? gaugeM * DEFAULT_CORE_FRACTION;
  const caution = sessionTensionSafety(string, design);

  /** Recomputes μ, T and B from the design and writes them, with the record, as one edit. */
  const redesign = (change: { materialId?: MaterialId; diameterM?: number; coreDiameterM?: number; lengthM?: number; frequencyHz?: number }) => {
    const next = {
      materialId: change.materialId ?? materialId,
      diameterM: change.diameterM ?? gaugeM,
      lengthM: change.lengthM ?? string.lengthM,
      frequencyHz: change.frequencyHz ?? firstPartialHz,
    };
    const wound = MATERIALS[next.materialId].construction === 'wound';
    const coreDiameterM = wound ? (change.coreDiameterM ?? (design.core && change.diameterM === undefined ? design.core.diameterM : next.diameterM * DEFAULT_CORE_FRACTION)) : undefined;
    const result = designString({ ...next, coreDiameterM });
    if (!result.ok) return result.message;
    const { core, wrap } = result.value;
    const record: DesignRecord = { ...design, material: next.materialId, diameterM: next.diameterM, targetNote: pitchText(next.frequencyHz), targetFrequencyHz: next.frequencyHz };
    delete record.core;
    delete record.wrap;
    if (core && wrap) Object.assign(record, { core, wrap });
    return commitPlainNumbers(
      connection,
      patch,
      {
        ...(next.lengthM !== string.lengthM ? { 'string.lengthM': next.lengthM } : {}),
        'string.tensionN': result.value.tensionN,
        'string.linearDensityKgPerM': result.value.linearDensityKgPerM,
        'string.inharmonicityB': result.value.inharmonicityB,
      },
      record,
    );
  };

  const onNote = (text: string) => {
    const pitch = parsePitch(text);
    if (!pitch.ok) return pitch.message;
    const retuned = retunedByTension(string, pitch.frequencyHz);
    if (!retuned) return `This string is too stiff to sound ${pitchText(pitch.frequencyHz)} at this length: choose a higher note or a thinner gauge`;
    const record = { ...design, targetNote: pitchText(pitch.frequencyHz), targetFrequencyHz: pitch.frequencyHz };
    return commitPlainNumbers(connection, patch, { 'string.tensionN': retuned.tensionN, 'string.inharmonicityB': retuned.inharmonicityB }, record);
  };

  return (
    <section aria-label="String" className="rounded-lg border border-slate-700/15 p-3 dark:border-slate-300/10">
      <h2 className="mb-2 text-sm font-semibold">String</h2>
      <div className="flex flex-wrap gap-3">
        <label className="flex w-full min-w-0 flex-col gap-0.5 text-xs font-semibold">
          Material
          <select
            value={materialId}
            disabled={readOnly}
            title={material.source}
            onChange={(event) => redesign({ materialId: event.target.value as MaterialId })}
            className={`${COMPACT_CONTROL_CLASS} w-full min-w-0 max-w-full text-sm font-normal`}
          >
            {(MATERIAL_CHOICES.includes(materialId) ? MATERIAL_CHOICES : [...MATERIAL_CHOICES, materialId]).map((id) => (
              <option key={id} value={id}>
                {MATERIALS[id].label}
              </option>
            ))}
          </select>
        </label>
        <TextEntry
          widthClass="w-36"
          label="Gauge"
          value={formatGauge(gaugeM)}
          hint={design.diameterM ? 'mm or in: 0.46 mm, .018 in' : 'from the linear density; type a gauge'}
          disabled={readOnly}
          onCommit={(text) => {
            const gauge = parseGauge(text);
            return gauge.ok ? redesign({ diameterM: gauge.diameterM }) : gauge.message;
          }}
        />
        {material.construction === 'wound' && (
          <TextEntry
            widthClass="w-36"
            label="Core"
            value={formatGauge(coreM)}
            hint={design.core ? 'the steel core’s diameter' : 'assumed; type the maker’s core'}
            disabled={readOnly}
            onCommit={(text) => {
              const gauge = parseGauge(text);
              return gauge.ok ? redesign({ coreDiameterM: gauge.diameterM }) : gauge.message;
            }}
          />
        )}
        <TextEntry widthClass="w-36" label="Note" value={pitchText(firstPartialHz)} hint={pitchHint(firstPartialHz)} disabled={readOnly} onCommit={onNote} />
        <NumberField
          label="Scale length"
          unit="mm"
          value={string.lengthM * 1000}
          disabled={readOnly}
          hint="Keeps the note"
          onCommit={(mm) => plainFieldMessage('string.lengthM', mm / 1000) ?? redesign({ lengthM: mm / 1000 })}
        />
      </div>
      <p className="mt-2 text-xs text-slate-700 dark:text-slate-300" aria-label="Computed string">
        μ = {plainNumber(string.linearDensityKgPerM * 1000)} g/m · T = {plainNumber(string.tensionN)} N · B = {plainNumber(string.inharmonicityB)}
      </p>
      <div className="mt-2">
        <Notice tone={safetyTone[caution.safety.level]} title="Tension caution">
          {caution.safety.message} Figured on {caution.basis}.
        </Notice>
      </div>
      <details className="mt-2">
        <summary className="cursor-pointer text-xs font-semibold">Expert: μ, T, B</summary>
        <div className="mt-2 flex flex-wrap gap-3">
          <NumberField
            label="Tension"
            unit="N"
            value={string.tensionN}
            disabled={readOnly}
            hint="B follows 1/T"
            onCommit={(n) =>
              plainFieldMessage('string.tensionN', n) ??
              commitPlainNumbers(connection, patch, { 'string.tensionN': n, 'string.inharmonicityB': inharmonicityForTension(string.inharmonicityB, string.tensionN, n) })
            }
          />
          <NumberField
            label="Linear density"
            unit="kg/m"
            value={string.linearDensityKgPerM}
            disabled={readOnly}
            onCommit={(v) => commitPlainNumbers(connection, patch, { 'string.linearDensityKgPerM': v })}
          />
          <NumberField label="Stiffness B" unit="" value={string.inharmonicityB} disabled={readOnly} onCommit={(b) => commitPlainNumbers(connection, patch, { 'string.inharmonicityB': b })} />
        </div>
      </details>
    </section>
  );
}
