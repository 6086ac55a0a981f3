// The hall's Wi-Fi drops while Sam tests Strip 20: the test-lead null set offline and the readings
// typed with it are kept on the tablet with their verdicts, survive a reload with no network, and
// reach the server exactly once, in one batch, when the network is back (even when its answer is
// lost on the way), each reading naming that null, which is sent before them. A reading whose step
// the director removed meanwhile ends as a problem Sam can see and decide on, not as a loss.
import type { Page } from '@playwright/test';
import { apiAs, expect, signIn, test, openVenueLink } from './fixtures';

// The service worker in (the config blocks it): it is what serves the app with no network.
test.use({ serviceWorkers: 'allow' });

// navigator.onLine is the browser's guess, and after the offline reload below it is wrong on
// purpose: with a second DevTools client on the tab (as when someone watches with DevTools open),
// Chromium reports the reloaded page online, with no offline event, while every request fails. A
// hall's Wi-Fi with no route to the server looks the same. The indicator must still say Offline.

const STRIP = 'Strip 20'; // not started in the demo scenario, no conductive piste: 4 cable items × 7 steps

function valueFor(step: string, position: number): string {
  const [kind] = step.split(' ');
  if (kind === 'continuity') return position < 2 ? '0.5' : '1.3';
  if (kind === 'insulation') return 'OL';
  return position < 2 ? '1.0' : '2.5';
}

interface TableRow {
  id: string;
  stripLabel: string;
  stepId: string;
  valueText: string;
  valueOhm: number | null;
  leadOffsetOhm: number | null;
  leadNullId: string | null;
  leadNullMeter: string | null;
  takenAt: string;
  receivedAt: string | null;
}

const indicator = (page: Page) => page.getByTestId('sync-indicator');

/** A second DevTools client on the page (it only listens), like DevTools opened beside the test. */
const attachSecondDebugger = (page: Page) => page.context().newCDPSession(page);

/** The query keys in the copy of the cache written to the tablet's IndexedDB (idb-keyval's default store). */
function savedQueryKeys(page: Page): Promise<string[]> {
  return page.evaluate(
    () =>
      new Promise<string[]>((resolve, reject) => {
        const open = indexedDB.open('keyval-store');
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const db = open.result;
          if (!db.objectStoreNames.contains('keyval')) return resolve([]);
          const get = db.transaction('keyval').objectStore('keyval').get('stripwarden.query-cache');
          get.onerror = () => reject(get.error);
          get.onsuccess = () => {
            const saved = get.result ? (JSON.parse(get.result as string) as { clientState: { queries: { queryKey: unknown[] }[] } }) : null;
            resolve(saved ? saved.clientState.queries.map((q) => JSON.stringify(q.queryKey)) : []);
            db.close();
          };
        };
      }),
  );
}

/**
 * Sam, online, opens the venue (its strips are put on the tablet) and the service worker takes the
 * page over: it is what serves the app once the network is gone.
 */
async function openVenueWithServiceWorker(page: Page) {
  await signIn(page, 'technician');
  await page.goto('/');
  await openVenueLink(page).click();
  await expect(page.getByLabel('Go to strip number')).toBeVisible();
  await page.evaluate(async () => {
    await navigator.serviceWorker.ready;
  });
  await page.reload();
  await expect.poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null)).toBe(true);
}

/** From the venue page: strip `label` opened by its number, its safety notice acknowledged. */
async function startTesting(page: Page, number: string, label: string) {
  await page.getByLabel('Go to strip number').fill(number);
  await page.keyboard.press('Enter');
  await expect(page.getByRole('heading', { name: `${label} — testing` })).toBeVisible();
  await page.getByRole('button', { name: 'I understand — start testing' }).click();
}

