import { describe, expect, it } from 'vitest';
import { partKeyChanges } from '../../../src/features/editor/geometry/part-key-step';
import type { PluckPart, StrikePart } from '../../../shared/patch/excitation-part';

const pluck: PluckPart = { kind: 'pluck', positionM: 0.25, heightM: 0.004, widthM: 0.003, contact: 'fingertip' };
const strike: StrikePart = { kind: 'strike', positionM: 0.4, velocityMPerS: 0.5, widthM: 0.02 };

describe('arrow keys on a pluck or strike handle', () => {
  it('moves it 1 mm along (0.1 mm with Shift) and changes its height by 0.1 mm or its velocity by 0.01 m/s', () => {
    expect(partKeyChanges(pluck, 'ArrowLeft', false)!.positionM).toBeCloseTo(0.249, 15);
    expect(partKeyChanges(pluck, 'ArrowRight', true)!.positionM).toBeCloseTo(0.2501, 15);
    expect(partKeyChanges(pluck, 'ArrowUp', false)).toEqual({ heightM: 0.004 + 1e-4 });
    expect(partKeyChanges(strike, 'ArrowDown', false)).toEqual({ velocityMPerS: 0.5 - 1e-2 });
    expect(partKeyChanges(pluck, 'Enter', false)).toBeNull();
  });
});
