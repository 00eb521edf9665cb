import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    exclude: ['node_modules/**', 'dist/**'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    pool: 'forks',
    // Two test files at a time: most tests wait on child processes (the CLI, Python references, Chromium),
    // so both cores stay busy; the default here (cores - 1) would run one file at a time.
    maxWorkers: 2,
    // The slow files first, so the end-to-end suite does not start last and alone.
    sequence: { shuffle: false },
  },
});
