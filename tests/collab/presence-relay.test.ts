import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as decoding from 'lib0/decoding';
import { startLiveTestServer, type LiveTestServer } from '../support/test-server';
import { createStudioFixture, type StudioFixture } from '../support/studio-fixture';
import { openClient, waitForSnapshot } from '../support/collab-client';
import type { SessionConnection } from '../../src/lib/live-session/session-connection';

let server: LiveTestServer;
let fixture: StudioFixture;
const clients: SessionConnection[] = [];

beforeAll(async () => {
  server = await startLiveTestServer();
  fixture = await createStudioFixture(server);
});
afterAll(async () => {
  for (const client of clients) client.destroy();
  await server.close();
});

function client(role: keyof StudioFixture['members']): SessionConnection {
  const opened = openClient(server.baseUrl, fixture.sessionId, fixture.members[role].token, role);
  clients.push(opened);
  return opened;
}

/** y-websocket's message type for presence (awareness). */
const MESSAGE_AWARENESS = 1;

/**
 * Records, for each presence message a client's websocket sends from now on, whose presence it
 * carries (the real socket; its sends are read, then sent as they were). The message is y-websocket's:
 * its type, then y-protocols' awareness update: a count, then per person their client id, clock and state.
 */
function presenceSent(connection: SessionConnection): Array<number[]> {
  const ws = connection.provider.ws as unknown as { send: (data: Uint8Array) => void };
  const send = ws.send.bind(ws);
  const sent: Array<number[]> = [];
  ws.send = (data: Uint8Array) => {
    const decoder = decoding.createDecoder(new Uint8Array(data));
    if (decoding.readVarUint(decoder) === MESSAGE_AWARENESS) {
      const update = decoding.createDecoder(decoding.readVarUint8Array(decoder));
      const people: number[] = [];
      for (let count = decoding.readVarUint(update); count > 0; count--) {
        people.push(decoding.readVarUint(update));
        decoding.readVarUint(update);
        decoding.readVarString(update);
      }
      sent.push(people);
    }
    send(data);
  };
  return sent;
}

describe('presence crosses the link once', () => {
  it("a page sends its own presence only, never a teammate's back to the server, and both still see each other", async () => {
    const a = client('lead');
    const b = client('designer');
    await waitForSnapshot(a, (s) => s.synced && s.peers.length === 1, 5000, 'a sees b');
    await waitForSnapshot(b, (s) => s.synced && s.peers.length === 1, 5000, 'b sees a');
    const sentByB = presenceSent(b);
    const sentByA = presenceSent(a);
    for (let move = 1; move <= 20; move++) {
      a.setPresence({ pointerXM: move / 100 });
      await new Promise((resolve) => setTimeout(resolve, 5));
    }
    await waitForSnapshot(b, (s) => s.peers[0]?.pointerXM === 0.2, 5000, "b sees a's last move");
    expect(sentByA.filter((people) => people.includes(a.doc.clientID)).length).toBeGreaterThanOrEqual(20);
    // Before, y-websocket relayed each of a's 20 moves straight back to the server from b.
    expect(sentByB.flat()).not.toContain(a.doc.clientID);
    expect(sentByA.flat()).not.toContain(b.doc.clientID);
    b.setPresence({ pointerXM: 0.5 });
    await waitForSnapshot(a, (s) => s.peers[0]?.pointerXM === 0.5, 5000, "a sees b's move");
    expect(sentByB.flat()).toContain(b.doc.clientID);
    expect(sentByB.flat()).not.toContain(a.doc.clientID);
  });
});