test('readings typed offline survive a reload, reach the server exactly once, and a removed step ends as a visible problem', async ({
  page,
  context,
  browser,
}) => {
  const directorContext = await browser.newContext();
  const director = await directorContext.newPage();
  await signIn(director, 'director');
  await openVenueWithServiceWorker(page);
  await expect(page).toHaveURL(/\/venues\/[^/]+$/);
  const venueId = new URL(page.url()).pathname.split('/')[2]!;
  await expect(indicator(page)).toHaveAttribute('data-state', 'up-to-date');
  await expect(indicator(page)).toHaveText('Online · all sent');

  await startTesting(page, '20', STRIP);
  const stripId = new URL(page.url()).pathname.split('/')[2]!;
  // The next strip was never opened, but the venue page kept it on the tablet.
  const nextStripId = (await page.getByRole('link', { name: 'Next strip →' }).getAttribute('href'))!;
  // The venue's strips are on the tablet's disk (this one and the next) before the network goes.
  const nextStripKey = JSON.stringify(['strips', nextStripId.split('/')[2]]);
  await expect.poll(() => savedQueryKeys(page)).toEqual(expect.arrayContaining([JSON.stringify(['strips', stripId]), nextStripKey]));

  // The network goes.
  await context.setOffline(true);
  await expect(indicator(page)).toHaveAttribute('data-state', 'offline');

  // Offline, Sam nulls the test leads: 0.1 Ω with the tips touching, subtracted from every reading.
  await page.getByRole('button', { name: 'Null the leads' }).click();
  await page.getByLabel('Leads with tips touching read (Ω)').fill('0.1');
  await page.getByLabel('Meter (optional)').fill('Meter 1');
  await page.keyboard.press('Enter');
  await expect(page.getByTestId('lead-null')).toContainText('0.1 Ω');

  const rows = page.locator('li[data-step]');
  await expect(rows).toHaveCount(28);
  const positions = page.locator('section[aria-label]');
  for (let p = 0; p < (await positions.count()); p++) {
    const steps = positions.nth(p).locator('li[data-step]');
    for (let s = 0; s < (await steps.count()); s++) {
      const row = steps.nth(s);
      const input = row.locator('input[id^="reading-"]');
      // Focus on the next step's input is the sign that the previous reading is kept.
      await expect(input).toBeFocused();
      await page.keyboard.type(valueFor((await row.getAttribute('data-step'))!, p - 1));
      await page.keyboard.press('Enter');
    }
  }
  // Each has its verdict from the tablet, and waits to be sent.
  const queued = page.getByTestId('queued');
  await expect(rows.filter({ has: queued.filter({ hasText: 'Waiting to send' }).filter({ hasText: 'Pass' }) })).toHaveCount(28);
  await expect(indicator(page)).toHaveText('Offline · 28 readings waiting');

  // Meanwhile the director takes one of those steps off the checklist (the director is online).
  const lastRow = rows.nth(27);
  const removedStepId = (await lastRow.locator('input[id^="reading-"]').getAttribute('id'))!.replace('reading-', '');
  const venue = await director.request.get(`/api/venues/${venueId}`);
  const origin = new URL(test.info().project.use.baseURL!).origin;
  const removed = await director.request.delete(`/api/steps/${removedStepId}`, {
    headers: { Origin: origin, 'If-Match': venue.headers()['etag']! },
  });
  expect(removed.status(), await removed.text()).toBeLessThan(300);

  // A reload with no network: the screen comes back with the queue and the verdicts, and knows it
  // is offline although the browser now says online.
  const debuggerSession = await attachSecondDebugger(page);
  await page.reload();
  expect(
    await page.evaluate(() => navigator.onLine),
    'precondition: Chromium reports this page online (if not, the test no longer covers a wrong navigator.onLine)',
  ).toBe(true);
  await expect(page.getByRole('heading', { name: `${STRIP} — testing` })).toBeVisible();
  await expect(page.getByTestId('queued')).toHaveCount(28);
  await expect(page.getByTestId('queued').filter({ hasText: 'Pass' })).toHaveCount(28);
  await expect(indicator(page)).toHaveText('Offline · 28 readings waiting');
  // The strip's own sticky bar says the same, and counts the readings still on the tablet.
  await expect(page.getByTestId('strip-bar-sync')).toHaveAttribute('data-state', 'offline');
  await expect(page.getByTestId('strip-bar-sync')).toHaveText('Offline · 28 readings waiting');
  await expect(page.getByTestId('strip-bar-progress')).toHaveText('28 of 28 measured · 28 waiting to send');
  await page.screenshot({ path: test.info().outputPath('offline-after-reload.png'), fullPage: true });
  // Walking to the next strip works offline too.
  await page.goto(nextStripId);
  await expect(page.getByRole('heading', { name: 'Strip 21 — testing' })).toBeVisible();
  await page.goBack();
  await expect(page.getByRole('heading', { name: `${STRIP} — testing` })).toBeVisible();

  // The first answer is lost on the way back (the server has the readings, the tablet does not
  // know): the replay must not record them twice. 28 readings waiting go as one batch.
  let lost = 0;
  const sent = { single: 0, batch: 0 };
  const order: string[] = [];
  await context.route(/\/api\/lead-nulls$/, async (route) => {
    if (route.request().method() === 'POST') order.push('lead-null');
    return route.continue();
  });
  await context.route(/\/api\/readings(\/batch)?$/, async (route) => {
    if (route.request().method() !== 'POST') return route.continue();
    order.push('readings');
    if (route.request().url().endsWith('/batch')) sent.batch += 1;
    else sent.single += 1;
    if (lost === 0) {
      lost += 1;
      await route.fetch();
      return route.abort('connectionreset');
    }
    return route.continue();
  });

  // The network is back (the page gets no online event: its browser never said offline): the
  // tablet finds the server by itself and the queue goes out in order.
  const backOnline = new Date().toISOString();
  await context.setOffline(false);
  // The tablet asks the server again at most 5 s apart, then sends 28 readings in order.
  await expect(indicator(page)).toHaveAttribute('data-state', 'needs-you', { timeout: 60_000 });
  await expect(indicator(page)).toHaveText('1 needs you');
  expect(lost).toBe(1);
  // The lost batch and its replay: two requests for 28 readings, none sent one by one.
  expect(sent).toEqual({ single: 0, batch: 2 });
  // The null set offline went first, once (the server has it for the replay).
  expect(order).toEqual(['lead-null', 'readings', 'readings']);

  // The server holds each reading exactly once: 27 readings of Strip 20, one per remaining step.
  const table = await apiAs<TableRow[]>(director, 'GET', `/api/venues/${venueId}/readings`);
  expect(table.status).toBe(200);
  const strip20 = table.body.filter((r) => r.stripLabel === STRIP);
  expect(strip20).toHaveLength(27);
  expect(new Set(strip20.map((r) => r.id)).size).toBe(27);
  expect(new Set(strip20.map((r) => r.stepId)).size).toBe(27);
  expect(strip20.some((r) => r.stepId === removedStepId)).toBe(false);
  // Each counts at the time it was typed, not when the network came back to send it.
  for (const r of strip20) {
    expect(r.takenAt < backOnline, `${r.takenAt} taken before ${backOnline}`).toBe(true);
    expect(r.receivedAt! >= backOnline, `${r.receivedAt} received after ${backOnline}`).toBe(true);
  }
  // Every one names the null set offline (recorded on the server before them) and has it subtracted.
  const nullIds = new Set(strip20.map((r) => r.leadNullId));
  expect(nullIds.size).toBe(1);
  expect([...nullIds][0]).toBeTruthy();
  for (const r of strip20) {
    expect(r.leadOffsetOhm).toBe(0.1);
    expect(r.leadNullMeter).toBe('Meter 1');
    if (r.valueText !== 'OL') expect(r.valueOhm).toBeCloseTo(Number(r.valueText) - 0.1, 9);
  }
  await expect(page.getByTestId('strip-status')).toContainText('Clear');
  // Latest shows the value judged, with its unit, and what was typed.
  const firstCable = page.locator('section[aria-label="Left floor cable"] li[data-step]').first();
  await expect(firstCable.getByTestId('latest')).toContainText('0.4 Ω');
  await expect(firstCable.getByTestId('latest-typed')).toHaveText('typed 0.5 Ω − 0.1 Ω lead null');
  await page.screenshot({ path: test.info().outputPath('strip-after-sync.png'), fullPage: true });

  // The reading of the removed step is a problem with what to do, its value kept.
  await indicator(page).click();
  await expect(page.getByRole('heading', { name: 'Readings on this tablet' })).toBeVisible();
  const problem = page.getByTestId('problem');
  await expect(problem).toHaveCount(1);
  await expect(problem).toHaveAttribute('data-kind', 'step-removed');
  await expect(problem).toContainText('Its step was taken off the checklist');
  await expect(problem).toContainText(STRIP);
  // 2.5 Ω typed less the 0.1 Ω lead null.
  await expect(problem.getByTestId('queued-value')).toHaveText('2.4 Ω');
  await expect(problem.getByLabel('Record it on')).toBeVisible();
  await page.screenshot({ path: test.info().outputPath('problem-list.png'), fullPage: true });

  // Setting it aside is an explicit choice, and the value stays listed.
  await problem.getByRole('button', { name: 'Set it aside…' }).click();
  await problem.getByRole('button', { name: 'Yes, do not send it' }).click();
  await expect(page.getByTestId('problem')).toHaveCount(0);
  await expect(page.getByTestId('set-aside')).toContainText('2.4 Ω');
  await expect(indicator(page)).toHaveText('Online · all sent');

  // Still exactly once after everything settled.
  const after = await apiAs<TableRow[]>(director, 'GET', `/api/venues/${venueId}/readings`);
  expect(after.body.filter((r) => r.stripLabel === STRIP)).toHaveLength(27);
  expect(stripId).toBeTruthy();
  await debuggerSession.detach();
  await directorContext.close();
});

