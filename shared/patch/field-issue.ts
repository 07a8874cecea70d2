/**
 * One problem with one field of an input, as the command line prints it and the API returns it:
 * `{ field: "string.tensionN", problem: "must be > 0", got: "-5",
 *    message: "string.tensionN must be > 0, got -5" }`.
 */
export interface FieldIssue {
  /** Path of the field, dotted with [index] for arrays, e.g. `excitation.displacementM[3][0]`. */
  field: string;
  problem: string;
  /** A short description of the value that was found, or null when the field was missing. */
  got: string | null;
  message: string;
}

export type Validation<T> = { ok: true; value: T } | { ok: false; issues: FieldIssue[] };

/** Formats a path such as ['excitation', 'displacementM', 3, 0] as `excitation.displacementM[3][0]`. */
export function fieldPath(path: ReadonlyArray<PropertyKey>): string {
  let out = '';
  for (const key of path) {
    if (typeof key === 'number') out += `[${key}]`;
    else out += out === '' ? String(key) : `.${String(key)}`;
  }
  return out === '' ? '(patch)' : out;
}

/** Describes a value briefly for a message: numbers as written, long strings cut, arrays by length. */
export function describeValue(value: unknown): string {
  if (value === null) return 'null';
  if (typeof value === 'number') return String(value);
  if (typeof value === 'string') {
    const cut = value.length > 40 ? `${value.slice(0, 40)}…` : value;
    return JSON.stringify(cut);
  }
  if (typeof value === 'boolean') return String(value);
  if (Array.isArray(value)) return `an array of ${value.length} item${value.length === 1 ? '' : 's'}`;
  if (typeof value === 'object') return 'an object';
  return typeof value;
}

export function fieldIssue(path: ReadonlyArray<PropertyKey>, problem: string, value: unknown, present = true): FieldIssue {
  const field = fieldPath(path);
  const got = present ? describeValue(value) : null;
  return { field, problem, got, message: got === null ? `${field} ${problem}` : `${field} ${problem}, got ${got}` };
}

/** Reads the value at a path inside an unknown input; `present` is false when a step is missing. */
export function valueAtPath(input: unknown, path: ReadonlyArray<PropertyKey>): { present: boolean; value: unknown } {
  let current: unknown = input;
  for (const key of path) {
    if (current === null || typeof current !== 'object' || !(key in (current as object))) {
      return { present: false, value: undefined };
    }
    current = (current as Record<PropertyKey, unknown>)[key];
  }
  return { present: true, value: current };
}
