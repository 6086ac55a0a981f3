import { test, expect, apiAs, signIn } from './fixtures';

// The whole flow on the ready demo venue: the director signs the annex off, the organiser gets the
// e-mail and the ZIP, and the public page confirms a certificate from the link its QR code encodes.
test('the director signs off the annex; the organiser gets the e-mail and the ZIP; the QR link verifies', async ({ page, browser }) => {
  await signIn(page, 'director');
  const venues = await apiAs<{ id: string; name: string }[]>(page, 'GET', '/api/venues');
  const annex = venues.body.find((v) => v.name === 'Riverside Annex')!;

  await page.goto(`/venues/${annex.id}/sign-off`);
  await expect(page.getByRole('heading', { level: 1, name: 'Sign-off: Riverside Annex' })).toBeVisible();
  await expect(page.getByText(/Ready: 4 strips to certify/)).toBeVisible();
  await page.getByLabel('Statement on the certificate').fill('All four annex strips tested with the venue kit.');
  await page.getByLabel('Your password, to confirm').fill('demo-strip-2026');
  await page.getByRole('button', { name: 'Sign off and issue certificates' }).click();
  // Five PDFs are made and signed before the answer.
  await expect(page.getByText('Signed off. 5 certificates issued.')).toBeVisible({ timeout: 60_000 });

  // The organiser: the e-mail reached the outbox (read through the admin's mail API).
  const admin = await browser.newContext();
  const adminPage = await admin.newPage();
  await signIn(adminPage, 'admin');
  const mail = await apiAs<{ id: number; toAddresses: string; subject: string }[]>(adminPage, 'GET', '/api/mail');
  const toNina = mail.body.find(
    (m) => m.toAddresses.includes('nina@lakeshore.example') && m.subject.startsWith('Signed off: Riverside Annex'),
  );
  expect(toNina, 'the sign-off e-mail to the organiser').toBeTruthy();
  const message = await apiAs<{ text: string }>(adminPage, 'GET', `/api/mail/${toNina!.id}`);
  const verifyLinks = [...message.body.text.matchAll(/https?:\/\/\S+\/verify\/(SW-\S+)/g)].map((m) => m[1]);
  expect(verifyLinks).toHaveLength(5);
  expect(message.body.text).toContain(`/venues/${annex.id}/certificates`);
  await admin.close();

  // The organiser downloads the ZIP from the certificates page.
  const organiser = await browser.newContext({ acceptDownloads: true });
  const ninaPage = await organiser.newPage();
  await signIn(ninaPage, 'organiser');
  await ninaPage.goto(`/venues/${annex.id}/certificates`);
  await expect(ninaPage.getByRole('heading', { level: 1, name: 'Certificates: Riverside Annex' })).toBeVisible();
  const [download] = await Promise.all([
    ninaPage.waitForEvent('download'),
    ninaPage.getByRole('link', { name: 'Download all (ZIP)' }).click(),
  ]);
  expect(download.suggestedFilename()).toMatch(/^certificates-riverside-annex-\d{4}-\d{2}-\d{2}\.zip$/);
  const zipPath = await download.path();
  const { readFileSync } = await import('node:fs');
  const zip = readFileSync(zipPath);
  // The end-of-central-directory record counts the entries (APPNOTE 4.3.16): one venue PDF, four strip PDFs.
  const eocd = zip.lastIndexOf(Buffer.from([0x50, 0x4b, 0x05, 0x06]));
  expect(eocd).toBeGreaterThan(0);
  expect(zip.readUInt16LE(eocd + 10)).toBe(5);
  await organiser.close();

  // The QR code on the venue certificate encodes its verification URL; open it signed out.
  const venueCertificate = verifyLinks.find((n) => n.endsWith('-V'))!;
  const verifyUrl = (await apiAs<{ verifyUrl: string }>(page, 'GET', `/api/verify/${venueCertificate}`)).body.verifyUrl;
  const publicContext = await browser.newContext();
  const publicPage = await publicContext.newPage();
  await publicPage.goto(verifyUrl);
  await expect(publicPage.getByText('Valid certificate')).toBeVisible();
  await expect(publicPage.getByText('Riverside Annex').first()).toBeVisible();
  await expect(publicPage.getByText(venueCertificate).first()).toBeVisible();
  await publicContext.close();
});
