import { defineConfig } from 'vitest/config';

const shared = {
  environment: 'node' as const,
  testTimeout: 30_000,
  hookTimeout: 120_000,
};

export default defineConfig({
  test: {
    // Two cores: two test files at a time.
    maxWorkers: 2,
    projects: [
      { test: { ...shared, name: 'unit', include: ['tests/shared/**/*.test.ts', 'tests/server/**/*.test.ts', 'tests/app/**/*.test.ts?(x)'] } },
      // Only the browser tests need the built client; their setup builds it once.
      { test: { ...shared, name: 'e2e', include: ['tests/e2e/**/*.test.ts'], globalSetup: ['tests/global-setup.ts'] } },
    ],
  },
});
