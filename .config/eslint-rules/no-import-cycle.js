// tautline/no-import-cycle: no module may reach itself through its own imports, type-only imports
// included (import-x/no-cycle skips those, and a type-only cycle still ties two files together).
// The import list of each file comes from TypeScript's preProcessFile, which sees `import type`,
// `export … from`, `import('…')` and `import('…').T` type queries. Only relative specifiers are
// followed: an npm package cannot import our files back.
import { readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import ts from 'typescript';

const EXTENSIONS = ['.ts', '.tsx', '.d.ts', '.js', '.mjs', '.cjs', '/index.ts', '/index.tsx', '/index.js'];

/** path → { mtimeMs, imports: string[] (resolved paths) }, kept for one ESLint process. */
const importCache = new Map();

function resolveRelative(fromFile, specifier) {
  if (!specifier.startsWith('.')) return null;
  const base = path.resolve(path.dirname(fromFile), specifier);
  const candidates = [base, ...EXTENSIONS.map((ext) => base + ext)];
  // `./x.js` written for a TypeScript file `./x.ts`.
  if (/\.[cm]?js$/.test(base)) candidates.push(base.replace(/\.([cm]?)js$/, '.$1ts'), base.replace(/\.js$/, '.tsx'));
  for (const candidate of candidates) {
    try {
      if (statSync(candidate).isFile()) return candidate;
    } catch {
      // not this one
    }
  }
  return null;
}

function importsOfText(file, text) {
  const found = ts.preProcessFile(text, true, true).importedFiles;
  return found
    .map((ref) => ({ target: resolveRelative(file, ref.fileName), specifier: ref.fileName, pos: ref.pos, end: ref.end }))
    .filter((ref) => ref.target !== null);
}

function importsOfFile(file) {
  let mtimeMs;
  try {
    mtimeMs = statSync(file).mtimeMs;
  } catch {
    return [];
  }
  const cached = importCache.get(file);
  if (cached && cached.mtimeMs === mtimeMs) return cached.imports;
  const imports = importsOfText(file, readFileSync(file, 'utf8')).map((ref) => ref.target);
  importCache.set(file, { mtimeMs, imports });
  return imports;
}

/** The shortest import path from `start` back to `goal` (as a list of files), or null. */
function pathBack(start, goal) {
  const previous = new Map([[start, null]]);
  const queue = [start];
  while (queue.length > 0) {
    const file = queue.shift();
    for (const next of importsOfFile(file)) {
      if (previous.has(next)) continue;
      previous.set(next, file);
      if (next === goal) {
        const route = [next];
        for (let at = file; at !== null; at = previous.get(at)) route.unshift(at);
        return route;
      }
      queue.push(next);
    }
  }
  return null;
}

export default {
  meta: {
    type: 'problem',
    docs: { description: 'Forbid import cycles, type-only imports included' },
    schema: [],
    messages: {
      cycle: 'Import cycle: {{route}}. Type-only imports count too: move what both files need into a file of its own (or an interface one side depends on).',
    },
  },
  create(context) {
    const file = context.physicalFilename;
    if (!path.isAbsolute(file)) return {};
    const root = context.cwd;
    const sourceCode = context.sourceCode;
    return {
      'Program:exit'() {
        const reported = new Set();
        for (const ref of importsOfText(file, sourceCode.text)) {
          if (reported.has(ref.target)) continue;
          const route = ref.target === file ? [file] : pathBack(ref.target, file);
          if (!route) continue;
          reported.add(ref.target);
          const names = [file, ...route].map((step) => path.relative(root, step));
          context.report({
            loc: { start: sourceCode.getLocFromIndex(ref.pos), end: sourceCode.getLocFromIndex(ref.end) },
            messageId: 'cycle',
            data: { route: names.join(' → ') },
          });
        }
      },
    };
  },
};
