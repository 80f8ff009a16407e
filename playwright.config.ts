import { defineConfig, devices } from '@playwright/test';

// Browser tests run in Debian's chromium (installed by `npm test`); nothing downloads a browser.
// The app under test is the real server with its fakes, against the e2e database npm test made.
const PORT = Number(process.env.E2E_PORT ?? 4300);
export const BASE_URL = `http://127.0.0.1:${PORT}`;

export default defineConfig({
  testDir: 'e2e/tests',
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [['list'], ['json']],
  outputDir: `.data/test-results-${PORT}`,
  use: {
    baseURL: BASE_URL,
    trace: 'retain-on-failure',
    screenshot: 'only-on-failure',
    launchOptions: {
      executablePath: '/usr/bin/chromium',
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'],
    },
  },
  projects: [{ name: 'chromium', use: { ...devices['Desktop Chrome'], viewport: { width: 1440, height: 900 }, channel: undefined } }],
  webServer: {
    command: 'node node_modules/.bin/tsx e2e/fixtures/serve.ts',
    url: `${BASE_URL}/api/health`,
    reuseExistingServer: false,
    timeout: 60_000,
    stdout: 'pipe',
    stderr: 'pipe',
    env: {
      NODE_ENV: 'test',
      PORT: String(PORT),
      PUBLIC_URL: BASE_URL,
      DATABASE_URL: process.env.E2E_DATABASE_URL ?? '',
      FAKE_OAUTH_PORT: String(PORT + 1),
      FAKE_SMTP_PORT: String(PORT + 2),
      MAILBOX_DIR: `.data/e2e-mailbox-${PORT}`,
      STORAGE_DIR: `.data/e2e-storage-${PORT}`,
      // Browser tests do not depend on the machine's free space (the API tests check the reserve).
      UPLOAD_DISK_RESERVE_BYTES: '0',
      // The journeys read the "footage ready" mail right after verification (batching is tested in the API tests).
      FOOTAGE_READY_BATCH_SECONDS: '0',
    },
  },
});
