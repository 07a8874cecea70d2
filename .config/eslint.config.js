// ESLint flat config. Kept in .config/ so the project's top level stays as the contributor guide
// describes; `npm run lint` passes it with -c. basePath points the patterns at the project root.
import js from '@eslint/js';
import globals from 'globals';
import tseslint from 'typescript-eslint';

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
);
