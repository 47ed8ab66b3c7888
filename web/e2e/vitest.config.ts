import { defineConfig } from 'vitest/config';

// Vitest sets process.env.BASE_URL to Vite's base path ('/') inside the tests, so the server URL
// is read here, in the config, and handed to the tests as E2E_BASE_URL.
const fromEnv = [process.env.E2E_BASE_URL, process.env.BASE_URL].find(
  (u) => u && /^https?:\/\//.test(u),
);
const baseUrl = fromEnv ?? 'http://localhost:3000';

// Browser journeys against a running Stavemark (npm start): one file at a time, one browser each.
export default defineConfig({
  // The journeys read the navigation table from the app's source (src/app/navigation.ts).
  resolve: { alias: { '@': new URL('../src', import.meta.url).pathname } },
  test: {
    root: new URL('.', import.meta.url).pathname,
    include: ['**/*.e2e.test.ts'],
    environment: 'node',
    fileParallelism: false,
    maxWorkers: 1,
    testTimeout: 120_000,
    hookTimeout: 120_000,
    env: { E2E_BASE_URL: baseUrl },
  },
});
