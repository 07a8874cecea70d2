import { useCallback, useEffect, useRef, useState } from 'react';
import { SessionConnection, type Presence } from '../../../lib/live-session/session-connection';

/**
 * Opens a live session for as long as the component is mounted: document, presence, undo/redo,
 * connection state and the latest compute result. It does not re-render on the session's changes:
 * each part of the page reads what it shows with `useSessionValue`.
 */
export function useSessionConnection(
  sessionId: string,
  presence: Pick<Presence, 'name' | 'colour'>,
): { connection: SessionConnection | null; reopen: () => void } {
  const [connection, setConnection] = useState<SessionConnection | null>(null);
  // Raised to open the session again after the server ended it (signed in again, for instance).
  const [opening, setOpening] = useState(0);
  const reopen = useCallback(() => setOpening((count) => count + 1), []);
  // Presence changes go through connection.setPresence, not a reconnect: opening reads the latest one.
  const presenceRef = useRef(presence);
  useEffect(() => {
    presenceRef.current = presence;
  });
  useEffect(() => {
    const opened = new SessionConnection({ baseUrl: window.location.origin, sessionId, presence: presenceRef.current });
    setConnection(opened);
    return () => opened.destroy();
  }, [sessionId, opening]);
  return { connection, reopen };
}
