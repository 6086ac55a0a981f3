import { test, expect, signIn, apiAs } from './fixtures';

type Position = { id: string; name: string; equipmentKind: string; equipment: { assetTag: string } | null };
type Plan = { venue: { id: string; version: number }; strips: { id: string; label: string; zone: string | null; positions: Position[] }[] };

test.use({ viewport: { width: 1024, height: 768 } });

test("the asset tags of a whole row: a pasted column fills down, a repeated tag is named before sending, the card's one save attaches all", async ({
  page,
}) => {
  await signIn(page, 'director');
  const stamp = Date.now().toString(36).toUpperCase();
  const events = await apiAs<{ id: string }[]>(page, 'GET', '/api/events');
  const profiles = await apiAs<{ id: string }[]>(page, 'GET', '/api/profiles');
  const created = await apiAs<Plan>(page, 'POST', `/api/events/${events.body[0].id}/venues`, {
    name: `Tag Hall ${stamp}`,
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
  const tags = [1, 2, 3, 4].map((n) => `T${stamp}-${n}`);
  for (const assetTag of tags)
    expect((await apiAs(page, 'POST', '/api/equipment', { assetTag, kind: 'floor-cable', lengthM: 12 })).status).toBe(201);

  await page.goto(`/venues/${venueId}/plan`);
  // The venue's details and technicians are one form with one save.
  await expect(page.getByRole('button', { name: 'Save venue' })).toHaveCount(1);
  await expect(page.getByRole('button', { name: /Save technicians|Save venue details/ })).toHaveCount(0);
  // The empty "Row or zone" of the add-strips form shows no example text that could pass for a value.
  const newZone = page.getByRole('textbox', { name: 'Row or zone' }).first();
  await expect(newZone).toHaveAttribute('id', 'f-zone');
  await expect(newZone).toHaveValue('');
  await expect(newZone).not.toHaveAttribute('placeholder');
  const form = page.getByRole('form', { name: 'Asset tags' });
  await expect(form).toBeVisible();
  await page.getByRole('radio', { name: 'the whole of Row A (2 strips)' }).check();
  await page.getByLabel('Which items').selectOption('floor-cable');
  const cells = form.getByRole('textbox');
  await expect(cells).toHaveCount(4);

  // A column copied from a spreadsheet (one tag per line, lower case, a trailing line break).
  await cells.first().focus();
  await cells.first().evaluate((el, text) => {
    const data = new DataTransfer();
    data.setData('text/plain', text);
    el.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }));
  }, `${tags[0].toLowerCase()}\n${tags[1]}\r\n${tags[2]}\n${tags[1]}\n`);
  for (const [i, tag] of [tags[0], tags[1], tags[2], tags[1]].entries()) await expect(cells.nth(i)).toHaveValue(tag);

  // The repeated tag is refused on the tablet with the rows named; nothing is sent.
  let sent = 0;
  page.on('request', (r) => {
    if (r.method() === 'PATCH' && r.url().includes('/api/strips/')) sent += 1;
  });
  // One save on the strip's card: its details and the table together.
  const save = page.getByRole('button', { name: 'Save strip' });
  await expect(save).toHaveCount(1);
  await save.click();
  await expect(form.getByRole('alert')).toHaveText(`${tags[1]} is given twice (rows 2 and 4); one item can sit in one position only.`);
  expect(sent).toBe(0);

  await cells.nth(3).fill(tags[3]);
  const saved = page.waitForResponse((r) => r.request().method() === 'PATCH' && r.url().includes('/api/strips/'));
  await save.click();
  const answer = await saved;
  expect(answer.status()).toBe(200);
  expect(answer.request().postDataJSON().assetTags).toHaveLength(4);
  await expect(page.getByText('Strip 1: saved.')).toBeVisible();
  await expect(page.getByText('plan version 3')).toBeVisible();

  const now = await apiAs<Plan>(page, 'GET', `/api/venues/${venueId}`);
  const floorTags = now.body.strips.flatMap((s) =>
    s.positions.filter((p) => p.equipmentKind === 'floor-cable').map((p) => p.equipment?.assetTag),
  );
  expect(floorTags).toEqual(tags);
  // The table fits the 1024 px screen: nothing scrolls sideways.
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(1024);
  await page.screenshot({ path: test.info().outputPath('asset-tags-1024.png'), fullPage: true });
});
