// The entry grid on a 1024 × 768 tablet: a whole strip on one screen, recorded by keyboard and
// keypad (OL one key, all insulation OL one action and a confirmation), a failure linking to its
// fault, focus on "strip complete — next strip" after the last reading, and "record again?" once.
import type { Page } from '@playwright/test';
import { expect, signIn, test, openVenueLink } from './fixtures';

test.use({ viewport: { width: 1024, height: 768 }, hasTouch: true });

const fitsOneScreen = (page: Page) =>
  page.evaluate(
    () => document.documentElement.scrollHeight <= window.innerHeight && document.documentElement.scrollWidth <= window.innerWidth,
  );

/** Key presses other than the digits and the decimal point of the value itself. */
let nonDigitKeys = 0;
let readings = 0;
async function keys(page: Page, text: string) {
  for (const ch of text) {
    if (!/[0-9.]/.test(ch)) nonDigitKeys += 1;
    await page.keyboard.press(ch);
  }
}
async function enter(page: Page) {
  nonDigitKeys += 1;
  await page.keyboard.press('Enter');
}

test('a strip recorded in the grid at 1024 × 768: one screen, ≤ 1 non-digit key per reading, the fault linked, focus kept', async ({
  page,
}) => {
  await signIn(page, 'technician');
  await page.goto('/');
  await openVenueLink(page).click();
  await page.getByLabel('Go to strip number').fill('15');
  await page.keyboard.press('Enter');
  const notice = page.getByRole('alertdialog');
  await expect(notice).toContainText('disconnected from the scoring apparatus');
  await page.keyboard.press('Enter'); // its focused button
  await expect(notice).toBeHidden();

  const grid = page.getByTestId('entry-grid');
  await expect(grid).toBeVisible(); // the default on a tablet-size screen
  const row = (name: string) => grid.locator(`tr[data-position="${name}"]`);
  const cell = (name: string, step: string) => row(name).locator(`[data-cell="${step}"]`);
  const input = (name: string, step: string) => cell(name, step).locator('input');
  await expect(row('Left floor cable')).toBeVisible();
  expect(await fitsOneScreen(page)).toBe(true);
  await page.screenshot({ path: 'test-results/grid-1024x768-start.png' });

  // The insulation caution is said once, not on each of the twelve insulation cells.
  await expect(page.getByTestId('grid-cautions')).toHaveCount(1);
  await expect(page.getByText(/never a high-voltage insulation tester/)).toHaveCount(1);

  // Focus is on the first cell, with its limit and source.
  await expect(input('Left floor cable', 'continuity A')).toBeFocused();
  await expect(page.getByTestId('grid-limit')).toContainText(/at most .*Ω/);

  // Left floor cable by keyboard: three continuities, an A–B short, OL as one key, the loop.
  for (const v of ['0.5', '0.5', '0.5']) {
    await keys(page, v);
    await enter(page);
    readings += 1;
  }
  await expect(input('Left floor cable', 'insulation A-B')).toBeFocused();
  await keys(page, '0.85');
  await enter(page);
  readings += 1;
  await expect(input('Left floor cable', 'insulation A-C')).toBeFocused();
  await keys(page, 'o'); // OL, recorded
  readings += 1;
  await expect(input('Left floor cable', 'insulation B-C')).toBeFocused();
  await keys(page, 'o');
  readings += 1;
  await keys(page, '1.0');
  await enter(page);
  readings += 1;

  // Right floor cable: continuities, then all insulation OL in one action with a confirmation.
  await expect(input('Right floor cable', 'continuity A')).toBeFocused();
  for (const v of ['0.5', '0.5', '0.5']) {
    await keys(page, v);
    await enter(page);
    readings += 1;
  }
  await keys(page, 'a');
  const confirm = page.getByRole('alertdialog', { name: 'All insulation OL?' });
  await expect(confirm).toContainText('Right floor cable');
  await expect(confirm.getByRole('button', { name: 'Record OL ×3' })).toBeFocused();
  await enter(page);
  readings += 3;
  await expect(input('Right floor cable', 'loop A-B')).toBeFocused();
  await keys(page, '1.0');
  await enter(page);
  readings += 1;

  // Left reel by keyboard, one O per insulation pair.
  await expect(input('Left reel', 'continuity A')).toBeFocused();
  for (const v of ['1.3', '1.3', '1.3', 'o', 'o', 'o', '2.5']) {
    await keys(page, v);
    if (v !== 'o') await enter(page);
    readings += 1;
  }
  expect(nonDigitKeys / readings).toBeLessThanOrEqual(1);

  // Right reel on the keypad alone: taps, the OL key, the all-insulation key and its confirmation.
  await expect(input('Right reel', 'continuity A')).toBeFocused();
  const pad = page.getByTestId('keypad');
  const tap = (key: string) => pad.locator(`[data-key="${key}"]`).tap();
  for (let i = 0; i < 3; i++) {
    for (const k of ['1', '.', '3', 'enter']) await tap(k);
  }
  await tap('all-ol');
  await page.getByRole('alertdialog', { name: 'All insulation OL?' }).getByRole('button', { name: 'Record OL ×3' }).tap();
  await expect(input('Right reel', 'loop A-B')).toBeFocused();
  for (const k of ['2', '.', '5']) await tap(k);
  await tap('enter');

  // After the last reading: focus on the way on, and every cell shows its verdict mark.
  const done = page.getByRole('link', { name: 'Strip complete — next strip →' });
  await expect(done).toBeFocused();
  await expect(page.getByTestId('strip-bar-progress')).toContainText('28 of 28 measured');
  await expect(grid.locator('[data-verdict="not-measured"]')).toHaveCount(0);
  await expect(cell('Right reel', 'insulation A-C')).toHaveAttribute('data-verdict', 'pass');

  // The failure: its cell links to the fault the server opened.
  await expect(cell('Left floor cable', 'insulation A-B')).toHaveAttribute('data-verdict', 'fail');
  const faultLink = cell('Left floor cable', 'insulation A-B').getByTestId('cell-fault');
  await expect(faultLink).toHaveAttribute('href', /\/faults\/[0-9a-f-]{36}$/);
  await expect(page.getByTestId('strip-status')).toContainText('Fault open');
  expect(await fitsOneScreen(page)).toBe(true);
  await page.screenshot({ path: 'test-results/grid-1024x768-done.png' });

  // Keys of at least 56 px, at least 12 px apart.
  const boxes = await pad.locator('button').evaluateAll((els) => els.map((e) => e.getBoundingClientRect().toJSON() as DOMRect));
  for (const b of boxes) {
    expect(b.width).toBeGreaterThanOrEqual(56);
    expect(b.height).toBeGreaterThanOrEqual(56);
  }
  for (let i = 0; i < boxes.length; i++)
    for (let j = i + 1; j < boxes.length; j++) {
      const a = boxes[i],
        b = boxes[j];
      const gapX = Math.max(b.left - a.right, a.left - b.right);
      const gapY = Math.max(b.top - a.bottom, a.top - b.bottom);
      expect(Math.max(gapX, gapY)).toBeGreaterThanOrEqual(12);
    }

  // Re-recording a measured step asks once.
  await input('Left reel', 'loop A-B').click();
  await keys(page, '2.4');
  await enter(page);
  const again = page.getByRole('alertdialog', { name: 'Record again?' });
  await expect(again.getByRole('button', { name: 'Record again' })).toBeFocused();
  await page.keyboard.press('Enter');
  await expect(again).toBeHidden();
  await expect(cell('Left reel', 'loop A-B')).toContainText('2.4');
  await expect(done).toBeFocused();

  // The fault cell opens the fault.
  await faultLink.click();
  await expect(page.getByRole('heading', { name: 'Fault on Strip 15 · Left floor cable' })).toBeVisible();
});

