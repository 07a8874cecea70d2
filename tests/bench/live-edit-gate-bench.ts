import { performance } from 'node:perf_hooks';
import * as Y from 'yjs';
import { movePoint } from '../../shared/collab/point-edits';
import { patchDoc, writePatchToDoc } from '../../shared/collab/patch-doc';
import { LiveEditGate } from '../../server/collab/live-edit-gate';
import { validPatch, testPatch } from '../support/patches';

/** A patch whose displacement has `points` points (a gentle arch), valid for the test string. */
function patchWithPoints(points: number) {
  const lengthM = 0.65;
  const polyline: [number, number][] = Array.from({ length: points }, (_, index) => {
    const x = (index / (points - 1)) * lengthM;
    return [index === points - 1 ? lengthM : x, index === 0 || index === points - 1 ? 0 : 0.002 * Math.sin((Math.PI * x) / lengthM)];
  });
  return validPatch(testPatch({ excitation: { displacementM: polyline } }));
}

/**
 * What checking one live edit costs the server: a point drag's update applied to the gate's probe
 * document and the probe read back as a patch and validated, for small and large polylines.
 */
export function liveEditGateBench(): Record<string, number> {
  const figures: Record<string, number> = {};
  for (const points of [16, 1000, 10_000]) {
    const server = new Y.Doc();
    writePatchToDoc(server, patchWithPoints(points));
    const gate = new LiveEditGate(server);
    const client = new Y.Doc();
    Y.applyUpdate(client, Y.encodeStateAsUpdate(server));
    const updates: Uint8Array[] = [];
    client.on('update', (update: Uint8Array) => updates.push(update));
    const drags = points >= 10_000 ? 50 : 400;
    for (let i = 0; i < drags; i++) {
      const index = 1 + (i % (points - 2));
      const point = patchDoc(client).displacement.get(index - 1);
      movePoint(client, 'displacement', index - 1, point.get('x') as number, 0.001 + (i % 7) * 1e-4, null);
    }
    const started = performance.now();
    for (const update of updates) {
      const verdict = gate.admit(update);
      if (!verdict.ok) throw new Error(`bench edit refused: ${verdict.reason}`);
      Y.applyUpdate(server, update);
    }
    figures[`checkPerEditUs_${points}Points`] = Math.round(((performance.now() - started) * 1000) / updates.length);
    gate.destroy();
  }
  return figures;
}
