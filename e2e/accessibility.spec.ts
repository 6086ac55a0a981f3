// WCAG 2.2 AA, checked by axe-core (Deque, https://github.com/dequelabs/axe-core; the rule tags are
// the WCAG levels, https://www.w3.org/TR/WCAG22/) on every screen each role of the demo can reach,
// and the 14 px floor for what a technician reads to decide on the testing screen. Read-only: no
// screen here is submitted, so the specs after this one find the demo as it was.
import { createHash } from 'node:crypto';
import AxeBuilder from '@axe-core/playwright';
import type { Browser, Page } from '@playwright/test';
import { CERTIFICATE_STATUSES, type Verification } from '../shared/contracts/certificates';
import { apiAs, DEMO_PASSWORD, expect, signIn, test, type DemoRole } from './fixtures';

const WCAG_22_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];
const BLOCKING = new Set(['serious', 'critical']);

type Finding = { screen: string; id: string; impact: string; help: string; targets: string[] };

/** Waits for the screen to have drawn its data: a main heading (or a refusal) and no "Loading…" left. */
async function settled(page: Page, what = page.url()) {
  await expect(page.locator('h1, [role=alert]').first(), `${what} shows its heading`).toBeVisible();
  await expect(page.getByRole('status').filter({ hasText: /^Loading/ })).toHaveCount(0);
}

async function audit(page: Page, screen: string, only?: string): Promise<Finding[]> {
  const t0 = Date.now();
  // Legacy mode: axe runs in the page itself. The default runs each frame apart and joins the
  // results in a blank page opened for each audit, which doubles its cost; the app has no frames.
  // Only violations are collected in full (passing nodes are not listed).
  const builder = new AxeBuilder({ page })
    .withTags(WCAG_22_AA)
    .setLegacyMode(true)
    .options({ resultTypes: ['violations'] });
  if (only) builder.include(only);
  const { violations } = await builder.analyze();
  // A11Y_TIMES=1 prints what each audit costs, to keep the spec short.
  if (process.env.A11Y_TIMES) console.log(`${Date.now() - t0} ms ${screen} (${await page.locator('*').count()} elements)`);
  return violations
    .filter((v) => BLOCKING.has(v.impact ?? ''))
    .map((v) => ({ screen, id: v.id, impact: v.impact!, help: v.help, targets: v.nodes.map((n) => n.target.join(' ')) }));
}

/**
 * What each screen drew (without the header, which names the person), once audited: a screen a
 * second role sees with the very same markup gets the same answer from axe, so it is not audited
 * again.
 */
const audited = new Set<string>();
async function alreadyAudited(page: Page, route: string) {
  const markup = await page.evaluate(() => {
    const copy = document.body.cloneNode(true) as HTMLElement;
    copy.querySelector('[data-testid="app-header"]')?.remove();
    return copy.innerHTML;
  });
  const key = `${route} ${createHash('sha256').update(markup).digest('hex')}`;
  if (audited.has(key)) return true;
  audited.add(key);
  return false;
}

function report(findings: Finding[]) {
  return findings.map((f) => `${f.screen}: ${f.id} (${f.impact}) — ${f.help}\n    ${f.targets.join('\n    ')}`).join('\n');
}

/** The route a path belongs to: ids and certificate numbers made generic. */
function routeOf(path: string) {
  return path
    .split('/')
    .map((s) => (/^[0-9a-f]{8}-[0-9a-f-]{27}$/i.test(s) || /^\d+$/.test(s) || /^SW-/i.test(s) ? ':id' : s))
    .join('/');
}

