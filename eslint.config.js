import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import importX from 'eslint-plugin-import-x';

export default tseslint.config(
  { ignores: ['node_modules/**', 'coverage/**', '.tmp/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    plugins: { 'import-x': importX },
    settings: { 'import-x/resolver': { node: { extensions: ['.ts', '.js'] } } },
    rules: {
      'import-x/no-cycle': 'error',
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', ignoreRestSiblings: true },
      ],
    },
  },
  {
    // The engine is pure: it never reaches into the service layers or any I/O.
    files: ['solvers/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['**/api/**', '**/workers/**'],
              message: 'solvers/ must not import api/ or workers/.',
            },
            {
              // node:crypto is allowed: the input hash is computation, not I/O.
              group: ['hono', 'hono/*', '@hono/*', 'bullmq', 'ioredis', 'node:*', '!node:crypto'],
              message: 'solvers/ does no I/O.',
            },
          ],
        },
      ],
    },
  },
  {
    files: ['workers/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [{ group: ['**/api/**'], message: 'workers/ depends on solvers/ only.' }] },
      ],
    },
  },
);
