// One-way imports: web → api contract only via HTTP; api → domain/db; db → domain; domain → nothing with I/O.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import importX from 'eslint-plugin-import-x';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';

const restrict = (patterns) => ({
  'no-restricted-imports': ['error', { patterns }],
});

// A later block replaces an earlier block's rule, so every web block repeats the web-wide patterns.
const WEB_WIDE = [
  { group: ['@revloop/db', 'kysely', 'better-sqlite3', 'express', '@revloop/api', '../../api/*', 'node:*'], message: 'apps/web talks to the server only over /api.' },
];

export default tseslint.config(
  { ignores: ['**/node_modules/**', '**/dist/**', 'data/**', 'test-results/**', 'playwright-report/**', '.tmp/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    plugins: { 'import-x': importX },
    languageOptions: { globals: { ...globals.node } },
    rules: {
      '@typescript-eslint/consistent-type-imports': 'error',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'import-x/no-cycle': 'off',
      'no-console': 'off',
    },
  },
  {
    files: ['packages/domain/src/**/*.ts'],
    ignores: ['**/*.test.ts', '**/*.bench.ts'],
    rules: restrict([
      { group: ['express', 'kysely', 'better-sqlite3', 'react', 'react-dom', '@revloop/db', '@revloop/api', '@revloop/web'], message: 'packages/domain is pure: no I/O, no framework.' },
      { group: ['node:fs', 'node:fs/*', 'fs', 'node:net', 'node:http', 'node:child_process'], message: 'packages/domain does no I/O.' },
      { group: ['../../../apps/*', '../../db/*'], message: 'packages/domain imports nothing outside itself.' },
    ]),
  },
  {
    // Migrations are frozen in time, so they are typed against no schema (Kysely's own advice).
    files: ['packages/db/src/migrations/**/*.ts'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
  {
    files: ['packages/db/src/**/*.ts'],
    rules: restrict([
      { group: ['express', 'react', '@revloop/api', '@revloop/web', '../../../apps/*'], message: 'packages/db knows no HTTP and no UI.' },
    ]),
  },
  {
    files: ['apps/api/src/**/*.ts'],
    rules: restrict([{ group: ['react', 'react-dom', '@revloop/web', '../../web/*'], message: 'apps/api does not import the web app.' }]),
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
    files: ['apps/web/src/components/**', 'apps/web/src/lib/**', 'apps/web/src/config/**'],
    rules: restrict([...WEB_WIDE, { group: ['@/features/*', '@/app/*', '../features/*', '../../features/*', '../app/*', '../../app/*'], message: 'shared web code does not import features or app.' }]),
  },
  {
    files: ['apps/web/src/features/**'],
    rules: restrict([...WEB_WIDE, { group: ['@/app/*', '../../app/*', '../../../app/*'], message: 'features do not import app routes.' }]),
  },
  {
    // Tests run in Node and may read fixtures from disk; they never ship.
    files: ['apps/web/src/**/*.test.{ts,tsx}'],
    rules: restrict([{ group: ['@revloop/db', '@revloop/api', 'express'], message: 'web tests do not reach into the server.' }]),
  },
);
