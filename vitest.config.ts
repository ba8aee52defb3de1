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
      // The server API tests again on PostgreSQL, each test app on a fresh database made through
      // TEST_DATABASE_URL (an admin URL, e.g. postgres://postgres@127.0.0.1:5433/postgres).
      ...(process.env.TEST_DATABASE_URL
        ? [{ test: { ...shared, name: 'server-pg', include: ['tests/server/**/*.test.ts'], env: { GRIDSET_TEST_PG: '1' } } }]
        : []),
      // Only the browser tests need the built client; their setup builds it once.
      { test: { ...shared, name: 'e2e', include: ['tests/e2e/**/*.test.ts'], globalSetup: ['tests/global-setup.ts'] } },
    ],
  },
});
