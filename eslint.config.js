// Lint rules: the recommended sets of ESLint and typescript-eslint, nothing exotic.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import globals from 'globals';

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'tests/e2e/screenshots/**', 'tests/fixtures/**/*.nc', 'coverage/**', '**/*.as.ts'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-explicit-any': 'error',
    },
  },
  {
    // app/ is pure computation: no Electron, DOM or HTTP; it knows the transport contract only as types.
    files: ['app/**/*.ts'],
    rules: {
      'no-restricted-imports': 'off',
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['electron', 'node:http', 'http', '../main/*', '../renderer/*', '**/main/**', '**/renderer/**'], message: 'app/ is pure computation.' },
            { group: ['**/contract/**'], allowTypeImports: true, message: 'app/ takes only types from the transport contract.' },
          ],
        },
      ],
    },
  },
  {
    // contract/ is what both sides agree on: it imports nothing from either side.
    files: ['contract/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: ['**/app/**', '**/main/**', '**/renderer/**', 'electron', 'node:*'] }],
    },
  },
  {
    // The screen takes the core as types only, except the pure drawing code (app/render, app/figures) and the
    // small dependency-free result cache and number format; values it shares with main/ come from contract/.
    files: ['renderer/**/*.ts'],
    rules: {
      'no-restricted-imports': 'off',
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              regex: '(^|/)app/(?!render/|figures/|promise-cache\\.js$|output/number-format\\.js$)',
              allowTypeImports: true,
              message: 'The renderer imports the core as types only (except app/render, app/figures, the number format).',
            },
            { group: ['**/main/**', 'electron', 'node:*'], message: 'The renderer runs in the page: no main/, Electron or Node imports.' },
          ],
        },
      ],
    },
  },
  {
    // main/ reaches the screen's agreements through contract/, never the renderer's own files.
    files: ['main/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['**/renderer/**'], message: 'main/ imports the transport contract from contract/.' }] }],
    },
  },
);
