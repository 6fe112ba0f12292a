import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    // One throwaway PostgreSQL server for the run, started in the background (test/support/postgres.ts).
    globalSetup: ['test/support/postgres-setup.ts'],
    testTimeout: 60_000,
    hookTimeout: 60_000,
    // The suites render the committed examples; recording them would leave record files beside the jobs
    // and let one test's brief change the next one's. The record's own tests turn it back on.
    env: { TRENDBRIEF_RECORD: 'never' },
  },
});
