// A competition day on a tablet: a signed-off venue of this spec's own (so it depends on no other
// spec's order), a strip goes dark, the technician opens an incident from the board, swaps in a
// tested spare, retests its connection, resolves; the director amends the venue; the public check
// lists the amendment and the old strip certificate names its successor.
import { randomUUID } from 'node:crypto';
import type { Page } from '@playwright/test';
import { apiAs, DEMO_PASSWORD, expect, signIn, test } from './fixtures';

// The service worker in (the config blocks it): the incident form must open with the network gone.
test.use({ viewport: { width: 1024, height: 768 }, serviceWorkers: 'allow' });

interface Plan {
  venue: { id: string; version: number };
  strips: {
    id: string;
    label: string;
    positions: { id: string; name: string; steps: { id: string; testKind: string; conductors: string }[] }[];
  }[];
}
interface StripDetail {
  positions: { id: string; steps: { id: string; testKind: string }[] }[];
}

/** Passing values for a 12 m floor cable (default profile: 2.5 Ω continuity, insulation open, loop under 5 Ω). */
const passing = (testKind: string) => (testKind === 'insulation' ? 'OL' : testKind === 'loop' ? '1.0' : '0.5');

async function planEdit(page: Page, method: 'POST' | 'PUT', path: string, version: number, data: unknown) {
  const origin = new URL(test.info().project.use.baseURL!).origin;
  const res = await page.request.fetch(path, { method, data, headers: { Origin: origin, 'If-Match': `"${version}"` } });
  expect(res.status(), `${method} ${path}`).toBeLessThan(300);
  return (await res.json()) as Plan;
}

async function recordAll(page: Page, steps: { id: string; testKind: string }[]) {
  for (const s of steps) {
    const r = await apiAs(page, 'POST', '/api/readings', { id: randomUUID(), stepId: s.id, value: passing(s.testKind) });
    expect(r.status, `reading on ${s.testKind}`).toBe(201);
  }
}

/** One strip, one floor cable, a spare of the same kind tested in the pool, signed off by the director. */
async function signedOffVenue(director: Page) {
  const stamp = Date.now().toString(36).toUpperCase();
  const events = await apiAs<{ id: string }[]>(director, 'GET', '/api/events');
  const profiles = await apiAs<{ id: string }[]>(director, 'GET', '/api/profiles');
  const people = await apiAs<{ technicians: { id: string; email: string }[] }>(director, 'GET', '/api/planning/people');
  const sam = people.body.technicians.find((t) => t.email === 'sam@lakeshore.example')!;
  const created = await apiAs<Plan>(director, 'POST', `/api/events/${events.body[0].id}/venues`, {
    name: `Incident Hall ${stamp}`,
    profileId: profiles.body[0].id,
  });
  expect(created.status).toBe(201);
  const venueId = created.body.venue.id;
  let plan = await planEdit(director, 'POST', `/api/venues/${venueId}/strips/bulk`, created.body.venue.version, {
    labels: ['Bout 1'],
    template: [{ name: 'Left floor cable', equipmentKind: 'floor-cable' }],
  });
  plan = await planEdit(director, 'PUT', `/api/venues/${venueId}/technicians`, plan.venue.version, { userIds: [sam.id] });
  const installed = `FC-${stamp}-1`;
  const spare = `FC-${stamp}-S`;
  for (const assetTag of [installed, spare]) {
    const r = await apiAs(director, 'POST', '/api/equipment', {
      assetTag,
      kind: 'floor-cable',
      lengthM: 12,
      description: 'Floor cable for the incident day',
    });
    expect(r.status, `register ${assetTag}`).toBe(201);
  }
  const position = plan.strips[0].positions[0];
  plan = await planEdit(director, 'PUT', `/api/positions/${position.id}/equipment`, plan.venue.version, { assetTag: installed });
  await recordAll(
    director,
    plan.strips[0].positions.flatMap((p) => p.steps),
  );

  // The spare is tested before the event with its kind's checklist, on the pool's own strip.
  const pool = await apiAs<{ stripId: string }>(director, 'PUT', `/api/venues/${venueId}/spares`, { assetTags: [spare] });
  expect(pool.status, JSON.stringify(pool.body)).toBe(200);
  const poolStrip = await apiAs<StripDetail>(director, 'GET', `/api/strips/${pool.body.stripId}`);
  await recordAll(
    director,
    poolStrip.body.positions.flatMap((p) => p.steps),
  );

  const signed = await apiAs<{ certificates: { number: string; kind: string }[] }>(director, 'POST', `/api/venues/${venueId}/sign-off`, {
    password: DEMO_PASSWORD,
    statement: 'Bout 1 tested with its spare before doors.',
  });
  expect(signed.status, 'sign-off').toBe(201);
  const venueCertificate = signed.body.certificates.find((c) => c.kind === 'venue')!.number;
  const stripCertificate = signed.body.certificates.find((c) => c.kind === 'strip')!.number;
  return { venueId, stripId: plan.strips[0].id, poolStripId: pool.body.stripId, installed, spare, venueCertificate, stripCertificate };
}

