import { defineConfig, type Project } from '@playwright/test';
import { CHROMIUM_ARGS, chromiumPath } from './scripts/chromium';

// Debian's Chromium, never a downloaded browser (scripts/chromium.ts says where it is looked for).
const executablePath = chromiumPath();

const PORT = Number(process.env.E2E_PORT ?? 4173);

/**
 * The suite in two halves that run side by side, each with a server and a fresh seeded database of
 * its own, its files one after the other in name order: what a spec finds is what the specs
 * before it in its own half left, the same on every run. The accessibility audits (read-only, a
 * good third of the time) go with the few specs that keep the halves about even.
 */
const WITH_AUDITS = ['accessibility.spec.ts', 'auth.spec.ts', 'caching.spec.ts', 'navigation.spec.ts', 'time-zone.spec.ts'];
const HALVES: Project[] = [
  { name: 'audits', testMatch: WITH_AUDITS },
  { name: 'flows', testIgnore: WITH_AUDITS },
];

function server(index: number) {
  const port = PORT + index;
  const dir = `.tmp/e2e/${HALVES[index]!.name}`;
  const baseURL = `http://localhost:${port}`;
  return {
    baseURL,
    serverLog: `${dir}/server.log`,
    webServer: {
      // Its console goes to a file: one-time links (invitations, resets) are printed there, never
      // shown in the outbox, and the specs read them from it (e2e/fixtures.ts, oneTimeLinkFor).
      command: `rm -rf ${dir} && mkdir -p ${dir} && npx tsx server/index.ts > ${dir}/server.log`,
      url: `${baseURL}/api/health`,
      reuseExistingServer: false,
      timeout: 120_000,
      stdout: 'ignore' as const,
      stderr: 'pipe' as const,
      env: {
        PORT: String(port),
        HOST: '127.0.0.1',
        APP_ORIGIN: baseURL,
        DATABASE_PATH: `${dir}/stripwarden.db`,
        PASSWORD_HASH_COST: 'test',
        SMTP_FAKE_PORT: '0',
        SIGNIN_RATE_LIMIT: '1000',
        LOG_REQUESTS: 'off',
        // Every answer checked against its contract while the specs run (a mismatch is a 500).
        CHECK_RESPONSES: 'on',
      },
    },
  };
}

// A server of your own (PLAYWRIGHT_BASE_URL): one database for all, so the specs run in one line.
const own = process.env.PLAYWRIGHT_BASE_URL;
const servers = own ? [] : HALVES.map((_, i) => server(i));
const projects: Project[] = own
  ? [{ name: 'all', workers: 1, use: { baseURL: own }, metadata: { serverLog: process.env.E2E_SERVER_LOG ?? '' } }]
  : HALVES.map((half, i) => ({
      ...half,
      workers: 1,
      use: { baseURL: servers[i]!.baseURL },
      metadata: { serverLog: servers[i]!.serverLog },
    }));

export default defineConfig({
  testDir: 'e2e',
  // Bounds, not waits: every step waits on a state and a passing run never sits out a timeout. They
  // are wide because the suite must pass on a loaded two-core machine, where one reload can take seconds.
  timeout: 120_000,
  expect: { timeout: 20_000 },
  fullyParallel: false,
  // One worker per half.
  workers: projects.length,
  retries: 0,
  reporter: [['list']],
  use: {
    viewport: { width: 1280, height: 800 },
    // The service worker precaches the whole app (some 2.6 MB) in every new browser context: only
    // the specs of work done offline let it in (test.use in offline.spec.ts and incidents.spec.ts).
    serviceWorkers: 'block',
    trace: 'retain-on-failure',
    screenshot: 'only-on-failure',
    launchOptions: {
      executablePath,
      args: CHROMIUM_ARGS,
    },
  },
  projects,
  webServer: servers.map((s) => s.webServer),
});
