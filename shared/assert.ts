/** Throws when an internal invariant does not hold. Expected failures are values, not assertions. */
export function assert(condition: unknown, message: string): asserts condition {
  if (!condition) throw new Error(`Assertion failed: ${message}`);
}
