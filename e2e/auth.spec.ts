import { test, expect, DEMO_USERS, DEMO_PASSWORD, apiAs, oneTimeLinkFor } from './fixtures';

const homes = [
  ['admin', 'People and equipment'],
  ['organiser', 'Our events and venues'],
  ['director', 'Our events and venues'],
  ['technician', 'My venues'],
  ['annexTechnician', 'My venues'],
] as const;

test.describe('signing in', () => {
  for (const [role, heading] of homes) {
    test(`${role} signs in with the form and lands on their home`, async ({ page }) => {
      await page.goto('/');
      await expect(page).toHaveURL(/\/sign-in/);
      await page.getByLabel('E-mail').fill(DEMO_USERS[role]);
      await page.getByLabel('Password').fill(DEMO_PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await expect(page.getByRole('heading', { level: 1, name: heading })).toBeVisible();
    });
  }

  test('a reload right after signing in keeps the person signed in', async ({ page }) => {
    await page.goto('/');
    await expect(page).toHaveURL(/\/sign-in/);
    await page.getByLabel('E-mail').fill(DEMO_USERS.technician);
    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    const signedIn = page.waitForResponse((r) => r.url().endsWith('/api/auth/sign-in') && r.ok());
    await page.getByRole('button', { name: 'Sign in' }).click();
    await signedIn;
    // At once, before the tablet's saved copy (written at most once a second) has caught up.
    await page.reload();
    await expect(page.getByRole('heading', { level: 1, name: 'My venues' })).toBeVisible();
    await expect(page).not.toHaveURL(/\/sign-in/);
  });

  test('a wrong password says so and stays on the sign-in page', async ({ page }) => {
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill(DEMO_USERS.director);
    await page.getByLabel('Password').fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.getByRole('alert')).toContainText('e-mail or password is not right');
    await expect(page).toHaveURL(/\/sign-in/);
  });
});

test('a technician opening the people page sees "not allowed", and the API answers 403', async ({ page, signIn }) => {
  await signIn('technician');
  await page.goto('/people');
  await expect(page.getByRole('heading', { name: 'Not allowed' })).toBeVisible();
  const res = await apiAs(page, 'GET', '/api/users');
  expect(res.status).toBe(403);
});

test('an invitation e-mail reaches the local SMTP fake, its link sets a password, and the new person signs in', async ({
  page,
  browser,
  signIn,
}) => {
  await signIn('admin');
  await page.goto('/people');
  await page.getByLabel('Name').fill('Robin Hale');
  await page.getByLabel('E-mail').fill('robin@lakeshore.example');
  await page.getByLabel('Role', { exact: true }).selectOption('technician');
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByText('Invitation sent to robin@lakeshore.example')).toBeVisible();
  await expect(page.getByRole('cell', { name: /^Robin Hale robin@/ })).toBeVisible();

  // The outbox shows the invitation, with its one-time link withheld: an admin cannot take it.
  await page.goto('/people/outbox');
  await page
    .getByRole('button', { name: /Your Stripwarden invitation/ })
    .first()
    .click();
  const body = await page.locator('article pre').innerText();
  expect(body).toContain('Robin Hale');
  expect(body).toContain('one-time link withheld');
  expect(body).not.toMatch(/\/set-password\//);
  // The text part's sign-in address is a link that opens apart from the app; the withheld note is not.
  const signInLink = page.locator('article pre a', { hasText: /\/sign-in$/ });
  await expect(signInLink).toHaveAttribute('rel', 'noopener noreferrer');
  await expect(page.locator('article pre a', { hasText: /withheld/ })).toHaveCount(0);
  await page.screenshot({ path: test.info().outputPath('outbox-withheld.png') });
  // The link reaches the person (here: the server's console, as with the local SMTP fake).
  const link = await oneTimeLinkFor('robin@lakeshore.example');

  const invitee = await browser.newPage();
  await invitee.goto(link);
  await expect(invitee.getByText('robin@lakeshore.example')).toBeVisible();
  await invitee.getByLabel('New password').fill('robin-strong-password');
  await invitee.getByRole('button', { name: 'Set password' }).click();
  await expect(invitee.getByText('Your password is set')).toBeVisible();
  // The link works once.
  await invitee.goto(link);
  await expect(invitee.getByRole('alert')).toContainText(/already been used/);

  await invitee.goto('/sign-in');
  await invitee.getByLabel('E-mail').fill('robin@lakeshore.example');
  await invitee.getByLabel('Password').fill('robin-strong-password');
  await invitee.getByRole('button', { name: 'Sign in' }).click();
  await expect(invitee.getByRole('heading', { level: 1, name: 'My venues' })).toBeVisible();
  await invitee.close();
});
