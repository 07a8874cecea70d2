import { mkdirSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { ESLint } from 'eslint';
import { afterAll, describe, expect, it } from 'vitest';

// The project's own ESLint config, run through ESLint's Node API on scratch text placed at
// virtual paths: each architecture rule must fire where it should and stay quiet where it should.
const root = path.resolve(import.meta.dirname, '../..');
const eslint = new ESLint({ cwd: root, overrideConfigFile: path.join(root, '.config/eslint.config.js') });

async function ruleIds(code: string, filePath: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: path.join(root, filePath) });
  expect(result.fatalErrorCount, JSON.stringify(result.messages)).toBe(0);
  return result.messages.map((message) => message.ruleId ?? 'parse');
}

describe('feature import zones', () => {
  const crossFeature = "import { useRenders } from '../../renders/api/get-renders';\nexport const used = useRenders;\n";

  it('a feature importing another feature is an error', async () => {
    expect(await ruleIds(crossFeature, 'src/features/presets/components/x.tsx')).toContain('import-x/no-restricted-paths');
    // A type-only import crosses the line too.
    const typeOnly = "import type { ComparisonSound } from '../editor/components/preview-audition';\nexport type S = ComparisonSound;\n";
    expect(await ruleIds(typeOnly, 'src/features/presets/x.ts')).toContain('import-x/no-restricted-paths');
    // Reaching into the pages is outside the zone as well.
    const page = "import { PresetsPage } from '../../../app/routes/presets-page';\nexport const used = PresetsPage;\n";
    expect(await ruleIds(page, 'src/features/presets/components/x.tsx')).toContain('import-x/no-restricted-paths');
  });

  it('a feature may use itself, src/components, src/lib and shared/; a page may compose features', async () => {
    const allowed = [
      "import { Button } from '../../../components/button';",
      "import { apiRequest } from '../../../lib/api-client';",
      "import { getMeQueryOptions } from '../../../lib/queries/get-me';",
      "import { LIMITS } from '../../../../shared/limits';",
      "import { parseTags } from '../tags';",
      "import { useQuery } from '@tanstack/react-query';",
      'export const used = [Button, apiRequest, getMeQueryOptions, LIMITS, parseTags, useQuery];',
    ].join('\n');
    expect(await ruleIds(allowed, 'src/features/presets/components/x.tsx')).not.toContain('import-x/no-restricted-paths');
    const fromPage = "import { useRenders } from '../../features/renders/api/get-renders';\nexport const used = useRenders;\n";
    expect(await ruleIds(fromPage, 'src/app/routes/x.tsx')).toEqual([]);
    expect(await ruleIds(crossFeature.replace('../../renders/', '../'), 'src/features/renders/components/x.tsx')).toEqual([]);
  });
});

describe('React hook rules', () => {
  const conditional = [
    "import { useState } from 'react';",
    'export function Knob({ shown }: { shown: boolean }) {',
    '  if (shown) {',
    '    const [value] = useState(0);',
    '    return value;',
    '  }',
    '  return null;',
    '}',
  ].join('\n');
  const missingDependency = [
    "import { useEffect } from 'react';",
    'export function Title({ name }: { name: string }) {',
    '  useEffect(() => {',
    '    document.title = name;',
    '  }, []);',
    '  return null;',
    '}',
  ].join('\n');

  it('a hook called in a condition is an error', async () => {
    expect(await ruleIds(conditional, 'src/features/editor/components/x.tsx')).toContain('react-hooks/rules-of-hooks');
    const unconditional = conditional.replace('  if (shown) {\n    const [value] = useState(0);', '  const [value] = useState(0);\n  if (shown) {');
    expect(await ruleIds(unconditional, 'src/features/editor/components/x.tsx')).toEqual([]);
  });

  it('an effect that does not list what it reads is an error', async () => {
    expect(await ruleIds(missingDependency, 'src/components/x.tsx')).toContain('react-hooks/exhaustive-deps');
    expect(await ruleIds(missingDependency.replace('}, []);', '}, [name]);'), 'src/components/x.tsx')).toEqual([]);
  });
});

describe('the server takes the time from its clock', () => {
  const bare = 'export const stamp = () => new Date();\n';
  const now = 'export const stampMs = () => Date.now();\n';

  it('a bare new Date() or Date.now() in server/ is an error', async () => {
    expect(await ruleIds(bare, 'server/routes/x.ts')).toEqual(['no-restricted-syntax']);
    expect(await ruleIds(now, 'server/routes/x.ts')).toEqual(['no-restricted-syntax']);
  });

  it('the clock module, a date from a value, and tests are allowed', async () => {
    expect(await ruleIds(bare, 'server/clock.ts')).toEqual([]);
    expect(await ruleIds('export const epoch = new Date(0);\n', 'server/routes/x.ts')).toEqual([]);
    expect(await ruleIds(bare, 'tests/server/x.test.ts')).toEqual([]);
    expect(await ruleIds('export const stamp = (clock: () => Date) => clock();\n', 'server/routes/x.ts')).toEqual([]);
  });
});

describe('import cycles, type-only imports included', () => {
  // The cycle rule reads the imported files from disk, so the scratch files are real ones.
  const scratch = path.join(root, 'server', `__lint_scratch_${process.pid}__`);
  afterAll(() => rmSync(scratch, { recursive: true, force: true }));

  it('two files that import each other (one side type-only) are both reported; a one-way pair is not', async () => {
    try {
      mkdirSync(scratch, { recursive: true });
      writeFileSync(path.join(scratch, 'job-context.ts'), "import type { JobQueue } from './job-queue';\nexport interface JobContext {\n  queue?: JobQueue;\n}\n");
      writeFileSync(path.join(scratch, 'job-queue.ts'), "import type { JobContext } from './job-context';\nexport class JobQueue {\n  constructor(readonly context: JobContext) {}\n}\n");
      writeFileSync(path.join(scratch, 'one-way-a.ts'), "import type { B } from './one-way-b';\nexport type A = B[];\n");
      writeFileSync(path.join(scratch, 'one-way-b.ts'), 'export type B = number;\n');
      const results = await eslint.lintFiles([scratch]);
      const byFile = Object.fromEntries(results.map((result) => [path.basename(result.filePath), result.messages.map((message) => message.ruleId)]));
      expect(byFile['job-context.ts']).toEqual(['tautline/no-import-cycle']);
      expect(byFile['job-queue.ts']).toEqual(['tautline/no-import-cycle']);
      expect(byFile['one-way-a.ts']).toEqual([]);
      expect(byFile['one-way-b.ts']).toEqual([]);
      const message = results.find((result) => result.filePath.endsWith('job-context.ts'))!.messages[0].message;
      expect(message).toContain('job-context.ts → ');
      expect(message).toContain('job-queue.ts → ');
    } finally {
      rmSync(scratch, { recursive: true, force: true });
    }
  });
});
