import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'],
    exclude: ['tests/bench/**', 'node_modules/**'],
    environment: 'node',
    // Two cores: keep the real-browser tests from fighting the API tests for CPU.
    fileParallelism: true,
    maxWorkers: 2,
    testTimeout: 30_000,
    hookTimeout: 120_000,
    globalSetup: ['tests/global-setup.ts'],
  },
});
