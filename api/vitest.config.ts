import { defineConfig } from 'vitest/config';

// In-process API tests against a real PostgreSQL: migrations run once into a template
// database (globalSetup); each test file clones its own database from it.
export default defineConfig({
  test: {
    include: ['src/**/*.spec.ts'],
    globalSetup: ['test/support/global-setup.ts'],
    pool: 'forks',
    maxWorkers: 2,
    testTimeout: 20_000,
    // Generous: creating an app and cloning its database takes seconds, far more on a loaded machine.
    hookTimeout: 180_000,
  },
});