test('an incident on a signed-off venue: opened from the board, a spare swapped in and retested, resolved, amended, verified', async ({
  page,
  browser,
}) => {
  const shots = test.info().outputPath.bind(test.info());
  const directorContext = await browser.newContext({ viewport: { width: 1024, height: 768 } });
  const director = await directorContext.newPage();
  await signIn(director, 'director');
  const v = await signedOffVenue(director);

  // The spares page shows the spare as tested.
  await director.goto(`/venues/${v.venueId}/spares`);
  await expect(director.locator(`[data-spare="${v.spare}"] [data-tested]`)).toHaveAttribute('data-tested', 'yes');
  await director.screenshot({ path: shots('spares.png'), fullPage: true });

  // The technician's board: two taps open an incident.
  await signIn(page, 'technician');
  await page.goto(`/venues/${v.venueId}/board`);
  const tile = page.locator('[data-strip="Bout 1"]');
  await expect(tile).toHaveAttribute('data-status', 'clear');
  await page.getByRole('button', { name: 'Report a problem on Bout 1' }).click();
  const panel = page.getByTestId('open-incident');
  await expect(panel.getByRole('button', { name: 'Left floor cable' })).toBeVisible();
  await page.screenshot({ path: shots('open-incident.png'), fullPage: true });
  await panel.getByRole('button', { name: 'Left floor cable' }).click(); // the item, optional
  await panel.getByRole('button', { name: 'Touches not showing' }).click();
  await expect(page.getByText('Incident opened on Bout 1')).toBeVisible();
  // Out of service: its own state, first on the board, with the minutes since it opened.
  await expect(tile).toHaveAttribute('data-status', 'out-of-service');
  await expect(tile.getByTestId('minutes-out')).toContainText('min out');
  await expect(page.locator('[data-count="out-of-service"]')).toContainText('1');
  await page.screenshot({ path: shots('board-out-of-service.png'), fullPage: true });

  // The testing screen: swap the tested spare in; only its connection (continuity) must be measured.
  await tile.getByRole('link').click();
  const safety = page.getByRole('alertdialog');
  await safety.getByRole('button', { name: 'I understand — start testing' }).click();
  const card = page.getByTestId('incident-card');
  await expect(card).toContainText('Touches not showing');
  await card.getByLabel('Position').selectOption({ label: `Left floor cable (${v.installed})` });
  await card.getByLabel('Spare to put in').selectOption(v.spare);
  await card.getByRole('button', { name: 'Swap it in' }).click();
  await expect(card.getByRole('list', { name: 'Swaps' })).toContainText(`${v.installed} → ${v.spare}`);
  const retest = card.getByTestId('retest-steps');
  await expect(retest.locator('li[data-why="after-swap"]').first()).toBeVisible();
  await expect(retest.locator('li[data-why="after-swap"]').first()).toContainText('Continuity');

  // Resolving before the retest is refused, and says what is missing.
  await card.getByRole('button', { name: 'Back in service' }).click();
  await expect(card.getByTestId('resolve-missing')).toContainText('Continuity');
  await page.screenshot({ path: shots('incident-missing.png'), fullPage: true });

  // Retest in the step list: type each continuity step the card asks for.
  await page.getByRole('group', { name: 'Layout' }).getByRole('button', { name: 'Step list' }).click();
  const continuity = page.locator('li[data-step^="continuity"]');
  const count = await retest.locator('li[data-done="no"]').count();
  expect(count).toBeGreaterThan(0);
  for (let i = 0; i < (await continuity.count()); i++) {
    const input = continuity.nth(i).locator('input[id^="reading-"]');
    await input.fill('0.5');
    await input.press('Enter');
    await expect(continuity.nth(i).getByTestId('latest')).toContainText('Pass');
  }
  await expect(retest.locator('li[data-done="no"]')).toHaveCount(0);
  await card.getByRole('button', { name: 'Back in service' }).click();
  await expect(card).toHaveAttribute('data-state', 'resolved');
  await page.screenshot({ path: shots('incident-resolved.png'), fullPage: true });

  // The director amends the venue: a new strip certificate, the venue certificate untouched.
  await director.goto(`/venues/${v.venueId}/incidents`);
  await expect(director.locator('[data-incident="Bout 1"]')).toHaveAttribute('data-state', 'resolved');
  await director.getByLabel('Your password, to confirm').fill(DEMO_PASSWORD);
  await director.getByRole('button', { name: /^Amend: new certificate for 1 strip/ }).click();
  const amended = director.getByTestId('amended');
  await expect(amended).toContainText('1 new strip certificate');
  await expect(amended).toContainText(v.stripCertificate);
  await director.screenshot({ path: shots('amended.png'), fullPage: true });
  const newNumber = (await amended.locator('a.font-mono').first().textContent())!.trim();
  expect(newNumber).not.toBe(v.stripCertificate);

  // Public: the venue certificate is still valid and lists the amendment; the old strip one names its successor.
  const publicContext = await browser.newContext({ viewport: { width: 768, height: 1024 } });
  const anyone = await publicContext.newPage();
  await anyone.goto(`/verify/${v.venueCertificate}`);
  await expect(anyone.getByText('Valid certificate')).toBeVisible();
  await expect(anyone.getByTestId('amendments')).toContainText(newNumber);
  await expect(anyone.getByTestId('amendments')).toContainText('Bout 1');
  await anyone.screenshot({ path: shots('verify-amendments.png'), fullPage: true });
  await anyone.goto(`/verify/${v.stripCertificate}`);
  await expect(anyone.getByTestId('successor')).toContainText(newNumber);

  // The register: the removed cable is to inspect, with the incident linked.
  const found = await apiAs<{ id: string; assetTag: string }[]>(director, 'GET', `/api/equipment?q=${v.installed}`);
  await director.goto(`/equipment/${found.body.find((e) => e.assetTag === v.installed)!.id}`);
  await expect(director.getByTestId('item-incidents')).toContainText('Touches not showing');
  await expect(director.getByTestId('inspect-flag')).toBeVisible();
  await expect(director.getByText('To inspect').first()).toBeVisible();
  await director.screenshot({ path: shots('equipment-incidents.png'), fullPage: true });

  await publicContext.close();
  await directorContext.close();
});

