import { defineConfig } from 'vitest/config';

// Browser journeys against a running Stavemark (npm start): one file at a time, one browser each.
export default defineConfig({
  test: {
    root: new URL('.', import.meta.url).pathname,
    include: ['**/*.e2e.test.ts'],
    environment: 'node',
    fileParallelism: false,
    maxWorkers: 1,
    testTimeout: 120_000,
    hookTimeout: 120_000,
  },
});
