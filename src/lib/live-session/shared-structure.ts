/**
 * `next`, with every part that equals the same part of `previous` (plain data: numbers, strings,
 * booleans, null, arrays and plain objects) replaced by `previous`'s object, so unchanged parts keep
 * their identity: `previous` itself when nothing changed, and otherwise each untouched section,
 * polyline and point. A memoised view of one part then skips its render when that part is the same
 * object. Costs one walk over `next`.
 */
export function sharedStructure<T>(previous: T | null | undefined, next: T): T {
  return share(previous, next) as T;
}

function share(previous: unknown, next: unknown): unknown {
  if (Object.is(previous, next)) return previous;
  if (typeof next !== 'object' || next === null || typeof previous !== 'object' || previous === null) return next;
  if (Array.isArray(next)) {
    if (!Array.isArray(previous)) return next;
    let same = previous.length === next.length;
    const out = next.map((item, index) => {
      const kept = share(previous[index], item);
      if (kept !== previous[index]) same = false;
      return kept;
    });
    return same ? previous : out;
  }
  if (Array.isArray(previous)) return next;
  const before = previous as Record<string, unknown>;
  const keys = Object.keys(next);
  let same = keys.length === Object.keys(before).length;
  const out: Record<string, unknown> = {};
  for (const key of keys) {
    const kept = share(before[key], (next as Record<string, unknown>)[key]);
    if (kept !== before[key] || !(key in before)) same = false;
    out[key] = kept;
  }
  return same ? previous : out;
}