test('an incident and its retest typed offline reach the server exactly once, even when the first answer is lost', async ({
  page,
  context,
  browser,
}) => {
  const directorContext = await browser.newContext();
  const director = await directorContext.newPage();
  await signIn(director, 'director');
  const v = await signedOffVenue(director);

  await signIn(page, 'technician');
  await page.goto(`/venues/${v.venueId}`); // puts the venue's strips on the tablet
  await page.goto(`/strips/${v.stripId}/test`);
  await page.getByRole('button', { name: 'I understand — start testing' }).click();
  await page.getByRole('group', { name: 'Layout' }).getByRole('button', { name: 'Step list' }).click();
  await expect(page.getByRole('button', { name: 'Report a problem on Bout 1' })).toBeVisible();
  await expect(page.getByTestId('sync-indicator')).toHaveAttribute('data-state', 'up-to-date');

  // The network goes; the incident and a retest of the cable's continuity are typed anyway.
  await context.setOffline(true);
  await expect(page.getByTestId('sync-indicator')).toHaveAttribute('data-state', 'offline');
  await page.getByRole('button', { name: 'Report a problem on Bout 1' }).click();
  await page.getByTestId('open-incident').getByRole('button', { name: 'Floor cable damaged' }).click();
  await expect(page.getByTestId('queued-incident')).toHaveAttribute('data-state', 'waiting');
  const continuity = page.locator('li[data-step^="continuity"]');
  for (let i = 0; i < (await continuity.count()); i++) {
    const input = continuity.nth(i).locator('input[id^="reading-"]');
    await input.fill('0.6');
    await input.press('Enter');
  }
  await page.screenshot({ path: test.info().outputPath('offline-incident.png'), fullPage: true });

  // The first answer to the incident is lost on the way back: the server has it, the tablet does not know.
  // Anything the server stamps from here on is later than the incident was typed on the tablet.
  const backOnline = new Date().toISOString();
  let lost = false;
  await page.route('**/api/venues/*/incidents', async (route) => {
    if (route.request().method() !== 'POST' || lost) return route.fallback();
    lost = true;
    await route.fetch();
    await route.abort('connectionreset');
  });
  await context.setOffline(false);
  await expect(page.getByTestId('incident-card')).toContainText('Floor cable damaged');
  await expect(page.getByTestId('sync-indicator')).toHaveAttribute('data-state', 'up-to-date');
  expect(lost).toBe(true);

  const list = await apiAs<{ incidents: { stripId: string; symptom: string; clientId: string | null; openedAt: string }[] }>(
    director,
    'GET',
    `/api/venues/${v.venueId}/incidents`,
  );
  const mine = list.body.incidents.filter((i) => i.stripId === v.stripId);
  expect(mine).toHaveLength(1);
  // It counts from when it was typed offline, not from when it reached the server.
  expect(mine[0].openedAt < backOnline).toBe(true);
  const readings = await apiAs<{ stripLabel: string; valueText: string }[]>(director, 'GET', `/api/venues/${v.venueId}/readings`);
  expect(readings.body.filter((r) => r.valueText === '0.6')).toHaveLength(3); // continuity A, B and C, once each
  await directorContext.close();
});

