import { test, expect, signIn, apiAs } from './fixtures';

type Plan = { venue: { id: string; version: number }; strips: { id: string; label: string; zone: string | null }[] };

test('two directors edit the same plan: the second save is refused as "changed meanwhile" (412), keeps what was typed, and applies after reloading', async ({
  page,
  browser,
}) => {
  await signIn(page, 'director');
  // A venue of its own, put straight in through the API.
  const events = await apiAs<{ id: string }[]>(page, 'GET', '/api/events');
  const profiles = await apiAs<{ id: string }[]>(page, 'GET', '/api/profiles');
  const created = await apiAs<Plan>(page, 'POST', `/api/events/${events.body[0].id}/venues`, {
    name: `Concurrency Hall ${Date.now()}`,
    profileId: profiles.body[0].id,
  });
  expect(created.status).toBe(201);
  const venueId = created.body.venue.id;
  const origin = new URL(test.info().project.use.baseURL!).origin;
  const bulk = await page.request.post(`/api/venues/${venueId}/strips/bulk`, {
    data: { count: 2, zone: 'Row A' },
    headers: { Origin: origin, 'If-Match': `"${created.body.venue.version}"` },
  });
  expect(bulk.status()).toBe(201);

  const other = await (await browser.newContext()).newPage();
  await signIn(other, 'director');
  await page.goto(`/venues/${venueId}/plan`);
  await other.goto(`/venues/${venueId}/plan`);
  await expect(page.getByText('plan version 2')).toBeVisible();
  await expect(other.getByText('plan version 2')).toBeVisible();

  // The first director moves Strip 1 to another zone and saves.
  await page.locator('#f-stripZone').fill('Gallery');
  await page.getByRole('button', { name: 'Save strip' }).click();
  await expect(page.getByText('Strip 1: saved.')).toBeVisible();
  await expect(page.getByText('plan version 3')).toBeVisible();

  // The second, still on version 2, renames the same strip.
  await other.locator('#f-stripLabel').fill('Final strip');
  const refused = other.waitForResponse((r) => r.url().includes('/api/strips/') && r.request().method() === 'PATCH');
  await other.getByRole('button', { name: 'Save strip' }).click();
  expect((await refused).status()).toBe(412);
  await expect(other.getByText('Changed meanwhile — your change was not saved')).toBeVisible();
  await expect(other.getByText('You were editing version 2; the plan is now at version 3.')).toBeVisible();
  await expect(other.locator('#f-stripLabel')).toHaveValue('Final strip');

  // Nothing was overwritten.
  let now = await apiAs<Plan>(page, 'GET', `/api/venues/${venueId}`);
  expect(now.body.strips[0]).toMatchObject({ label: 'Strip 1', zone: 'Gallery' });

  // Loading the current plan shows the first director's zone and keeps the typed label.
  await other.getByRole('button', { name: /Load the current plan/ }).click();
  await expect(other.getByText('plan version 3')).toBeVisible();
  await expect(other.locator('#f-stripZone')).toHaveValue('Gallery');
  await expect(other.locator('#f-stripLabel')).toHaveValue('Final strip');
  await other.getByRole('button', { name: 'Save strip' }).click();
  await expect(other.getByText('Final strip: saved.')).toBeVisible();

  now = await apiAs<Plan>(page, 'GET', `/api/venues/${venueId}`);
  expect(now.body.venue.version).toBe(4);
  expect(now.body.strips[0]).toMatchObject({ label: 'Final strip', zone: 'Gallery' });
  await other.context().close();
});

test('an organiser sees the plan read only', async ({ page }) => {
  await signIn(page, 'organiser');
  const venues = await apiAs<{ id: string; name: string }[]>(page, 'GET', '/api/venues');
  const hall = venues.body.find((v) => v.name === 'Riverside Sports Hall')!;
  await page.goto(`/venues/${hall.id}/plan`);
  await expect(page.getByText('read only for your role')).toBeVisible();
  await expect(page.getByRole('button', { name: 'Save strip' })).toHaveCount(0);
  await expect(page.getByRole('button', { name: 'Add strips' })).toHaveCount(0);
  await expect(page.locator('#f-stripLabel')).toBeDisabled();
});
