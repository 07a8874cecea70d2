import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { typeormCollabStorage, type CollabStorage } from '../../server/collab/collab-storage';
import { SharedUpdateWriter } from '../../server/collab/shared-update-writer';
import { createStudioFixture } from '../support/studio-fixture';
import { startTestServer, type TestServer } from '../support/test-server';

let server: TestServer;
let sessions: string[];

beforeAll(async () => {
  server = await startTestServer();
  sessions = [(await createStudioFixture(server, 'wa')).sessionId, (await createStudioFixture(server, 'wb')).sessionId];
});

afterAll(async () => {
  await server.close();
});

/** The real SQLite storage, counting its transactions of appended rows. */
function countedStorage(): { storage: CollabStorage; transactions: number[] } {
  const real = typeormCollabStorage(server.dataSource, () => new Date());
  const transactions: number[] = [];
  return {
    transactions,
    storage: {
      ...real,
      appendRows: (rows) => {
        transactions.push(rows.length);
        return real.appendRows(rows);
      },
    },
  };
}

async function storedRow(id: number): Promise<{ sessionId: string; update: Buffer } | undefined> {
  const [row] = (await server.dataSource.query('SELECT "sessionId", "update" FROM "session_updates" WHERE "id" = ?', [id])) as Array<{ sessionId: string; update: Buffer }>;
  return row;
}

describe('the shared update writer', () => {
  it('writes the rows of every session flushed on one tick in a single transaction, each session getting its own row id', async () => {
    const { storage, transactions } = countedStorage();
    const writer = new SharedUpdateWriter(storage);
    const updates = [Uint8Array.of(1, 2, 3), Uint8Array.of(4, 5), Uint8Array.of(6)];
    const owners = [sessions[0], sessions[1], sessions[0]];
    const ids = await new Promise<number[]>((resolve, reject) => {
      const written: Array<Promise<number>> = [];
      owners.forEach((sessionId, index) => writer.flushSoon(() => written.push(writer.append(sessionId, updates[index]))));
      // Asked twice: still one flush.
      writer.flushSoon(() => undefined);
      setTimeout(() => Promise.all(written).then(resolve, reject), 100);
    });
    expect(transactions).toEqual([3]);
    expect(new Set(ids).size).toBe(3);
    for (const [index, id] of ids.entries()) {
      const row = await storedRow(id);
      expect(row?.sessionId).toBe(owners[index]);
      expect([...(row?.update ?? [])]).toEqual([...updates[index]]);
    }
  });

  it('keeps one session’s refused row from failing the others written with it', async () => {
    const { storage, transactions } = countedStorage();
    const writer = new SharedUpdateWriter(storage);
    // No such session: the foreign key refuses the row.
    const outcomes = await Promise.allSettled([writer.append(sessions[0], Uint8Array.of(7)), writer.append(randomUUID(), Uint8Array.of(8)), writer.append(sessions[1], Uint8Array.of(9))]);
    expect(outcomes.map((outcome) => outcome.status)).toEqual(['fulfilled', 'rejected', 'fulfilled']);
    // The shared transaction, then one per row.
    expect(transactions).toEqual([3, 1, 1, 1]);
    const kept = outcomes.filter((outcome): outcome is PromiseFulfilledResult<number> => outcome.status === 'fulfilled').map((outcome) => outcome.value);
    expect((await storedRow(kept[0]))?.sessionId).toBe(sessions[0]);
    expect((await storedRow(kept[1]))?.sessionId).toBe(sessions[1]);
  });
});