test('a strip with a piste (five items) fits 1024 × 768, focus on the way on; the grid at 768 × 1024 and 390 × 844', async ({ page }) => {
  await signIn(page, 'technician');
  await page.goto('/');
  await openVenueLink(page).click();
  await page.getByLabel('Go to strip number').fill('3'); // tested in the demo scenario, conductive piste
  await page.keyboard.press('Enter');
  await page.getByRole('button', { name: 'I understand — start testing' }).click();
  await expect(page.getByTestId('entry-grid').locator('tr[data-position]')).toHaveCount(5);
  // A completed strip: focus is on the way on, not lost.
  await expect(page.getByRole('link', { name: 'Strip complete — next strip →' })).toBeFocused();
  expect(await fitsOneScreen(page)).toBe(true);
  await page.screenshot({ path: 'test-results/grid-piste-1024x768.png' });
  await page.setViewportSize({ width: 768, height: 1024 });
  await expect(page.getByTestId('entry-grid')).toBeVisible();
  await page.screenshot({ path: 'test-results/grid-piste-768x1024.png', fullPage: true });
  await page.setViewportSize({ width: 390, height: 844 });
  await page.screenshot({ path: 'test-results/grid-piste-390x844.png', fullPage: true });
});

/**
 * Presses a key on the focused element and tells what has focus once React has handled it, before
 * the browser paints again: a key that follows at once (a technician in a hurry, a slow tablet whose
 * next frame is late) lands there.
 */
const focusAfterKey = (page: Page, key: string) =>
  page.evaluate(async (k) => {
    const target = document.activeElement!;
    target.dispatchEvent(new KeyboardEvent('keydown', { key: k, bubbles: true, cancelable: true }));
    await Promise.resolve();
    await Promise.resolve();
    const el = document.activeElement;
    return el?.textContent?.trim() || el?.closest('[data-cell]')?.getAttribute('data-cell') || el?.tagName;
  }, key);

test('a technician in a hurry: the confirmation has focus as soon as it opens, so the next Enter lands on it', async ({ page }) => {
  await signIn(page, 'technician');
  await page.goto('/');
  await openVenueLink(page).click();
  await page.getByLabel('Go to strip number').fill('16');
  await page.keyboard.press('Enter');
  await page.getByRole('button', { name: 'I understand — start testing' }).click();
  const grid = page.getByTestId('entry-grid');
  const cell = (step: string) => grid.locator(`tr[data-position="Left floor cable"] [data-cell="${step}"]`);
  await expect(cell('continuity A').locator('input')).toBeFocused();
  for (const v of ['0.5', '0.5', '0.5']) {
    await page.keyboard.type(v);
    await page.keyboard.press('Enter');
  }
  await expect(cell('insulation A-B').locator('input')).toBeFocused();
  expect(await focusAfterKey(page, 'a')).toBe('Record OL ×3');
  await page.keyboard.press('Enter');
  for (const pair of ['A-B', 'A-C', 'B-C']) await expect(cell(`insulation ${pair}`)).toHaveAttribute('data-verdict', 'pass');
  await expect(cell('loop A-B').locator('input')).toBeFocused();

  // Again on a measured cell: "record again?" has focus at once too.
  await cell('continuity A').locator('input').click();
  await page.keyboard.type('0.6');
  expect(await focusAfterKey(page, 'Enter')).toBe('Record again');
  await page.keyboard.press('Enter');
  await expect(cell('continuity A')).toContainText('0.6');
  await expect(page.getByRole('alertdialog', { name: 'Record again?' })).toBeHidden();
});
