import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    setupFiles: ['test/setup.ts'],
    pool: 'forks',
    testTimeout: 120_000,
    hookTimeout: 120_000,
    reporters: ['default', ['json', { outputFile: 'test-results.json' }]],
  },
});
