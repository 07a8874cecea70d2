import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { LIMITS } from '../../shared/limits';
import { validatePatch } from '../../shared/patch/validate-patch';

const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');

describe('README', () => {
  it('starts with the job, then the two commands', () => {
    expect(readme).toMatch(/^# Tautline\n\n.+sound designers/);
    expect(readme).toContain('npm ci && npm start');
    expect(readme).toContain('npm test');
  });

  it('shows a patch example that passes validation', () => {
    const example = /```json\n([\s\S]*?)```/.exec(readme);
    expect(example).not.toBeNull();
    const result = validatePatch(JSON.parse(example![1]));
    expect(result.ok ? 'ok' : result.issues.map((issue) => issue.message)).toBe('ok');
  });

  it('states the limits that shared/limits.ts enforces', () => {
    expect(readme).toContain(LIMITS.sampleRatesHz.join(', ').replace(/, (\d+)$/, ' or $1'));
    expect(readme).toContain(`at most ${LIMITS.maxDurationS}`);
    expect(readme).toContain(`1–${LIMITS.maxModes}`);
    expect(readme).toContain('10,000 points');
  });
});
