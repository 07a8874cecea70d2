import { describe, expect, it } from 'vitest';
import { sharedStructure } from '../../../src/lib/live-session/shared-structure';

const patch = () => ({
  string: { lengthM: 0.65, tensionN: 70 },
  excitation: { displacementM: [[0, 0], [0.2, 0.002], [0.65, 0]] as Array<[number, number]> },
  pickup: { positionM: 0.1, output: 'displacement' },
});

describe('sharedStructure keeps the identity of unchanged parts', () => {
  it('gives back the previous object when nothing changed', () => {
    const before = patch();
    expect(sharedStructure(before, patch())).toBe(before);
  });

  it('a moved point: a new shape and a new point, the other sections and points kept', () => {
    const before = patch();
    const next = patch();
    next.excitation.displacementM[1] = [0.21, 0.002];
    const shared = sharedStructure(before, next);
    expect(shared).not.toBe(before);
    expect(shared).toEqual(next);
    expect(shared.string).toBe(before.string);
    expect(shared.pickup).toBe(before.pickup);
    expect(shared.excitation).not.toBe(before.excitation);
    expect(shared.excitation.displacementM[0]).toBe(before.excitation.displacementM[0]);
    expect(shared.excitation.displacementM[1]).not.toBe(before.excitation.displacementM[1]);
    expect(shared.excitation.displacementM[2]).toBe(before.excitation.displacementM[2]);
  });

  it('an added key, a removed key and a longer array each count as a change', () => {
    const before = patch();
    const added = { ...patch(), render: { durationS: 2 } };
    expect(sharedStructure(before, added)).not.toBe(before);
    const { pickup: _dropped, ...removed } = patch();
    expect(sharedStructure(before as Omit<typeof before, 'pickup'>, removed)).toEqual(removed);
    expect(sharedStructure(before as Omit<typeof before, 'pickup'>, removed)).not.toBe(before);
    const longer = patch();
    longer.excitation.displacementM.push([0.7, 0]);
    expect(sharedStructure(before, longer).excitation.displacementM).toHaveLength(4);
  });

  it('no previous value gives the next one as it is', () => {
    const next = patch();
    expect(sharedStructure(null, next)).toBe(next);
  });
});