test('a fault record saved meanwhile by someone else: the technician sees both versions and chooses', async ({ page, browser }) => {
  const directorContext = await browser.newContext();
  const director = await directorContext.newPage();
  await signIn(director, 'director');
  await signIn(page, 'technician');
  const origin = new URL(test.info().project.use.baseURL!).origin;
  const venues = await apiAs<{ id: string; name: string }[]>(director, 'GET', '/api/venues');
  const hall = venues.body.find((v) => v.name === 'Riverside Sports Hall')!;
  const faults = await apiAs<{ id: string }[]>(director, 'GET', `/api/venues/${hall.id}/faults`);
  const faultId = faults.body[0]!.id;

  await page.goto(`/faults/${faultId}`);
  await page.getByLabel('Notes on this fault').fill('Jacket crushed near the 7 m mark.');
  // The director saves first, with the current version.
  const current = await director.request.get(`/api/faults/${faultId}`);
  const theirs = await director.request.patch(`/api/faults/${faultId}`, {
    data: { notes: 'Leave it for the repair bench.' },
    headers: { Origin: origin, 'If-Match': current.headers()['etag']! },
  });
  expect(theirs.status()).toBe(200);

  await page.getByRole('button', { name: 'Save notes' }).click();
  const conflict = page.getByTestId('notes-conflict');
  await expect(conflict.getByRole('region', { name: 'Yours (not saved)' })).toContainText('Jacket crushed near the 7 m mark.');
  await expect(conflict.getByRole('region', { name: /Theirs \(saved now/ })).toContainText('Leave it for the repair bench.');
  await expect(conflict.getByRole('button', { name: 'Re-apply mine over theirs' })).toBeEnabled();
  await conflict.getByRole('button', { name: 'Re-apply mine over theirs' }).click();
  await expect(conflict).toBeHidden();
  const after = await apiAs<{ notes: string }>(director, 'GET', `/api/faults/${faultId}`);
  expect(after.body.notes).toBe('Jacket crushed near the 7 m mark.');
  await directorContext.close();
});

test('a reading the server has just confirmed is on the tablet before it leaves the queue: a reload with no network at once still shows it', async ({
  page,
  context,
}) => {
  await openVenueWithServiceWorker(page);

  await startTesting(page, '22', 'Strip 22'); // not started in the demo scenario
  const first = page.locator('li[data-step]').first();
  await expect(first.locator('input[id^="reading-"]')).toBeFocused();
  await page.keyboard.type('0.5');
  await page.keyboard.press('Enter');
  // The server's answer is in: the row shows the recorded reading, nothing of it waits in the queue.
  await expect(first.getByTestId('latest')).toContainText('0.5');
  await expect(first.getByTestId('queued')).toHaveCount(0);
  await expect(indicator(page)).toHaveText('Online · all sent');

  // The network goes that instant, and the tablet reloads.
  await context.setOffline(true);
  await page.reload();
  await expect(page.getByRole('heading', { name: 'Strip 22 — testing' })).toBeVisible();
  await expect(indicator(page)).toHaveAttribute('data-state', 'offline');
  await expect(first.getByTestId('latest')).toContainText('0.5');
  // The saved copy agrees with itself: a measured step means the strip is under way.
  await expect(page.getByTestId('strip-status')).toContainText('In progress');
  await context.setOffline(false);
});

test.describe('on a tablet-size screen', () => {
  test.use({ viewport: { width: 1024, height: 768 }, hasTouch: true });

  test('after an offline reload, the grid focuses the next cell to measure, not the one whose reading waits to send', async ({
    page,
    context,
  }) => {
    await openVenueWithServiceWorker(page);

    await startTesting(page, '23', 'Strip 23'); // not started in the demo scenario
    const grid = page.getByTestId('entry-grid');
    const input = (step: string) => grid.locator('tr[data-position="Left floor cable"]').locator(`[data-cell="${step}"] input`);
    await expect(input('continuity A')).toBeFocused();
    // The strip is on the tablet's disk before the network goes (the saved copy is written at most once a second).
    const stripId = new URL(page.url()).pathname.split('/')[2]!;
    await expect.poll(() => savedQueryKeys(page)).toContain(JSON.stringify(['strips', stripId]));

    await context.setOffline(true);
    await expect(indicator(page)).toHaveAttribute('data-state', 'offline');
    await page.keyboard.type('0.5');
    await page.keyboard.press('Enter');
    await expect(input('continuity B')).toBeFocused();
    await expect(indicator(page)).toHaveText('Offline · 1 reading waiting');

    await page.reload();
    await expect(grid).toBeVisible();
    await expect(indicator(page)).toHaveAttribute('data-state', 'offline');
    await expect(input('continuity B')).toBeFocused();
    await context.setOffline(false);
    await expect(indicator(page)).toHaveText('Online · all sent');
  });
});
