// @vitest-environment happy-dom
import { cleanup, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { PlausibilityNotice } from '../../../src/features/editor/components/plausibility-notice';
import { testPatch, trianglePluck, validPatch } from '../../support/patches';

afterEach(cleanup);

describe('the editor’s caution on implausible numbers', () => {
  it('shows nothing for an ordinary string', () => {
    render(<PlausibilityNotice patch={validPatch(testPatch())} />);
    expect(screen.queryByTestId('plausibility-caution')).toBeNull();
  });

  it('names the slope of a displacement large against the length', () => {
    render(<PlausibilityNotice patch={validPatch(testPatch({ excitation: { displacementM: trianglePluck(0.65, 0.1, 0.03) } }))} />);
    expect(screen.getByTestId('plausibility-caution').textContent).toContain('0.30 mm per mm');
  });
});
