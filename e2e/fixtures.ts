import { test as base, expect, type Page } from '@playwright/test';
import { existsSync, readFileSync } from 'node:fs';

export const DEMO_PASSWORD = 'demo-strip-2026';
export const DEMO_USERS = {
  admin: 'ada@lakeshore.example',
  organiser: 'nina@lakeshore.example',
  director: 'marco@lakeshore.example',
  technician: 'sam@lakeshore.example',
  annexTechnician: 'lee@lakeshore.example',
} as const;
export type DemoRole = keyof typeof DEMO_USERS;

/** Signs in through the API (fast); the browser context keeps the session cookie. */
export async function signIn(page: Page, role: DemoRole) {
  const baseURL = test.info().project.use.baseURL!;
  const res = await page.request.post('/api/auth/sign-in', {
    data: { email: DEMO_USERS[role], password: DEMO_PASSWORD },
    headers: { Origin: new URL(baseURL).origin },
  });
  expect(res.status(), `sign-in as ${role}`).toBe(200);
}

/**
 * The "Open venue" link of one venue on the home page: other specs add venues of their own (the
 * technician of the demo is assigned to them too), so the venue is named.
 */
export function openVenueLink(page: Page, venue = 'Riverside Sports Hall') {
  return page
    .getByRole('listitem')
    .filter({ has: page.getByRole('heading', { name: venue, exact: true }) })
    .getByRole('link', { name: 'Open venue' });
}

/** Same-origin JSON call from the page's context (sends the session cookie and our Origin). */
export async function apiAs<T = unknown>(page: Page, method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE', path: string, data?: unknown) {
  const origin = new URL(test.info().project.use.baseURL!).origin;
  const res = await page.request.fetch(path, { method, data, headers: { Origin: origin } });
  const body = (res.headers()['content-type'] ?? '').includes('json') ? await res.json() : await res.text();
  return { status: res.status(), body: body as T };
}

/**
 * The one-time link the server printed on its console for this address (the local SMTP fake keeps
 * it out of the outbox). Each half's test server writes its console to a file of its own
 * (playwright.config.ts); with a server of your own (PLAYWRIGHT_BASE_URL), point E2E_SERVER_LOG at
 * its console output.
 */
export async function oneTimeLinkFor(email: string): Promise<string> {
  const log = String(test.info().project.metadata.serverLog ?? '');
  let link = '';
  await expect
    .poll(
      () => {
        const lines = existsSync(log) ? readFileSync(log, 'utf8').split('\n') : [];
        const line = lines.filter((l) => l.includes(`One-time link for ${email} `)).at(-1);
        link = /https?:\/\/\S+\/set-password\/[A-Za-z0-9_-]+/.exec(line ?? '')?.[0] ?? '';
        return link;
      },
      { message: `the server printed a one-time link for ${email} (${log})` },
    )
    .not.toBe('');
  return link;
}

export const test = base.extend<{ signIn: (role: DemoRole) => Promise<void> }>({
  signIn: async ({ page }, use) => {
    await use((role) => signIn(page, role));
  },
});
export { expect };
