import type { Patch } from '../../shared/patch/patch-schema';

/** JSON with object keys in sorted order, so two equal patches compare equal whatever order their keys were written in. */
function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, item]) => item !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([key, item]) => `${JSON.stringify(key)}:${canonicalJson(item)}`).join(',')}}`;
  }
  return JSON.stringify(value);
}

/** Whether two patches sound the same: everything but the name (a label, not the sound) is equal. */
export function samePatchSound(a: Patch, b: Patch): boolean {
  return canonicalJson({ ...a, name: '' }) === canonicalJson({ ...b, name: '' });
}

/** A preset's version counts changes of its sound: it rises by one when the patch changed, and stays otherwise. */
export function presetVersionAfter(version: number, before: Patch, after: Patch): number {
  return samePatchSound(before, after) ? version : version + 1;
}
