import path from 'node:path';
import { defineConfig } from 'vitest/config';

// The PostgreSQL runs of a suite: one throwaway cluster per run (tests/with-postgres.ts), a database per test file.
const onPostgres = {
  globalSetup: [path.resolve(import.meta.dirname, 'tests/with-postgres.ts')],
  setupFiles: [path.resolve(import.meta.dirname, 'tests/postgres-test-file.ts')],
  env: { REVLOOP_TEST_DB: 'postgres' },
};

// Root Vitest config: one project per workspace, all run by `npm run test:unit`.
export default defineConfig({
  test: {
    projects: [
      { test: { name: 'domain', root: 'packages/domain', include: ['src/**/*.test.ts'], environment: 'node' } },
      { test: { name: 'db', root: 'packages/db', include: ['src/**/*.test.ts'], environment: 'node' } },
      // API files share their worker's module cache (isolate: false), so the schema is migrated and the app's modules
      // are loaded once per worker, not once per file; every test still gets its own database copy (createTestApp).
      {
        test: {
          name: 'api',
          root: 'apps/api',
          include: ['src/**/*.test.ts'],
          exclude: ['src/features/recovery/crash.api.test.ts'],
          environment: 'node',
          isolate: false,
          testTimeout: 20000,
          hookTimeout: 30000,
        },
      },
      // The crash test starts and kills real servers in child processes: it keeps a worker of its own.
      { test: { name: 'api-crash', root: 'apps/api', include: ['src/features/recovery/crash.api.test.ts'], environment: 'node', testTimeout: 20000, hookTimeout: 30000 } },
      { test: { name: 'db-pg', root: 'packages/db', include: ['src/**/*.test.ts'], environment: 'node', testTimeout: 20000, hookTimeout: 60000, ...onPostgres } },
      // The API suite on PostgreSQL, every folder (DEVELOPERS.md "PostgreSQL"), and the crash test on PostgreSQL in a
      // worker of its own; REVLOOP_API_PG=0 leaves both out of a quick local run. Files share their worker's module
      // cache, as in `api`; each test app copies the template.
      ...(process.env.REVLOOP_API_PG === '0'
        ? []
        : [
            {
              test: {
                name: 'api-pg',
                root: 'apps/api',
                include: ['src/**/*.test.ts'],
                exclude: ['src/features/recovery/crash.api.test.ts'],
                environment: 'node' as const,
                isolate: false,
                testTimeout: 30000,
                hookTimeout: 60000,
                ...onPostgres,
              },
            },
            {
              test: {
                name: 'api-crash-pg',
                root: 'apps/api',
                include: ['src/features/recovery/crash.api.test.ts'],
                environment: 'node' as const,
                testTimeout: 30000,
                hookTimeout: 60000,
                ...onPostgres,
              },
            },
          ]),
      { test: { name: 'stand-ins', root: 'packages/stand-ins', include: ['src/**/*.test.ts'], environment: 'node', testTimeout: 20000 } },
      { test: { name: 'web', root: 'apps/web', include: ['src/**/*.test.{ts,tsx}'], environment: 'node' } },
      // Checks of the repository's own tooling, such as the import rules in eslint.config.js.
      { test: { name: 'tooling', root: '.', include: ['scripts/**/*.test.ts'], environment: 'node' } },
    ],
  },
});
