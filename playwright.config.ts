import { defineConfig } from '@playwright/test';
import { CHROMIUM_ARGS, chromiumPath } from './scripts/chromium';

// Debian's Chromium, never a downloaded browser (scripts/chromium.ts says where it is looked for).
const executablePath = chromiumPath();

const PORT = Number(process.env.E2E_PORT ?? 4173);
const baseURL = process.env.PLAYWRIGHT_BASE_URL ?? `http://localhost:${PORT}`;

export default defineConfig({
  testDir: 'e2e',
  // Bounds, not waits: every step waits on a state and a passing run never sits out a timeout. They
  // are wide because the suite must pass on a loaded two-core machine, where one reload can take seconds.
  timeout: 120_000,
  expect: { timeout: 20_000 },
  fullyParallel: false,
  workers: 1,
  retries: 0,
  reporter: process.env.CI ? [['list']] : [['list']],
  use: {
    baseURL,
    viewport: { width: 1280, height: 800 },
    trace: 'retain-on-failure',
    screenshot: 'only-on-failure',
    launchOptions: {
      executablePath,
      args: CHROMIUM_ARGS,
    },
  },
  // The built app with a fresh, seeded database of its own.
  webServer: process.env.PLAYWRIGHT_BASE_URL
    ? undefined
    : {
        // Its console goes to a file: one-time links (invitations, resets) are printed there, never
        // shown in the outbox, and the specs read them from it (e2e/fixtures.ts, oneTimeLinkFor).
        command: 'rm -rf .tmp/e2e && mkdir -p .tmp/e2e && npx tsx server/index.ts > .tmp/e2e/server.log',
        url: `${baseURL}/api/health`,
        reuseExistingServer: false,
        timeout: 120_000,
        stdout: 'ignore',
        stderr: 'pipe',
        env: {
          PORT: String(PORT),
          HOST: '127.0.0.1',
          APP_ORIGIN: baseURL,
          DATABASE_PATH: '.tmp/e2e/stripwarden.db',
          PASSWORD_HASH_COST: 'test',
          SMTP_FAKE_PORT: '0',
          SIGNIN_RATE_LIMIT: '1000',
          LOG_REQUESTS: 'off',
          // Every answer checked against its contract while the specs run (a mismatch is a 500).
          CHECK_RESPONSES: 'on',
        },
      },
});
