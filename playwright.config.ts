import { defineConfig } from '@playwright/test';
import { existsSync } from 'node:fs';
import { delimiter, join } from 'node:path';

// Debian's Chromium, never a downloaded browser: CHROMIUM_PATH, or `chromium` on PATH.
function findChromium(): string {
  const fromEnv = process.env.CHROMIUM_PATH;
  if (fromEnv) {
    if (!existsSync(fromEnv)) throw new Error(`CHROMIUM_PATH is set to ${fromEnv}, but there is no file there.`);
    return fromEnv;
  }
  for (const dir of (process.env.PATH ?? '').split(delimiter)) {
    for (const name of ['chromium', 'chromium-browser']) {
      const candidate = join(dir, name);
      if (existsSync(candidate)) return candidate;
    }
  }
  throw new Error(
    'Chromium was not found. The end-to-end tests need it: on Debian run `apt-get install chromium`, or set CHROMIUM_PATH to the browser.',
  );
}

const PORT = Number(process.env.E2E_PORT ?? 4173);
const baseURL = process.env.PLAYWRIGHT_BASE_URL ?? `http://localhost:${PORT}`;

export default defineConfig({
  testDir: 'e2e',
  timeout: 60_000,
  expect: { timeout: 10_000 },
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
      executablePath: findChromium(),
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-quic',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
      ],
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
        },
      },
});
