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
    // app/ is pure computation: no Electron, DOM or HTTP.
    files: ['app/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: ['electron', 'node:http', 'http', '../main/*', '../renderer/*', '**/main/**', '**/renderer/**'] }],
    },
  },
);
