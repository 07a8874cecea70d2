import { describe, expect, it } from 'vitest';
import { setPatchNumbers } from '../../shared/collab/patch-number-edit';
import { Session } from '../../server/db/entities/session';
import { eventually, openClient, waitForSnapshot } from '../support/collab-client';
import { createStudioFixture } from '../support/studio-fixture';
import { startLiveTestServer, type LiveTestServer } from '../support/test-server';

async function lastEdited(server: LiveTestServer, sessionId: string) {
  const session = await server.dataSource.getRepository(Session).findOneByOrFail({ id: sessionId });
  return { updatedAt: session.updatedAt.toISOString(), updatedById: session.updatedById, patch: JSON.stringify(session.patch) };
}

/** Opens the session live as one member, waits for the document, then leaves; resolves once the room has closed. */
async function openAndLeave(server: LiveTestServer, sessionId: string, token: string, edit?: (b1: number) => number) {
  const client = openClient(server.baseUrl, sessionId, token, 'visitor');
  try {
    const synced = await waitForSnapshot(client, (s) => s.synced && s.patch !== null, 5000, 'synced');
    if (edit && synced.patch) {
      const wanted = edit(synced.patch.damping.b1PerS);
      client.edit((doc, origin) => void setPatchNumbers(doc, { 'damping.b1PerS': wanted }, origin));
      await eventually(() => server.tautline.hub.room(sessionId)?.doc.getMap('damping').get('b1PerS') === wanted, 5000, 'edit reached the server');
    }
  } finally {
    client.destroy();
  }
  await eventually(() => server.tautline.hub.room(sessionId) === undefined, 5000, 'room closed');
}

describe('a session\'s "last edited"', () => {
  it('stays as it was when people only open the session (first time live, and again), and a real edit records its editor', async () => {
    const server = await startLiveTestServer();
    try {
      const fixture = await createStudioFixture(server, 'last-edited');
      const created = await lastEdited(server, fixture.sessionId);
      server.advanceClock(3_600_000);
      // First opening writes the patch into a fresh document; the second loads it back from storage.
      await openAndLeave(server, fixture.sessionId, fixture.members.designer.token);
      await openAndLeave(server, fixture.sessionId, fixture.members.listener.token);
      // A third opening waits for the previous room to finish closing (and refreshing) before it loads.
      await openAndLeave(server, fixture.sessionId, fixture.members.producer.token);
      await server.tautline.hub.close();
      expect(await lastEdited(server, fixture.sessionId)).toEqual(created);

      server.advanceClock(3_600_000);
      await openAndLeave(server, fixture.sessionId, fixture.members.designer.token, (b1) => b1 + 0.25);
      await server.tautline.hub.close();
      const edited = await lastEdited(server, fixture.sessionId);
      expect(edited.updatedById).toBe(fixture.members.designer.id);
      // Stamped by the injected clock, two hours on (folding the log afterwards must not restamp it with the database's time).
      expect(Date.parse(edited.updatedAt)).toBeGreaterThan(Date.parse(created.updatedAt) + 3_600_000);
      expect(edited.patch).not.toBe(created.patch);
    } finally {
      await server.close();
    }
  });
});