test('on a signed-off venue a new reading tells the strip is out of service; the spare pool offers no incident', async ({
  page,
  browser,
}) => {
  const directorContext = await browser.newContext();
  const director = await directorContext.newPage();
  await signIn(director, 'director');
  const v = await signedOffVenue(director);
  await directorContext.close();

  await signIn(page, 'technician');
  await page.goto(`/strips/${v.stripId}/test`);
  await page.getByRole('button', { name: 'I understand — start testing' }).click();
  await page.getByRole('group', { name: 'Layout' }).getByRole('button', { name: 'Step list' }).click();
  const input = page.locator('li[data-step^="continuity"]').first().locator('input[id^="reading-"]');
  await input.fill('0.7');
  await input.press('Enter');
  const notice = page.locator('[data-testid="queued"][data-status="notice"]');
  await expect(notice).toContainText('This strip is now out of service until the director amends the venue');
  await page.screenshot({ path: test.info().outputPath('strip-suspended-notice.png'), fullPage: true });

  // The pool's own strip: spares are tested there, but it is no strip of the competition.
  // The safety notice was acknowledged for this session on the first strip.
  await page.goto(`/strips/${v.poolStripId}/test`);
  await expect(page.locator('input[id^="reading-"]').first()).toBeVisible();
  await expect(page.getByRole('button', { name: /Report a problem/ })).toHaveCount(0);
});
