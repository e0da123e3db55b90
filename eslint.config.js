// One-way imports: web → contract/domain (and the API over HTTP); api → contract/db/domain/stand-ins; contract → domain; db → domain; domain → nothing with I/O.
import fs from 'node:fs';
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import importX, { createNodeResolver } from 'eslint-plugin-import-x';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';

const restrict = (patterns) => ({
  'no-restricted-imports': ['error', { patterns }],
});

// Module names the web must never load; folder boundaries are the zones below.
const WEB_WIDE = [
  { group: ['@revloop/db', 'kysely', 'better-sqlite3', 'express', '@revloop/api', 'node:*'], message: 'apps/web talks to the server only over /api.' },
];

const FEATURES = 'apps/web/src/features';
// The only modules one web feature may import from another: each feature's query endpoints and these few components.
const SHARED_FEATURE_MODULES = [
  'auth/api/get-me.ts',
  'customers/api/get-customers.ts',
  'jobs/api/get-jobs.ts',
  'kits/api/get-kits.ts',
  'kits/api/get-kit.ts',
  'kits/api/get-kit-bookings.ts',
  'members/api/get-members.ts',
  'notifications/api/get-notifications.ts',
  'packages/api/get-packages.ts',
  'vehicles/api/get-vehicles.ts',
  'files/api/get-job-files.ts',
  // The files list offers the job's own Checkout beside a revision locked until paid.
  'billing/api/start-checkout.ts',
  'datalogs/components/progress-bar.tsx',
  'jobs/components/intake-errors.ts',
  'jobs/components/cautions.tsx',
  'jobs/components/intake-vehicle-fields.tsx',
  'kits/components/month-calendar.tsx',
  'vehicles/components/rolling-circumference-form.tsx',
  'vehicles/components/vehicle-units.ts',
];
const featureNames = fs
  .readdirSync(new URL(FEATURES, import.meta.url), { withFileTypes: true })
  .filter((entry) => entry.isDirectory())
  .map((entry) => entry.name);

// Zones are folders resolved from this file, so the rules bite however deep a relative path climbs.
const ZONES = [
  { target: 'packages/domain', from: ['packages/db', 'packages/contract', 'packages/stand-ins', 'apps', 'seeds', 'scripts'], message: 'packages/domain imports nothing outside itself.' },
  { target: 'packages/contract', from: ['packages/db', 'packages/stand-ins', 'apps', 'seeds', 'scripts'], message: 'packages/contract imports only packages/domain.' },
  { target: 'packages/stand-ins', from: ['packages/db', 'packages/domain', 'packages/contract', 'apps', 'seeds', 'scripts'], message: 'packages/stand-ins imitate hosted services and know nothing of Revloop.' },
  { target: 'packages/db', from: ['apps', 'seeds', 'scripts', 'packages/contract', 'packages/stand-ins'], message: 'packages/db imports only packages/domain.' },
  { target: 'apps/api', from: ['apps/web', 'scripts', 'seeds'], message: 'apps/api imports only packages/db and packages/domain.' },
  { target: 'apps/web', from: ['apps/api', 'packages/db', 'packages/stand-ins', 'seeds', 'scripts'], message: 'apps/web imports only packages/contract and packages/domain; it reaches the API over /api.' },
  {
    target: ['apps/web/src/components', 'apps/web/src/lib', 'apps/web/src/config'],
    from: ['apps/web/src/features', 'apps/web/src/app'],
    message: 'shared web code does not import features or app.',
  },
  { target: FEATURES, from: 'apps/web/src/app', message: 'features do not import app routes.' },
  ...featureNames.map((name) => ({
    target: `${FEATURES}/${name}`,
    from: FEATURES,
    except: [`./${name}`, ...SHARED_FEATURE_MODULES],
    message: `features import another feature only through the shared modules named in eslint.config.js (SHARED_FEATURE_MODULES).`,
  })),
];

export default tseslint.config(
  { ignores: ['**/node_modules/**', '**/dist/**', 'data/**', 'test-results/**', 'playwright-report/**', '.tmp/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    plugins: { 'import-x': importX },
    languageOptions: { globals: { ...globals.node } },
    settings: {
      'import-x/extensions': ['.ts', '.tsx', '.js', '.mjs'],
      'import-x/parsers': { '@typescript-eslint/parser': ['.ts', '.tsx'] },
      // Workspace packages resolve through their node_modules symlinks to the real src files.
      'import-x/resolver-next': [
        createNodeResolver({ extensions: ['.ts', '.tsx', '.js', '.mjs', '.json'], conditionNames: ['types', 'import', 'default'] }),
      ],
    },
    rules: {
      '@typescript-eslint/consistent-type-imports': 'error',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'import-x/no-cycle': 'error',
      'import-x/no-restricted-paths': ['error', { basePath: import.meta.dirname, zones: ZONES }],
      'no-console': 'off',
    },
  },
  {
    files: ['packages/domain/src/**/*.ts'],
    ignores: ['**/*.test.ts', '**/*.bench.ts'],
    rules: restrict([
      { group: ['express', 'kysely', 'better-sqlite3', 'react', 'react-dom', '@revloop/db', '@revloop/api', '@revloop/web'], message: 'packages/domain is pure: no I/O, no framework.' },
      { group: ['node:fs', 'node:fs/*', 'fs', 'node:net', 'node:http', 'node:child_process'], message: 'packages/domain does no I/O.' },
    ]),
  },
  {
    // Migrations are frozen in time, so they are typed against no schema (Kysely's own advice).
    files: ['packages/db/src/migrations/**/*.ts'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
  {
    files: ['packages/db/src/**/*.ts'],
    rules: restrict([{ group: ['express', 'react', '@revloop/api', '@revloop/web'], message: 'packages/db knows no HTTP and no UI.' }]),
  },
  {
    files: ['apps/api/src/**/*.ts'],
    rules: restrict([{ group: ['react', 'react-dom', '@revloop/web'], message: 'apps/api does not import the web app.' }]),
  },
  {
    // Zones see resolved files, and a package name resolves into its folder, so seeds are held to package names here.
    files: ['seeds/**/*.ts'],
    rules: restrict([
      { group: ['**/apps/**', '**/packages/**', '@revloop/*/src/**'], message: 'seeds import only the public exports of @revloop/api, @revloop/db and @revloop/domain.' },
      { group: ['@revloop/web', '@revloop/contract', '@revloop/stand-ins'], message: 'seeds import only @revloop/api, @revloop/db and @revloop/domain.' },
    ]),
  },
  {
    files: ['apps/web/src/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    plugins: { 'react-hooks': reactHooks },
    rules: {
      ...reactHooks.configs.recommended.rules,
      'react-hooks/set-state-in-effect': 'off',
      ...restrict(WEB_WIDE),
    },
  },
  {
    // Tests run in Node and may read fixtures from disk; they never ship.
    files: ['apps/web/src/**/*.test.{ts,tsx}'],
    rules: restrict([{ group: ['@revloop/db', '@revloop/api', 'express'], message: 'web tests do not reach into the server.' }]),
  },
);
