import WebSocket from 'ws';
import { SessionConnection, type SessionSnapshot } from '../../src/lib/live-session/session-connection';

// Each y-websocket provider adds a process exit listener; tests open many at once.
process.setMaxListeners(64);

/** A real client of the web app's collaboration library, in Node, over real websockets. */
export function openClient(baseUrl: string, sessionId: string, token: string, name = 'tester'): SessionConnection {
  return new SessionConnection({
    baseUrl,
    sessionId,
    token,
    presence: { name, colour: '#d49a2a' },
    WebSocketPolyfill: WebSocket as unknown as typeof globalThis.WebSocket,
  });
}

/** Resolves once the client's snapshot satisfies `test` (checked on every change), or fails after `timeoutMs`. */
export function waitForSnapshot(client: SessionConnection, test: (snapshot: SessionSnapshot) => boolean, timeoutMs = 5000, what = 'condition'): Promise<SessionSnapshot> {
  return new Promise((resolve, reject) => {
    if (test(client.getSnapshot())) return resolve(client.getSnapshot());
    const timer = setTimeout(() => {
      unsubscribe();
      reject(new Error(`timed out waiting for ${what}; last snapshot: ${JSON.stringify({ ...client.getSnapshot(), result: undefined, patch: undefined })}`));
    }, timeoutMs);
    const unsubscribe = client.subscribe(() => {
      if (!test(client.getSnapshot())) return;
      clearTimeout(timer);
      unsubscribe();
      resolve(client.getSnapshot());
    });
  });
}

/** Resolves when `check` holds, polling every 10 ms. */
export async function eventually(check: () => boolean, timeoutMs = 5000, what = 'condition'): Promise<void> {
  const started = Date.now();
  while (!check()) {
    if (Date.now() - started > timeoutMs) throw new Error(`timed out waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
}
