import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../support/run-cli';

const GUIDES = ['DEVELOPERS.md', 'README.md', 'docs/architecture.md', 'docs/testing.md', 'docs/performance.md'];
const read = (file: string) => readFileSync(join(PROJECT_ROOT, file), 'utf8');

/** Code spans that name a file or folder of the repository, e.g. `server/collab/live-edit-gate.ts` or `tests/e2e/`. */
function repositoryPaths(text: string): string[] {
  const spans = [...text.matchAll(/`([^`\s]+)`/g)].map((match) => match[1]);
  return spans.filter((span) => /^(src|server|shared|tests|docs|presets|\.ci|\.config)\/[\w./-]*$/.test(span) && !span.includes('..'));
}

describe('the contributor guide and docs', () => {
  it('keeps DEVELOPERS.md a short guide (10–14 KB), with the longer story in docs/', () => {
    const size = Buffer.byteLength(read('DEVELOPERS.md'));
    expect(size).toBeGreaterThan(10 * 1024);
    expect(size).toBeLessThan(14 * 1024);
    for (const file of GUIDES) expect(existsSync(join(PROJECT_ROOT, file)), file).toBe(true);
  });

  it.each(GUIDES)('%s points only inside the repository, at files and folders that exist', (file) => {
    const text = read(file);
    expect(text).not.toMatch(/\.\.\/(shared\/guide|\.library)/);
    const missing = repositoryPaths(text).filter((path) => !existsSync(join(PROJECT_ROOT, path)));
    expect(missing).toEqual([]);
  });
});
