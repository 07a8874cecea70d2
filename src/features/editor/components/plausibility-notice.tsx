import { memo, useMemo } from 'react';
import { plausibilityCautions } from '../../../../shared/designer/plausibility';
import type { Patch } from '../../../../shared/patch/patch-schema';
import { Notice } from '../../../components/notice';

/** Cautions for a valid patch whose numbers are outside what the model or real strings cover (nothing when all is ordinary). */
export const PlausibilityNotice = memo(function PlausibilityNotice({ patch }: { patch: Patch }) {
  const cautions = useMemo(() => plausibilityCautions(patch), [patch]);
  if (cautions.length === 0) return null;
  return (
    <div data-testid="plausibility-caution">
      <Notice tone="caution" title="Check these numbers">
        <ul className="list-disc pl-4">
          {cautions.map((caution) => (
            <li key={caution}>{caution}</li>
          ))}
        </ul>
      </Notice>
    </div>
  );
});
