import { defineConfig } from '@playwright/test';

const PORT = Number(process.env.E2E_PORT ?? 8181);
export const E2E_ORIGIN = `http://localhost:${PORT}`;

/**
 * Read-only checks of whole pages (layout widths, axe scans, reports): they change no data, so they run beside the
 * flows and among themselves in parallel. Every other spec, including new ones, is a flow.
 */
const PAGES = ['accessibility.spec.ts', 'layout.spec.ts', 'reports.spec.ts'];

/**
 * Browser tests drive Debian's chromium against the built app served by the API, on a fresh demo database.
 * Projects: `setup` signs each demo account in once through the form and saves its session (sessions.setup.ts);
 * `flows` (tests that change data) then run one at a time in file order, while `pages` take the second worker.
 */
export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: '.tmp/test-results',
  fullyParallel: false,
  workers: Number(process.env.E2E_WORKERS ?? 2),
  projects: [
    { name: 'setup', testMatch: /sessions\.setup\.ts$/, fullyParallel: true },
    { name: 'flows', testIgnore: [/sessions\.setup\.ts$/, ...PAGES], dependencies: ['setup'], workers: 1 },
    { name: 'pages', testMatch: PAGES, dependencies: ['setup'], fullyParallel: true },
  ],
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  use: {
    baseURL: E2E_ORIGIN,
    browserName: 'chromium',
    screenshot: 'only-on-failure',
    trace: 'off',
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-quic',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--disable-dev-shm-usage',
      ],
    },
  },
  webServer: {
    command: 'bash scripts/e2e-server.sh',
    url: `http://127.0.0.1:${PORT}/api/health`,
    reuseExistingServer: false,
    timeout: 120_000,
    stdout: 'pipe',
    stderr: 'pipe',
    env: { E2E_PORT: String(PORT) },
  },
});
