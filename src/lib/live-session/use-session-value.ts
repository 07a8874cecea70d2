import { useMemo, useSyncExternalStore } from 'react';
import type { SessionConnection, SessionSnapshot } from './session-connection';

/**
 * One value read from a live session's snapshot: the calling component re-renders only when that
 * value changes (by `equal`, identity by default), not on every change of the session. Pass a
 * `select` and `equal` defined outside the component (or memoised), as the value is cached per pair.
 */
export function useSessionValue<T>(connection: SessionConnection, select: (snapshot: SessionSnapshot) => T, equal: (a: T, b: T) => boolean = Object.is): T {
  const read = useMemo(() => {
    let last: { snapshot: SessionSnapshot; value: T } | null = null;
    return () => {
      const snapshot = connection.getSnapshot();
      if (last && last.snapshot === snapshot) return last.value;
      const value = select(snapshot);
      last = { snapshot, value: last && equal(last.value, value) ? last.value : value };
      return last.value;
    };
  }, [connection, select, equal]);
  return useSyncExternalStore(connection.subscribe, read, read);
}

/** Equal when both objects have the same keys with identical values: for selecting a few fields at once. */
export function sameFields<T extends object>(a: T, b: T): boolean {
  const keys = Object.keys(a) as Array<keyof T>;
  return keys.length === Object.keys(b).length && keys.every((key) => Object.is(a[key], b[key]));
}
