import * as Y from 'yjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { setExcitationParts, updateExcitationPart } from '../../shared/collab/excitation-part-edits';
import { polylinesFromParts } from '../../shared/collab/excitation-polyline';
import type { PluckPart } from '../../shared/patch/excitation-part';
import { LIVE_CLOSE_CODES } from '../../shared/protocol/live-access';
import { openClient, waitForSnapshot } from '../support/collab-client';
import { openRawCollabClient } from '../support/raw-collab-client';
import { createStudioFixture, type StudioFixture } from '../support/studio-fixture';
import { as, startLiveTestServer, type LiveTestServer } from '../support/test-server';

/**
 * The plucks and strikes are a part of the live document like any other: the server's edit gate
 * checks them (a part that is not a map of numbers and names, or a pluck the schema refuses, is
 * refused for its sender), and a good one reaches everyone and the stored patch with its polyline.
 */

let server: LiveTestServer;
let fixture: StudioFixture;

beforeAll(async () => {
  server = await startLiveTestServer();
  fixture = await createStudioFixture(server, 'parts');
});

afterAll(async () => {
  await server?.close();
});

async function storedPatch() {
  return (await as(server.app, fixture.members.lead.token).get(`/api/sessions/${fixture.sessionId}`)).body.session.patch;
}

/** The polyline the shared shape code makes for one pluck on the fixture's string. */
function madeBy(lengthM: number, part: PluckPart): Array<[number, number]> {
  const made = polylinesFromParts(lengthM, [part]);
  if (!made.ok) throw new Error(made.reason);
  return made.displacement!;
}

const pluck: PluckPart = { kind: 'pluck', positionM: 0.2, heightM: 0.003, widthM: 0.01, contact: 'pick' };

describe('plucks and strikes in a live session', () => {
  it('a pluck laid down by one person reaches the other and the stored patch, polyline and part together; a drag follows', async () => {
    const designer = openClient(server.baseUrl, fixture.sessionId, fixture.members.designer.token, 'designer');
    const lead = openClient(server.baseUrl, fixture.sessionId, fixture.members.lead.token, 'lead');
    await waitForSnapshot(designer, (s) => s.synced && s.patch !== null, 5000, 'designer synced');
    await waitForSnapshot(lead, (s) => s.synced && s.patch !== null, 5000, 'lead synced');
    designer.edit((doc, origin) => void setExcitationParts(doc, [pluck], origin));
    const seen = await waitForSnapshot(lead, (s) => s.patch?.excitation.parts?.length === 1, 5000, 'lead sees the pluck');
    expect(seen.patch!.excitation.parts).toEqual([pluck]);
    // A pick's flat top: 3 mm high from 195 to 205 mm, exactly as the shared shape code makes it.
    expect(seen.patch!.excitation.displacementM.slice(1, -1)).toEqual(madeBy(seen.patch!.string.lengthM, pluck));
    expect(seen.patch!.excitation.displacementM[2]).toEqual([0.2, 0.003]);
    designer.edit((doc, origin) => void updateExcitationPart(doc, 0, { positionM: 0.3 }, origin));
    await waitForSnapshot(lead, (s) => s.patch?.excitation.parts?.[0]?.positionM === 0.3, 5000, 'lead sees the pluck moved');
    let stored = await storedPatch();
    for (let attempt = 0; attempt < 50 && stored.excitation.parts?.[0]?.positionM !== 0.3; attempt++) {
      await new Promise((resolve) => setTimeout(resolve, 100));
      stored = await storedPatch();
    }
    expect(stored.excitation.parts).toEqual([{ ...pluck, positionM: 0.3 }]);
    expect(stored.excitation.displacementM.slice(1, -1)).toEqual(madeBy(stored.string.lengthM, { ...pluck, positionM: 0.3 }));
    designer.destroy();
    lead.destroy();
  });

  const poisons: Array<[string, (doc: Y.Doc) => void, string]> = [
    ['a shared list where a part belongs', (doc) => doc.getArray('excitationParts').insert(0, [new Y.Array()]), 'excitation.parts[1]'],
    ['a plain number where a part belongs', (doc) => doc.getArray('excitationParts').insert(0, [7]), 'excitation.parts[1]'],
    [
      'a pluck with a negative contact width',
      (doc) => {
        const part = new Y.Map<number | string>();
        for (const [key, value] of Object.entries({ ...pluck, widthM: -0.01 })) part.set(key, value);
        doc.getArray('excitationParts').insert(0, [part]);
      },
      'excitation.parts[0].widthM',
    ],
  ];

  it.each(poisons)('refuses %s for its sender, and nothing of it is stored', async (_what, poison, field) => {
    const before = await storedPatch();
    const attacker = openRawCollabClient(server.baseUrl, fixture.sessionId, fixture.members.designer.token);
    await attacker.synced;
    attacker.sendUpdate(attacker.change(poison));
    const closed = await attacker.closed;
    expect(closed.code).toBe(LIVE_CLOSE_CODES.editRefused);
    expect(closed.reason).toContain(field);
    expect(await storedPatch()).toEqual(before);
  });
});
