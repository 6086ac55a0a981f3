import { test as base, expect, type Page } from '@playwright/test';

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

/** Same-origin JSON call from the page's context (sends the session cookie and our Origin). */
export async function apiAs<T = unknown>(page: Page, method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE', path: string, data?: unknown) {
  const origin = new URL(test.info().project.use.baseURL!).origin;
  const res = await page.request.fetch(path, { method, data, headers: { Origin: origin } });
  const body = (res.headers()['content-type'] ?? '').includes('json') ? await res.json() : await res.text();
  return { status: res.status(), body: body as T };
}

export const test = base.extend<{ signIn: (role: DemoRole) => Promise<void> }>({
  signIn: async ({ page }, use) => {
    await use((role) => signIn(page, role));
  },
});
export { expect };
