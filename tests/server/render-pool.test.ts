import { afterAll, describe, expect, it } from 'vitest';
import { samplePeak } from '../../shared/audio/peak';
import { prepareRender, renderPatch } from '../../shared/engine/render-patch';
import { bankWork } from '../../shared/engine/split-bank';
import { validatePatch } from '../../shared/patch/validate-patch';
import { PARALLEL_WORK_THRESHOLD, RenderPool } from '../../server/engine-pool/render-pool';
import { testPatch } from '../support/patches';

const pool = new RenderPool(2);
afterAll(() => pool.close());

describe('render pool (worker threads)', () => {
  it('renders a large bank on two real worker threads to the same samples as one thread', async () => {
    const result = validatePatch(
      testPatch({
        string: { lengthM: 0.65, tensionN: 70, linearDensityKgPerM: 0.01, inharmonicityB: 0 },
        damping: { b1PerS: 0.2, b2M2PerS: 0 },
        render: { sampleRateHz: 48000, durationS: 2, maxModes: 400 },
      }),
    );
    if (!result.ok) throw new Error(result.issues[0].message);
    const { bank } = prepareRender(result.value);
    expect(bankWork(bank)).toBeGreaterThan(PARALLEL_WORK_THRESHOLD);
    const parallel = await pool.render(bank);
    const single = renderPatch(result.value);
    expect(parallel.length).toBe(single.length);
    const peak = samplePeak(single);
    let worst = 0;
    for (let i = 0; i < single.length; i++) worst = Math.max(worst, Math.abs(parallel[i] - single[i]));
    expect(worst / peak).toBeLessThan(1e-12);
  });
});
