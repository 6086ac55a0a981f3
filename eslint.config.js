// One lint gate for the whole repo. The import rules keep the architecture of DEVELOPERS.md
// visible: src → shared, server → shared, shared → nothing but zod; in src, app → features →
// components and lib (never back), features do not import each other; no import cycles.
// tests/lint/import-boundaries.test.ts feeds a probe file per forbidden direction through this.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import { importX } from 'eslint-plugin-import-x';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import globals from 'globals';
import { readdirSync, existsSync } from 'node:fs';

const features = existsSync('src/features') ? readdirSync('src/features') : [];

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'migrations/**', '.tmp/**', 'test-results/**', 'playwright-report/**', 'bench/results/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    plugins: { 'import-x': importX },
    settings: {
      'import-x/resolver-next': [createTypeScriptImportResolver({ project: './tsconfig.json' })],
    },
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      'import-x/no-cycle': ['error', { maxDepth: 10 }],
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-non-null-assertion': 'off',
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
      'no-restricted-imports': [
        'error',
        { patterns: [{ group: ['**/server/**', '../server/*'], message: 'The client never imports the server.' }] },
      ],
      'import-x/no-restricted-paths': [
        'error',
        {
          zones: [
            ...features.map((f) => ({
              target: `./src/features/${f}`,
              from: './src/features',
              except: [`./${f}`],
              message: 'A feature does not import another feature; compose them in a page.',
            })),
            {
              target: './src/features',
              from: './src/app',
              message: 'A feature does not import app code (routes, router, provider); pages import features.',
            },
            {
              target: ['./src/components', './src/lib'],
              from: ['./src/features', './src/app'],
              message: 'components/ and lib/ know no business words: they import no feature or app code.',
            },
          ],
        },
      ],
    },
  },
  {
    files: ['server/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['**/src/**', '@/*'], message: 'The server never imports the client.' }] }],
    },
  },
  {
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              regex: '^(?!zod$|\\.{1,2}/).*',
              message: 'shared/ imports nothing but zod and itself: it runs in the browser and the server.',
            },
            { group: ['**/server/**', '**/src/**'], message: 'shared/ imports neither the client nor the server.' },
          ],
        },
      ],
    },
  },
  // The one date module may use date-fns and its time-zone package as well (both run in the browser and Node).
  {
    files: ['shared/format/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              regex: '^(?!zod$|date-fns$|date-fns/locale/[a-zA-Z-]+$|@date-fns/tz$|\\.{1,2}/).*',
              message: 'shared/format imports only zod, date-fns (and its locales) and @date-fns/tz.',
            },
            { group: ['**/server/**', '**/src/**'], message: 'shared/ imports neither the client nor the server.' },
          ],
        },
      ],
    },
  },
  // Size limits for the server (issue 14): a file over 350 lines or a function over 80 lines of code
  // is a sign that it does several jobs. A factory counts with the functions it holds.
  {
    files: ['server/**/*.ts'],
    rules: {
      'max-lines': ['error', { max: 350 }],
      'max-lines-per-function': ['error', { max: 80, skipBlankLines: true, skipComments: true }],
    },
  },
);
