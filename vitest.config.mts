import { defineConfig } from 'vitest/config';

// One suite: unit (shared), api (server + real PostgreSQL), worker, e2e (real browser).
// The global set-up starts the private test cluster with scripts/db.sh and migrates a template
// database; each test file clones its own database from it (tests/helpers/db.ts).
export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    globalSetup: ['tests/setup/global-db.ts'],
    testTimeout: 30_000,
    hookTimeout: 120_000,
    pool: 'forks',
    maxWorkers: 2,
    reporters: ['default'],
  },
});