/** Links to screens of the app on this page (not downloads or API files). */
async function screenLinks(page: Page): Promise<string[]> {
  const hrefs = await page.locator('a[href^="/"]:not([download])').evaluateAll((as) => as.map((a) => a.getAttribute('href')!));
  return hrefs.map((h) => h.split(/[?#]/)[0]!).filter((h) => !h.startsWith('/api/') && !/\.(csv|pdf|zip|json)$/.test(h));
}

interface Venue {
  id: string;
  name: string;
  eventId: string;
}

/** The screens each role is sent to first; every further screen linked from them is then visited too. */
async function startingScreens(page: Page, role: DemoRole) {
  const venues = (await apiAs<Venue[]>(page, 'GET', '/api/venues')).body;
  const hall = venues.find((v) => v.name === 'Riverside Sports Hall')!;
  const faults = (await apiAs<{ id: string }[]>(page, 'GET', `/api/venues/${hall.id}/faults`)).body;
  const plan = (await apiAs<{ strips: { id: string; label: string }[] }>(page, 'GET', `/api/venues/${hall.id}`)).body;
  // Half measured: the grid has measured, failed and empty cells.
  const strip11 = plan.strips.find((s) => s.label === 'Strip 11')!;
  const screens = [
    '/',
    `/venues/${hall.id}`,
    `/venues/${hall.id}/board`,
    `/venues/${hall.id}/readings`,
    `/venues/${hall.id}/sign-off`,
    `/venues/${hall.id}/certificates`,
    `/faults/${faults[0]!.id}`,
    `/strips/${strip11.id}/test`,
    '/equipment',
    '/fault-locator',
    '/on-this-tablet',
    '/events',
    `/events/${hall.eventId}`,
    '/profiles',
  ];
  if (role !== 'technician') screens.push(`/venues/${hall.id}/plan`, `/venues/${hall.id}/audit`);
  if (role === 'admin' || role === 'director') screens.push('/equipment/import');
  if (role === 'admin') screens.push('/people', '/people/outbox');
  // The annex is ready: its sign-off page shows the form (the hall's shows what is missing).
  const annex = venues.find((v) => v.name === 'Riverside Annex')!;
  if (role === 'director') screens.push(`/venues/${annex.id}/sign-off`);
  return screens;
}

async function visitAll(browser: Browser, role: DemoRole) {
  const context = await browser.newContext();
  const page = await context.newPage();
  await signIn(page, role);
  const screens = await startingScreens(page, role);
  const findings: Finding[] = [];
  const seen = new Set<string>();
  const visited = new Set<string>();
  // The starting screens are each visited; a linked screen only when its route was not yet.
  const queue = screens.map((path) => ({ path, listed: true }));
  while (queue.length) {
    const { path, listed } = queue.shift()!;
    const route = routeOf(path);
    if (listed ? visited.has(path) : seen.has(route)) continue;
    seen.add(route);
    visited.add(path);
    await page.goto(path);
    // The testing screen opens on its safety notice: checked as it is, then each layout behind it.
    if (route === '/strips/:id/test' && role !== 'organiser' && role !== 'admin') {
      await expect(page.getByRole('alertdialog')).toBeVisible();
      // The page behind it is checked once the notice is acknowledged.
      findings.push(...(await audit(page, `${role} ${path} (safety notice)`, '[role=alertdialog]')));
      await page.getByRole('button', { name: /I understand/ }).click();
    }
    await settled(page);
    if (route === '/strips/:id/test') {
      for (const layout of ['Grid', 'Step list']) {
        await page.getByRole('group', { name: 'Layout' }).getByRole('button', { name: layout }).click();
        await expect(page.getByRole('button', { name: layout })).toHaveAttribute('aria-pressed', 'true');
        if (!(await alreadyAudited(page, `${route} ${layout}`))) findings.push(...(await audit(page, `${role} ${path} (${layout})`)));
      }
    } else if (route === '/venues/:id/readings') {
      // Every reading of the hall is some 8,000 elements and half a minute of axe on two cores: one
      // strip's rows show the same table, filters and marks.
      await page.getByLabel('Strip').selectOption({ label: 'Strip 6' });
      await expect(page.getByText(/^\d+ of \d+ readings/)).toBeVisible();
      if (!(await alreadyAudited(page, route))) findings.push(...(await audit(page, `${role} ${path} (Strip 6)`)));
    } else if (route === '/equipment') {
      // The same for the whole register: its reels show the table, filters and status marks.
      await page.getByLabel('Kind').selectOption({ label: 'Reel' });
      await expect(page.getByRole('row').filter({ hasText: /FC-\d/ })).toHaveCount(0);
      await expect(page.getByRole('row').filter({ hasText: /RL-\d/ }).first()).toBeVisible();
      if (!(await alreadyAudited(page, route))) findings.push(...(await audit(page, `${role} ${path} (reels)`)));
    } else if (!(await alreadyAudited(page, route))) {
      findings.push(...(await audit(page, `${role} ${path}`)));
    }
    for (const link of await screenLinks(page)) if (!seen.has(routeOf(link))) queue.push({ path: link, listed: false });
  }
  // On a tablet the pages sit behind the header's Menu button: the open menu, checked on its own.
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.goto('/');
  await page.getByRole('button', { name: 'Menu' }).click();
  await expect(page.getByRole('navigation', { name: 'Main' })).toBeVisible();
  findings.push(...(await audit(page, `${role} / (menu open, 1024 px)`, '[data-testid="app-header"]')));
  await context.close();
  return findings;
}

for (const role of ['technician', 'director', 'organiser', 'admin'] as const) {
  test(`every screen a ${role} can reach has no serious or critical WCAG 2.2 AA violation`, async ({ browser }) => {
    // A bound, not a wait: some 20 screens, each audited in 1–3 s on a quiet two-core machine and
    // several times that when other work shares it.
    test.setTimeout(300_000);
    const findings = await visitAll(browser, role);
    expect(findings, `axe-core found:\n${report(findings)}`).toEqual([]);
  });
}

test('the screens before signing in have no serious or critical WCAG 2.2 AA violation', async ({ page }) => {
  const findings: Finding[] = [];
  for (const path of ['/sign-in', '/reset-password', '/verify', '/verify/SW-2026-AAAA-AAAA-A']) {
    await page.goto(path);
    await expect(page.locator('h1').first()).toBeVisible();
    await expect(page.getByRole('status').filter({ hasText: /^Loading/ })).toHaveCount(0);
    findings.push(...(await audit(page, path)));
  }
  // The answer for a certificate in each status (none is issued before sign-off.spec.ts runs; the
  // answer is made here, typed by the contract, so the screen is checked in every state).
  for (const status of CERTIFICATE_STATUSES) {
    const number = 'SW-2026-TEST-0001-A';
    const answer: Verification = {
      status,
      number,
      kind: 'venue',
      event: 'Autumn Cup 2026',
      eventDates: { startsOn: '2026-10-10', endsOn: '2026-10-11' },
      venue: 'Riverside Annex',
      timeZone: 'Europe/London',
      supersededPendingSince: null,
      successorNumber: null,
      amendments: [],
      outOfService: [],
      strips: ['Strip A1', 'Strip A2'],
      notCovering:
        status === 'valid'
          ? [{ strip: 'Strip A2', number: 'SW-2026-TEST-0002-B', revokedAt: '2026-10-10T09:00:00Z', revokedReason: 'Reel replaced' }]
          : [],
      organisation: 'Lakeshore Fencing League',
      issuedAt: '2026-10-09T18:00:00Z',
      signedBy: 'Marco Dal Bello',
      signedAt: '2026-10-09T18:00:00Z',
      profile: { name: 'Competition default', version: 1 },
      items: 10,
      readings: 60,
      supersededAt: status === 'superseded' ? '2026-10-10T08:00:00Z' : null,
      revokedAt: status === 'revoked' ? '2026-10-10T08:00:00Z' : null,
      revokedReason: status === 'revoked' ? 'Signed before the last retest' : null,
      keyId: 'key-2026-1',
      jws: 'eyJhbGciOiJFZERTQSJ9.e30.c2ln',
      pdfSha256: 'a'.repeat(64),
      verifyUrl: `http://localhost/verify/${number}`,
    };
    await page.route(`**/api/verify/${number}`, (route) => route.fulfill({ json: answer }));
    await page.goto(`/verify/${number}`);
    await expect(page.getByText(number).first()).toBeVisible();
    findings.push(...(await audit(page, `/verify/${number} (${status})`)));
  }
  // A refused sign-in shows its message in the form.
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill('nobody@lakeshore.example');
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toBeVisible();
  findings.push(...(await audit(page, '/sign-in (refused)')));
  expect(findings, `axe-core found:\n${report(findings)}`).toEqual([]);
});

/** Visible text drawn under 14 CSS px (SVG text at its drawn size), with where it is. */
function smallText(page: Page) {
  return page.evaluate((minPx) => {
    const found: string[] = [];
    const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
    while (walker.nextNode()) {
      const text = walker.currentNode.textContent!.trim();
      const el = walker.currentNode.parentElement;
      if (!text || !el) continue;
      const box = el.getBoundingClientRect();
      const style = getComputedStyle(el);
      if (box.width === 0 || box.height === 0 || style.visibility === 'hidden' || el.closest('[aria-hidden="true"]:not(svg)')) continue;
      const svg = el instanceof SVGElement ? el.closest('svg') : null;
      const px = parseFloat(style.fontSize) * (svg?.getScreenCTM()?.a ?? 1);
      const where =
        el.closest('[data-testid], [data-cell], section, aside, header, tr')?.getAttribute('data-testid') ?? el.tagName.toLowerCase();
      if (px < minPx) found.push(`${px.toFixed(1)} px "${text.slice(0, 60)}" (${el.tagName.toLowerCase()}.${el.className} in ${where})`);
    }
    return found;
  }, 14);
}

// 14 px: the smallest text the technician reads to decide (values, limits, verdicts, step names,
// the sync bar, cautions), held above WCAG's 1.4.4 resize floor as common practice for a tablet
// read at arm's length in a hall.
test('everything on the testing screen a technician reads to decide is at least 14 px', async ({ browser }) => {
  const context = await browser.newContext({ viewport: { width: 1024, height: 768 }, hasTouch: true });
  const page = await context.newPage();
  await signIn(page, 'technician');
  const venues = (await apiAs<Venue[]>(page, 'GET', '/api/venues')).body;
  const hall = venues.find((v) => v.name === 'Riverside Sports Hall')!;
  const plan = (await apiAs<{ strips: { id: string; label: string }[] }>(page, 'GET', `/api/venues/${hall.id}`)).body;
  // Strip 6 has a failure and its fault; Strip 11 is half measured.
  const small: string[] = [];
  for (const label of ['Strip 6', 'Strip 11']) {
    await page.goto(`/strips/${plan.strips.find((s) => s.label === label)!.id}/test`);
    if (label === 'Strip 6') {
      await expect(page.getByRole('alertdialog')).toBeVisible();
      small.push(...(await smallText(page)).map((s) => `${label} safety notice: ${s}`));
      await page.getByRole('button', { name: /I understand/ }).click();
    }
    const grid = page.getByTestId('entry-grid');
    await expect(grid).toBeVisible();
    if (label === 'Strip 6') {
      // Every step measured: the panel offers the next strip.
      await expect(page.getByRole('link', { name: /Strip complete/ })).toBeVisible();
      small.push(...(await smallText(page)).map((s) => `${label} grid: ${s}`));
    } else {
      // Focus on the first cell not measured, with its limit and source.
      await expect(page.getByTestId('grid-limit')).toBeVisible();
      small.push(...(await smallText(page)).map((s) => `${label} grid: ${s}`));
      // A measured cell shows its latest value and verdict in the panel.
      await grid.locator('[data-cell]:not([data-verdict="not-measured"]) input').first().focus();
      await expect(page.getByTestId('grid-focus')).toContainText('Latest');
      small.push(...(await smallText(page)).map((s) => `${label} grid, a measured cell: ${s}`));
      await page.screenshot({ path: 'test-results/a11y-grid-1024x768.png' });
    }
    await page.getByRole('group', { name: 'Layout' }).getByRole('button', { name: 'Step list' }).click();
    await expect(page.locator('section').first()).toBeVisible();
    small.push(...(await smallText(page)).map((s) => `${label} step list: ${s}`));
    if (label === 'Strip 11') await page.screenshot({ path: 'test-results/a11y-step-list-1024x768.png', fullPage: true });
    // Back to the grid for the next strip (the layout is remembered).
    await page.getByRole('group', { name: 'Layout' }).getByRole('button', { name: 'Grid' }).click();
  }
  await context.close();
  expect(small, `text under 14 px:\n${small.join('\n')}`).toEqual([]);
});
