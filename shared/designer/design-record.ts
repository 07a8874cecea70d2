import type { Hertz, KilogramsPerMetre, Metres, Newtons } from '../units';
import { formatGauge } from './gauge-text';
import { isMaterialId, MATERIALS, type MaterialId } from './materials';
import { tensionSafety, type TensionSafety } from './tension-safety';

/** One wire of a wound string as the design record keeps it. */
export interface DesignWire {
  material: MaterialId;
  diameterM: Metres;
}

/**
 * The design record: how a patch's string numbers were chosen, kept in the patch's pass-through
 * `design` field (presets carry one; the string panel writes it). Only the fields read here are
 * typed; anything else in it (decay targets, pluck notes) is kept as it is.
 */
export interface DesignRecord {
  material?: MaterialId;
  /** The gauge: overall diameter. */
  diameterM?: Metres;
  core?: DesignWire;
  wrap?: DesignWire;
  targetNote?: string;
  targetFrequencyHz?: Hertz;
  [other: string]: unknown;
}

const positiveNumber = (value: unknown): value is number => typeof value === 'number' && Number.isFinite(value) && value > 0;

function wire(value: unknown): DesignWire | undefined {
  if (value === null || typeof value !== 'object') return undefined;
  const { material, diameterM } = value as Record<string, unknown>;
  return isMaterialId(material) && positiveNumber(diameterM) ? { material, diameterM } : undefined;
}

/** The design record of a patch, with the typed fields kept only when they make sense; {} when there is none. */
export function readDesignRecord(patch: unknown): DesignRecord {
  const raw = patch !== null && typeof patch === 'object' ? (patch as { design?: unknown }).design : undefined;
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) return {};
  const record = { ...(raw as Record<string, unknown>) };
  const out: DesignRecord = { ...record };
  for (const key of ['material', 'diameterM', 'core', 'wrap', 'targetNote', 'targetFrequencyHz'] as const) delete out[key];
  if (isMaterialId(record.material)) out.material = record.material;
  if (positiveNumber(record.diameterM)) out.diameterM = record.diameterM;
  const core = wire(record.core);
  const wrap = wire(record.wrap);
  if (core) out.core = core;
  if (wrap) out.wrap = wrap;
  if (typeof record.targetNote === 'string') out.targetNote = record.targetNote;
  if (positiveNumber(record.targetFrequencyHz)) out.targetFrequencyHz = record.targetFrequencyHz;
  return out;
}

/** Diameter of a solid round string of a material that weighs μ per metre: d = √(4μ/(πρ)) (from μ = ρπd²/4). */
export function diameterFromLinearDensityM(linearDensityKgPerM: KilogramsPerMetre, materialId: MaterialId): Metres {
  return Math.sqrt((4 * linearDensityKgPerM) / (Math.PI * MATERIALS[materialId].densityKgPerM3));
}

/** The tension caution for any session, and what it was figured on. */
export interface SessionTensionSafety {
  safety: TensionSafety;
  /** What the stress was figured on, in plain words. */
  basis: string;
  /** True when the design record did not say, and the material or gauge was assumed. */
  assumed: boolean;
}

/**
 * The tension caution for every session: from the design record when it names the load-bearing
 * wire (a wound string's core, or a solid string's material and gauge); a solid material without a
 * gauge takes the gauge that gives the patch's μ; with no material at all the string is taken as
 * plain steel music wire of the gauge that gives its μ, and the caution says so. Like
 * `tensionSafety`, it defers to the string maker's rating and local practice.
 */
export function sessionTensionSafety(string: { tensionN: Newtons; linearDensityKgPerM: KilogramsPerMetre }, design: DesignRecord): SessionTensionSafety {
  if (design.core) {
    const { core } = design;
    return {
      safety: tensionSafety(string.tensionN, core.diameterM, core.material),
      basis: `the ${MATERIALS[core.material].label.toLowerCase()} core of ${formatGauge(core.diameterM)}`,
      assumed: false,
    };
  }
  const material = design.material ? MATERIALS[design.material] : null;
  if (material && material.construction === 'wound') {
    const diameterM = design.diameterM ?? diameterFromLinearDensityM(string.linearDensityKgPerM, 'music-wire');
    return { safety: tensionSafety(string.tensionN, diameterM, 'wound'), basis: `a ${material.label.toLowerCase()} string`, assumed: false };
  }
  if (material && design.diameterM) {
    return {
      safety: tensionSafety(string.tensionN, design.diameterM, material.id),
      basis: `${material.label.toLowerCase()} of ${formatGauge(design.diameterM)}`,
      assumed: false,
    };
  }
  const materialId = material?.id ?? 'music-wire';
  const diameterM = diameterFromLinearDensityM(string.linearDensityKgPerM, materialId);
  return {
    safety: tensionSafety(string.tensionN, diameterM, materialId),
    basis: `${material ? '' : 'assumed '}${MATERIALS[materialId].label.toLowerCase()} of ${formatGauge(diameterM)}, the gauge that gives this linear density`,
    assumed: true,
  };
}
