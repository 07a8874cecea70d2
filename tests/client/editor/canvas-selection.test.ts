import { describe, expect, it } from 'vitest';
import { sameSelection, stepSelection } from '../../../src/features/editor/geometry/canvas-selection';

describe('stepping the keyboard selection through the handles', () => {
  const counts = { displacement: 2, velocity: 1 };
  it('goes through the shape, then the strike layer, then the pickup, and wraps round', () => {
    let at = stepSelection(null, counts, 1);
    const seen = [at];
    for (let i = 0; i < 4; i++) seen.push((at = stepSelection(at, counts, 1)));
    expect(seen).toEqual([
      { layer: 'displacement', index: 0 },
      { layer: 'displacement', index: 1 },
      { layer: 'velocity', index: 0 },
      { layer: 'pickup' },
      { layer: 'displacement', index: 0 },
    ]);
    expect(stepSelection({ layer: 'displacement', index: 0 }, counts, -1)).toEqual({ layer: 'pickup' });
  });
  it('starts from the pickup backwards, and from the start when the selected point has gone', () => {
    expect(stepSelection(null, { displacement: 0, velocity: 0 }, -1)).toEqual({ layer: 'pickup' });
    expect(stepSelection({ layer: 'displacement', index: 7 }, counts, 1)).toEqual({ layer: 'displacement', index: 0 });
  });
  it('compares selections by layer and index', () => {
    expect(sameSelection({ layer: 'pickup' }, { layer: 'pickup' })).toBe(true);
    expect(sameSelection({ layer: 'velocity', index: 1 }, { layer: 'displacement', index: 1 })).toBe(false);
    expect(sameSelection(null, { layer: 'pickup' })).toBe(false);
  });
});

describe('plucks and strikes as keyboard handles', () => {
  it('puts them first, before the points and the pickup', () => {
    const counts = { parts: 2, displacement: 0, velocity: 1 };
    let at = stepSelection(null, counts, 1);
    const seen = [at];
    for (let i = 0; i < 4; i++) seen.push((at = stepSelection(at, counts, 1)));
    expect(seen).toEqual([{ layer: 'part', index: 0 }, { layer: 'part', index: 1 }, { layer: 'velocity', index: 0 }, { layer: 'pickup' }, { layer: 'part', index: 0 }]);
    expect(sameSelection({ layer: 'part', index: 0 }, { layer: 'displacement', index: 0 })).toBe(false);
  });
});
