import { apiAs, expect, test } from './fixtures';

// One header row: 44 px touch targets (with their borders) and 8 px above and below; a second row would add 44 px more.
const ONE_ROW_PX = 64;

for (const role of ['technician', 'director', 'organiser', 'admin'] as const) {
  for (const width of [768, 1024, 1280]) {
    test(`the header of a ${role} stays one row at ${width} px, every page reachable from its menu`, async ({ page, signIn }) => {
      await page.setViewportSize({ width, height: 900 });
      await signIn(role);
      await page.goto('/');
      const header = page.getByTestId('app-header');
      await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
      await expect(page.getByRole('group', { name: 'Lengths' }).getByRole('radio', { name: 'metres' })).toBeChecked();
      const box = (await header.boundingBox())!;
      expect(box.height).toBeLessThanOrEqual(ONE_ROW_PX + 1);
      await page.screenshot({ path: `test-results/header-${role}-${width}.png` });

      const menu = page.getByRole('button', { name: 'Menu' });
      await menu.click();
      await expect(menu).toHaveAttribute('aria-expanded', 'true');
      const nav = page.getByRole('navigation', { name: 'Main' });
      await expect(nav.getByRole('link', { name: 'Fault locator' })).toBeVisible();
      await expect(nav.getByRole('link', { name: 'Outbox' })).toHaveCount(role === 'admin' ? 1 : 0);
      // The open menu lies over the page: the header keeps its height.
      expect((await header.boundingBox())!.height).toBeLessThanOrEqual(ONE_ROW_PX + 1);
      await page.screenshot({ path: `test-results/header-${role}-${width}-menu.png` });
      await nav.getByRole('link', { name: 'Fault locator' }).click();
      await expect(page).toHaveURL(/fault-locator/);
      await expect(menu).toHaveAttribute('aria-expanded', 'false');
    });
  }
}

for (const role of ['technician', 'director', 'organiser', 'admin'] as const) {
  test(`from 1536 px the header of a ${role} shows every page inline, none cut off, in one row`, async ({ page, signIn }) => {
    await page.setViewportSize({ width: 1536, height: 900 });
    await signIn(role);
    await page.goto('/');
    await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
    const header = page.getByTestId('app-header');
    await expect(page.getByRole('button', { name: 'Menu' })).toBeHidden();
    const nav = header.getByRole('navigation', { name: 'Main' });
    await expect(nav.getByRole('link', { name: 'Fault locator' })).toBeVisible();
    await expect(nav.getByRole('link', { name: 'Outbox' })).toHaveCount(role === 'admin' ? 1 : 0);
    const { scrollWidth, clientWidth } = await nav.evaluate((n) => ({ scrollWidth: n.scrollWidth, clientWidth: n.clientWidth }));
    expect(scrollWidth).toBeLessThanOrEqual(clientWidth);
    await expect(header.getByRole('button', { name: 'Sign out' })).toBeVisible();
    expect((await header.boundingBox())!.height).toBeLessThanOrEqual(ONE_ROW_PX + 1);
    await page.screenshot({ path: `test-results/header-${role}-1536.png` });
  });
}

test('an organiser sees no director actions on a venue or its event', async ({ page, signIn }) => {
  await signIn('organiser');
  const venues = (await apiAs<{ id: string; name: string; eventId: string }[]>(page, 'GET', '/api/venues')).body;
  const hall = venues.find((v) => v.name === 'Riverside Sports Hall')!;
  await page.goto(`/venues/${hall.id}`);
  const pages = page.getByRole('navigation', { name: 'Venue pages' });
  await expect(pages.getByRole('link', { name: 'Certificates' })).toBeVisible();
  await expect(pages.getByRole('link', { name: 'Sign-off' })).toHaveCount(0);
  await expect(pages.getByRole('link', { name: 'Plan' })).toHaveCount(0);
  // The strips are shown, not opened for testing.
  await expect(page.getByText('Strip 1', { exact: true }).first()).toBeVisible();
  await expect(page.locator('a[href^="/strips/"]')).toHaveCount(0);
  await page.goto(`/events/${hall.eventId}`);
  await expect(page.getByRole('link', { name: 'Venue' }).first()).toBeVisible();
  await expect(page.getByRole('link', { name: 'Plan', exact: true })).toHaveCount(0);
});

test('the readings export link sends the filters on screen', async ({ page, signIn }) => {
  await signIn('director');
  const venues = (await apiAs<{ id: string; name: string }[]>(page, 'GET', '/api/venues')).body;
  const hall = venues.find((v) => v.name === 'Riverside Sports Hall')!;
  await page.goto(`/venues/${hall.id}/readings`);
  const exportLink = page.getByRole('link', { name: /Export CSV/ });
  await expect(exportLink).toHaveAttribute('href', `/api/venues/${hall.id}/readings.csv`);
  await page.getByLabel('Verdict').selectOption('fail');
  await page.getByLabel('Strip').selectOption({ label: 'Strip 3' });
  await expect(exportLink).toHaveText('Export CSV (filtered)');
  const href = (await exportLink.getAttribute('href'))!;
  const query = new URL(href, 'http://x').searchParams;
  expect(query.get('verdict')).toBe('fail');
  const csv = await apiAs<string>(page, 'GET', href);
  expect(csv.status).toBe(200);
  const lines = csv.body.trim().split(/\r\n/).slice(1);
  expect(lines.length).toBeGreaterThan(0);
  for (const l of lines) expect(l.startsWith('Strip 3,')).toBe(true);
  // The count on screen is the count in the file.
  await expect(page.getByText(new RegExp(`^${lines.length} of \\d+ readings`))).toBeVisible();
});
