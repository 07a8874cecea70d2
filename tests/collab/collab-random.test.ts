import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { deletePoint, insertPoint, movePoint } from '../../shared/collab/point-edits';
import { patchDoc } from '../../shared/collab/patch-doc';
import { validatePatch } from '../../shared/patch/validate-patch';
import { seededRandom } from '../../shared/random/seeded-random';
import type { SessionConnection } from '../../src/lib/live-session/session-connection';
import { eventually, openClient, waitForSnapshot } from '../support/collab-client';
import { createStudioFixture, type StudioFixture } from '../support/studio-fixture';
import { startLiveTestServer, type LiveTestServer } from '../support/test-server';

let server: LiveTestServer;
let fixture: StudioFixture;

beforeAll(async () => {
  server = await startLiveTestServer();
  fixture = await createStudioFixture(server);
});
afterAll(() => server.close());

const SEED = Number(process.env.COLLAB_SEED ?? 20261201);

/** One random edit through the client library's helpers (which clamp and refuse bad edits). */
function randomEdit(connection: SessionConnection, random: () => number): void {
  connection.edit((doc, origin) => {
    const parts = patchDoc(doc);
    const lengthM = parts.string.get('lengthM') as number;
    const choice = random();
    if (choice < 0.45 && parts.displacement.length > 0) {
      const index = Math.floor(random() * parts.displacement.length);
      movePoint(doc, 'displacement', index, random() * lengthM, (random() - 0.5) * 0.006, origin);
    } else if (choice < 0.6) {
      insertPoint(doc, 'displacement', random() * lengthM, (random() - 0.5) * 0.004, origin);
    } else if (choice < 0.7 && parts.displacement.length > 2) {
      deletePoint(doc, 'displacement', Math.floor(random() * parts.displacement.length), origin);
    } else if (choice < 0.85) {
      parts.damping.set('b1PerS', Math.round(random() * 400) / 100);
    } else {
      parts.pickup.set('positionM', Math.max(0.01, Math.round(random() * lengthM * 1000) / 1000 - 0.005));
    }
  });
}

describe('randomised collaboration (seeded)', () => {
  it(`five clients with random edits, disconnects and offline edits end identical (seed ${SEED}; set COLLAB_SEED to replay)`, async () => {
    const random = seededRandom(SEED);
    const roles = ['lead', 'designer', 'lead', 'designer', 'lead'] as const;
    const clients = roles.map((role, index) => openClient(server.baseUrl, fixture.sessionId, fixture.members[role].token, `client-${index}`));
    try {
      for (const connection of clients) await waitForSnapshot(connection, (s) => s.synced, 5000, 'synced');
      // One person surely edits while offline; the rest of the script is random.
      clients[4].provider.disconnect();
      let offlineEdits = 0;
      for (let i = 0; i < 3; i++, offlineEdits++) randomEdit(clients[4], random);
      for (let round = 0; round < 60; round++) {
        const connection = clients[Math.floor(random() * clients.length)];
        const action = random();
        if (action < 0.1 && connection.provider.wsconnected) {
          connection.provider.disconnect(); // goes offline; keeps editing locally
        } else if (action < 0.2 && !connection.provider.wsconnected) {
          connection.provider.connect();
        } else {
          if (!connection.provider.wsconnected) offlineEdits++;
          randomEdit(connection, random);
        }
        if (random() < 0.3) await new Promise((resolve) => setTimeout(resolve, Math.floor(random() * 15)));
      }
      expect(offlineEdits).toBeGreaterThan(2);
      for (const connection of clients) if (!connection.provider.wsconnected && !connection.provider.wsconnecting) connection.provider.connect();
      const json = (connection: SessionConnection) => JSON.stringify(connection.doc.toJSON());
      await eventually(() => clients.every((connection) => json(connection) === json(clients[0])), 10_000, `identical documents (seed ${SEED})`);
      // Whatever the interleaving, the document still reads as a valid patch (snapshots refresh once per frame).
      await eventually(() => clients.every((connection) => JSON.stringify(connection.getSnapshot().patch) === JSON.stringify(clients[0].getSnapshot().patch)), 2000, 'snapshots refreshed');
      const patches = clients.map((connection) => connection.getSnapshot().patch);
      expect(validatePatch(patches[0]).ok, `seed ${SEED}`).toBe(true);
      for (const patch of patches) expect(patch, `seed ${SEED}`).toEqual(patches[0]);
    } finally {
      for (const connection of clients) connection.destroy();
    }
  });
});
