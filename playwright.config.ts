import { defineConfig } from '@playwright/test';

const PORT = Number(process.env.E2E_PORT ?? 8181);
export const E2E_ORIGIN = `http://localhost:${PORT}`;

/** Browser tests drive Debian's chromium against the built app served by the API, on a fresh demo database. */
export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: '.tmp/test-results',
  fullyParallel: false,
  workers: 1,
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
