// A strip's printed label scanned by the tablet's camera opens its testing screen. The camera is
// Chromium's fake one, playing a picture made here from the QR code taken out of the label sheet
// PDF itself (read back with PDF.js and jsQR), so the whole path is covered: PDF → code → camera →
// the app's decoder (barcode-detector, ZXing wasm from our own build) → the strip.
import { chromium, type Page } from '@playwright/test';
import { mkdirSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { apiAs, expect, signIn, test } from './fixtures';
import { CHROMIUM_ARGS, chromiumPath } from '../scripts/chromium';
import { readPdfQrCodes, type PdfQr } from '../tests/setup/pdf-qr';

const W = 640;
const H = 480;

/**
 * A one-frame YUV4MPEG2 video (the format Chromium's fake camera plays, looping): the code's
 * picture, grey only, centred on white, each pixel of it drawn `k` times over.
 */
function y4mOf(code: PdfQr['image'], k: number): Buffer {
  const y = Buffer.alloc(W * H, 235);
  const left = Math.floor((W - code.width * k) / 2);
  const top = Math.floor((H - code.height * k) / 2);
  for (let r = 0; r < code.height * k; r++)
    for (let c = 0; c < code.width * k; c++) {
      const i = (Math.floor(r / k) * code.width + Math.floor(c / k)) * 4;
      y[(top + r) * W + left + c] = code.rgba[i]! < 128 ? 16 : 235;
    }
  const chroma = Buffer.alloc((W / 2) * (H / 2) * 2, 128);
  const frame = Buffer.concat([Buffer.from('FRAME\n'), y, chroma]);
  return Buffer.concat([Buffer.from(`YUV4MPEG2 W${W} H${H} F10:1 Ip A1:1 C420jpeg\n`), frame, frame]);
}

async function acknowledgeSafety(page: Page) {
  const notice = page.getByRole('alertdialog');
  await notice.getByRole('button', { name: 'I understand — start testing' }).click();
  await expect(notice).toBeHidden();
}

/** The demo hall's plan, read as the signed-in person (its strips with their items' tags). */
async function hallPlan(page: Page) {
  const venues = (await apiAs<{ id: string; name: string }[]>(page, 'GET', '/api/venues')).body;
  const hall = venues.find((v) => v.name === 'Riverside Sports Hall')!.id;
  type Plan = { strips: { id: string; label: string; positions: { equipment: { assetTag: string } | null }[] }[] };
  return (await apiAs<Plan>(page, 'GET', `/api/venues/${hall}`)).body;
}

test('a strip label from the printed sheet, shown to the camera, opens that strip’s testing screen', async ({ page }) => {
  const baseURL = test.info().project.use.baseURL!;
  await signIn(page, 'technician');
  const venues = (await apiAs<{ id: string; name: string }[]>(page, 'GET', '/api/venues')).body;
  const hall = venues.find((v) => v.name === 'Riverside Sports Hall')!.id;
  const plan = (await apiAs<{ strips: { id: string; label: string }[] }>(page, 'GET', `/api/venues/${hall}`)).body;
  const target = plan.strips.find((s) => s.label === 'Strip 7')!;

  // The sheet as the technician prints it, and the code on Strip 7's label.
  const sheet = await page.request.get(`/api/venues/${hall}/labels.pdf`);
  expect(sheet.status()).toBe(200);
  const { codes } = await readPdfQrCodes(await sheet.body());
  const label = codes.find((c) => c.text === `${baseURL}/s/${target.id}`);
  expect(label, 'Strip 7 has a label whose code links to it').toBeDefined();

  // 360 px of code at 1 camera pixel each: about the size a label is held at.
  const dir = resolve('.tmp/e2e-camera');
  mkdirSync(dir, { recursive: true });
  const video = resolve(dir, 'strip-7-label.y4m');
  writeFileSync(video, y4mOf(label!.image, 1));

  const browser = await chromium.launch({
    executablePath: chromiumPath(),
    args: [...CHROMIUM_ARGS, '--use-fake-device-for-media-stream', `--use-file-for-fake-video-capture=${video}`],
  });
  try {
    const context = await browser.newContext({ baseURL, viewport: { width: 1024, height: 768 }, permissions: ['camera'] });
    const tablet = await context.newPage();
    const outside: string[] = [];
    tablet.on('request', (r) => {
      if (!r.url().startsWith(baseURL) && !r.url().startsWith('data:') && !r.url().startsWith('blob:')) outside.push(r.url());
    });
    await signIn(tablet, 'technician');
    const first = plan.strips.find((s) => s.label === 'Strip 1')!;
    await tablet.goto(`/strips/${first.id}/test`);
    await acknowledgeSafety(tablet);
    await tablet.getByRole('button', { name: 'Scan a label' }).click();
    const scanner = tablet.getByRole('dialog', { name: 'Open a strip by its label' });
    // The scanner is open only until the first frame is read, which may be before this test looks
    // again on a loaded machine: what is checked is where it leads (the next spec checks the
    // scanner itself, without a camera).
    await expect(tablet).toHaveURL(new RegExp(`/strips/${target.id}/test$`));
    await expect(tablet.getByRole('heading', { name: 'Strip 7 — testing' })).toBeVisible();
    await expect(scanner).toBeHidden();
    // The reader's wasm came from our own server, nothing from elsewhere.
    expect(outside).toEqual([]);
    await context.close();
  } finally {
    await browser.close();
  }
});

test('without a camera the scanner says so, and a typed item tag opens the strip the item is on', async ({ page }) => {
  await signIn(page, 'technician');
  const plan = await hallPlan(page);
  const strip9 = plan.strips.find((s) => s.label === 'Strip 9')!;
  const tag = strip9.positions.find((p) => p.equipment)!.equipment!.assetTag;

  await page.goto(`/strips/${plan.strips[0]!.id}/test`);
  await acknowledgeSafety(page);
  await page.getByRole('button', { name: 'Scan a label' }).click();
  const scanner = page.getByRole('dialog', { name: 'Open a strip by its label' });
  // This browser has no camera and was given no permission: a sentence, not a blank picture.
  await expect(scanner.getByText(/No camera was found|The camera is blocked/)).toBeVisible();
  await page.screenshot({ path: 'test-results/labels-no-camera.png' });
  await scanner.getByLabel('Or type the asset tag').fill('no such tag!');
  await scanner.getByRole('button', { name: 'Open' }).click();
  await expect(scanner.getByText('Type an asset tag such as FC-014, or the link on a label.')).toBeVisible();
  await scanner.getByLabel('Or type the asset tag').fill(tag.toLowerCase());
  await scanner.getByRole('button', { name: 'Open' }).click();
  await expect(page).toHaveURL(new RegExp(`/strips/${strip9.id}/test$`));
  await expect(page.getByRole('heading', { name: 'Strip 9 — testing' })).toBeVisible();
});

test('on the register a known tag opens its item and a new one is put in the form to register it', async ({ page }) => {
  await signIn(page, 'admin');
  const register = (await apiAs<{ id: string; assetTag: string; kind: string }[]>(page, 'GET', '/api/equipment?kind=reel')).body;
  const reel = register[0]!;
  await page.goto('/equipment');
  await expect(page.getByRole('link', { name: 'Print labels' })).toHaveAttribute('href', '/api/equipment/labels.pdf');
  await page.getByRole('button', { name: 'Scan a label' }).click();
  const scanner = page.getByRole('dialog', { name: 'Find an item by its label' });
  await scanner.getByLabel('Or type the asset tag').fill('new-777');
  await scanner.getByRole('button', { name: 'Open' }).click();
  await expect(scanner).toBeHidden();
  await expect(page.getByText('No item has the tag NEW-777 yet: it is filled in below to register it.')).toBeVisible();
  await expect(page.getByLabel('Asset tag')).toHaveValue('NEW-777');
  // The form's kind is next to choose (by its form: the register's filter has a "Kind" too).
  await expect(page.locator('form select[name="kind"]')).toBeFocused();
  await page.screenshot({ path: 'test-results/labels-register.png' });

  await page.getByRole('button', { name: 'Scan a label' }).click();
  await scanner.getByLabel('Or type the asset tag').fill(`${test.info().project.use.baseURL}/t/${encodeURIComponent(reel.assetTag)}`);
  await scanner.getByRole('button', { name: 'Open' }).click();
  await expect(page).toHaveURL(new RegExp(`/equipment/${reel.id}$`));
});

test('a label’s link opened by any camera app: the strip’s testing screen, or the strip its item is on', async ({ page }) => {
  await signIn(page, 'technician');
  const plan = await hallPlan(page);
  const strip4 = plan.strips.find((s) => s.label === 'Strip 4')!;
  await page.goto(`/s/${strip4.id}`);
  await expect(page).toHaveURL(new RegExp(`/strips/${strip4.id}/test$`));
  const tag = strip4.positions.find((p) => p.equipment)!.equipment!.assetTag;
  await page.goto('/');
  await page.goto(`/t/${encodeURIComponent(tag)}`);
  await expect(page).toHaveURL(new RegExp(`/strips/${strip4.id}/test$`));
});

test('the venue page offers the label sheet to its technician, not to the organiser', async ({ page, browser }) => {
  await signIn(page, 'technician');
  const venues = (await apiAs<{ id: string; name: string }[]>(page, 'GET', '/api/venues')).body;
  const hall = venues.find((v) => v.name === 'Riverside Sports Hall')!.id;
  await page.goto(`/venues/${hall}`);
  const link = page.getByRole('navigation', { name: 'Venue pages' }).getByRole('link', { name: 'Print labels' });
  await expect(link).toHaveAttribute('href', `/api/venues/${hall}/labels.pdf`);
  const organiser = await (await browser.newContext()).newPage();
  await signIn(organiser, 'organiser');
  await organiser.goto(`/venues/${hall}`);
  await expect(organiser.getByRole('navigation', { name: 'Venue pages' }).getByRole('link', { name: 'Certificates' })).toBeVisible();
  await expect(organiser.getByRole('link', { name: 'Print labels' })).toHaveCount(0);
});
