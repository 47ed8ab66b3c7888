// E2E tests: jest + supertest against the running server at API_URL (started by
// api/scripts/test-all.sh on a fresh, seeded database). Nest itself is never loaded here:
// NestJS 12 is ESM-only and jest cannot load it in-process on Node 20 (toolchain.md).
module.exports = {
  rootDir: '.',
  testMatch: ['<rootDir>/*.e2e-spec.ts'],
  testEnvironment: 'node',
  transform: { '^.+\\.ts$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.e2e.json' }] },
  testTimeout: 30000,
  maxWorkers: 1,
};
