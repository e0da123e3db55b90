import { defineConfig } from 'vitest/config';

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
      { test: { name: 'stand-ins', root: 'packages/stand-ins', include: ['src/**/*.test.ts'], environment: 'node', testTimeout: 20000 } },
      { test: { name: 'web', root: 'apps/web', include: ['src/**/*.test.{ts,tsx}'], environment: 'node' } },
      // Checks of the repository's own tooling, such as the import rules in eslint.config.js.
      { test: { name: 'tooling', root: '.', include: ['scripts/**/*.test.ts'], environment: 'node' } },
    ],
  },
});
