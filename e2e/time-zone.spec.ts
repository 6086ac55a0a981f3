import { test, expect, apiAs, signIn } from './fixtures';

type Plan = { venue: { id: string; timeZone: string } };

// The director sets the hall's time zone with the venue's details; it is kept, and the venues list
// (which the venue's pages take their clock from) carries it.
test('the director sets the venue time zone in its details and it is kept', async ({ page }) => {
  await signIn(page, 'director');
  const events = await apiAs<{ id: string }[]>(page, 'GET', '/api/events');
  const profiles = await apiAs<{ id: string }[]>(page, 'GET', '/api/profiles');
  const created = await apiAs<Plan>(page, 'POST', `/api/events/${events.body[0].id}/venues`, {
    name: `Zone Hall ${Date.now()}`,
    profileId: profiles.body[0].id,
  });
  expect(created.status).toBe(201);
  expect(created.body.venue.timeZone).toBe('Europe/London');

  await page.goto(`/venues/${created.body.venue.id}/plan`);
  const zone = page.getByLabel('Time zone of the hall');
  await expect(zone).toHaveValue('Europe/London');
  await zone.selectOption('Europe/Paris');
  await page.getByRole('button', { name: 'Save venue' }).click();
  await expect(page.getByRole('button', { name: 'Save venue' })).toBeDisabled();
  await page.screenshot({ path: test.info().outputPath('venue-time-zone.png') });

  await page.reload();
  await expect(page.getByLabel('Time zone of the hall')).toHaveValue('Europe/Paris');
  const venues = await apiAs<{ id: string; timeZone: string }[]>(page, 'GET', '/api/venues');
  expect(venues.body.find((v) => v.id === created.body.venue.id)?.timeZone).toBe('Europe/Paris');
});
