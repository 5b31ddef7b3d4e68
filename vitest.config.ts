import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    setupFiles: ['tests/support/seed-setup.ts'],
    testTimeout: 120_000,
    hookTimeout: 120_000,
    // The JSON report lets .ci/run print one plain "N passed, N failed" line.
    reporters: ['default', 'json'],
    outputFile: { json: '.test-report/vitest.json' },
  },
});
