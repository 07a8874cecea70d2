// ESLint flat config. Kept in .config/ so the project's top level stays as the contributor guide
// describes; `npm run lint` passes it with -c. basePath points the patterns at the project root.
import { readdirSync } from 'node:fs';
import path from 'node:path';
import js from '@eslint/js';
import { createNodeResolver, importX } from 'eslint-plugin-import-x';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';
import noImportCycle from './eslint-rules/no-import-cycle.js';

// Every client feature folder, read when the config loads, so a new feature gets its zone without an edit here.
const features = readdirSync(path.join(import.meta.dirname, '..', 'src', 'features'), { withFileTypes: true })
  .filter((entry) => entry.isDirectory())
  .map((entry) => entry.name);

const nodeOnly = ['node:*', 'fs', 'path', 'os', 'child_process', 'worker_threads', 'http', 'crypto', 'url'];

export default tseslint.config(
  { basePath: '..' },
  { ignores: ['dist/**', 'node_modules/**', 'data/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    // No module reaches itself through its imports, type-only imports included.
    files: ['**/*.{ts,tsx}'],
    plugins: { tautline: { rules: { 'no-import-cycle': noImportCycle } } },
    rules: { 'tautline/no-import-cycle': 'error' },
  },
  {
    files: ['**/*.cjs'],
    languageOptions: { sourceType: 'commonjs', globals: globals.node },
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
  {
    // Tests build malformed input on purpose.
    files: ['tests/**/*.ts'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
  {
    // shared/ is pure: no I/O, no DOM, nothing from the server or the client.
    files: ['shared/**/*.ts'],
    languageOptions: { globals: {} },
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['**/server/**', '**/src/**', '../server/*', '../src/*'], message: 'shared/ must not import from server/ or src/.' },
            { group: nodeOnly, message: 'shared/ is pure TypeScript: no Node.js modules.' },
            { group: ['react', 'react-dom', 'konva', 'tone', 'express'], message: 'shared/ must not depend on UI or server libraries.' },
          ],
        },
      ],
      'no-restricted-globals': ['error', 'document', 'window', 'fetch', 'setTimeout', 'setInterval', 'process', 'Date'],
      'no-console': 'error',
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [{ group: ['**/server/**', '../server/*'], message: 'The client must not import server code; share it through shared/.' }] },
      ],
    },
  },
  {
    files: ['server/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [{ group: ['**/src/**', '../src/*'], message: 'The server must not import client code; share it through shared/.' }] },
      ],
    },
  },
  {
    // React's rules of hooks, and effects/memos/callbacks that list what they read.
    files: ['src/**/*.{ts,tsx}', 'tests/client/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'error' },
  },
  {
    // A feature uses only itself, src/components, src/lib and shared/ (and npm packages); pages in
    // src/app compose features. What two features need moves to src/components (UI) or src/lib.
    files: ['src/features/**/*.{ts,tsx}'],
    plugins: { 'import-x': importX },
    settings: { 'import-x/resolver-next': [createNodeResolver({ extensions: ['.ts', '.tsx', '.js'] })] },
    rules: {
      'import-x/no-restricted-paths': [
        'error',
        {
          zones: features.map((feature) => ({
            target: `./src/features/${feature}`,
            from: './src',
            except: [`./features/${feature}`, './components', './lib'],
            message: `A feature imports only itself, src/components, src/lib and shared/. Move what ${feature} shares with another feature to src/components (UI) or src/lib.`,
          })),
        },
      ],
    },
  },
  {
    // Time on the server comes from the injected clock (context.clock); server/clock.ts is the one system clock.
    files: ['server/**/*.ts'],
    ignores: ['server/clock.ts'],
    rules: {
      'no-restricted-syntax': [
        'error',
        {
          selector: "NewExpression[callee.name='Date'][arguments.length=0]",
          message: 'Take the time from the injected clock (context.clock(), or a clock passed in), not new Date().',
        },
        {
          selector: "CallExpression[callee.object.name='Date'][callee.property.name='now']",
          message: 'Take the time from the injected clock (context.clock(), or a clock passed in), not Date.now().',
        },
      ],
    },
  },
);
