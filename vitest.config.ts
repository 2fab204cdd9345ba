import { defineConfig } from 'vitest/config';

// One run covers unit, API and browser suites. Files run one at a time because
// the API and browser suites share one MariaDB test database.
export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    globalSetup: ['tests/support/global-setup.ts'],
    fileParallelism: false,
    testTimeout: 60_000,
    hookTimeout: 120_000,
    // A poll waits for the page, not for a speed target: a busy 2-core machine can take seconds
    // to answer the first search after an index load.
    expect: { poll: { timeout: 15_000 } },
  },
});
