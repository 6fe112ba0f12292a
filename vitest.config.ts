import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    // One throwaway PostgreSQL server for the run, started in the background (test/support/postgres.ts).
    globalSetup: ['test/support/postgres-setup.ts'],
    testTimeout: 60_000,
    hookTimeout: 60_000,
  },
});
