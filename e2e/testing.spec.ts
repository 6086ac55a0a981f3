// A technician tests a whole strip with the keyboard alone, meets a failure, locates it by loop
// resistance from both ends, cuts out the damaged section, retests and clears the strip, while the
// director's status board (a second browser context) follows without a reload.
import type { Page } from '@playwright/test';
import { expect, signIn, test, openVenueLink } from './fixtures';

const STRIP = 'Strip 12'; // not started in the demo scenario, no conductive piste: 4 cable items × 7 steps

/** What the meter shows for each step of Strip 12, in checklist order; one A–B short on the left floor cable. */
function valueFor(step: string, position: number): string {
  const [kind] = step.split(' ');
  if (kind === 'continuity') return position < 2 ? '0.5' : '1.3';
  if (kind === 'insulation') return position === 0 && step === 'insulation A-B' ? '0.85' : 'OL';
  return position < 2 ? '1.0' : '2.5'; // loop
}

async function typeAndRecord(page: Page, input: ReturnType<Page['locator']>, value: string) {
  await expect(input).toBeFocused();
  await page.keyboard.type(value);
  await page.keyboard.press('Enter');
}

test('a strip is tested by keyboard, its fault located, cut out and retested, and the board follows', async ({ page, browser }) => {
  // A bound, not a wait: the longest flow of the suite (some 25 s on a quiet two-core machine, two
  // minutes seen while a second suite and two busy loops shared it).
  test.setTimeout(300_000);
  // The director's board, in its own context.
  const directorContext = await browser.newContext();
  const board = await directorContext.newPage();
  await signIn(board, 'director');
  await signIn(page, 'technician');

  await page.goto('/');
  await openVenueLink(page).click();
  // The click navigates in the page: read the address once it is the venue's.
  await expect(page).toHaveURL(/\/venues\/[^/]+$/);
  await board.goto(`${new URL(page.url()).pathname}/board`);
  const tile = board.locator(`[data-strip="${STRIP}"]`);
  await expect(tile).toHaveAttribute('data-status', 'not-started');

  // Pick the strip by typing its number.
  await page.getByLabel('Go to strip number').fill('12');
  await page.keyboard.press('Enter');

  // The first-run safety notice must be acknowledged (Enter on its focused button).
  const notice = page.getByRole('alertdialog');
  await expect(notice).toContainText('disconnected from the scoring apparatus and from mains power');
  await expect(notice).toContainText('licensed electrician under local codes');
  await expect(notice.getByRole('button', { name: 'I understand — start testing' })).toBeFocused();
  await page.keyboard.press('Enter');
  await expect(notice).toBeHidden();

  // Every step, keyboard only: type the value, Enter records and moves to the next step.
  const rows = page.locator('li[data-step]');
  await expect(rows).toHaveCount(28);
  const positions = page.locator('section[aria-label]');
  let i = 0;
  for (let p = 0; p < (await positions.count()); p++) {
    const steps = positions.nth(p).locator('li[data-step]');
    const positionIndex = p - 1; // the apparatus comes first and has no steps
    for (let s = 0; s < (await steps.count()); s++) {
      const step = (await steps.nth(s).getAttribute('data-step'))!;
      const input = steps.nth(s).locator('input[id^="reading-"]');
      const value = valueFor(step, positionIndex);
      await typeAndRecord(page, input, value);
      if (value === '0.85') {
        // The verdict from the server replaces the preview, and the fault is offered.
        await expect(steps.nth(s).getByTestId('latest')).toContainText('Fail');
        await expect(steps.nth(s).getByRole('link', { name: 'Locate and repair this fault' })).toBeVisible();
      }
      i += 1;
    }
  }
  expect(i).toBe(28);
  await expect(page.getByTestId('strip-status')).toContainText('Fault open');
  // The board refreshes itself every few seconds (BOARD_REFRESH_MS).
  await expect(tile).toHaveAttribute('data-status', 'fault-open', { timeout: 30_000 });

  // Locate: loop resistance from both ends, length and Ω/m prefilled from the cable's own readings.
  await page.getByRole('link', { name: 'Locate and repair this fault' }).click();
  await expect(page.getByRole('heading', { name: `Fault on ${STRIP} · Left floor cable` })).toBeVisible();
  await expect(page.getByLabel('Loop resistance from both ends')).toBeChecked();
  await expect(page.getByLabel('Cable length (m)')).toHaveValue('12');
  // The methods that fit an A–B short, the one to try first first, each with why.
  await expect(page.getByTestId('method-reason')).toContainText('the short’s own resistance drops out');
  await page.getByLabel(/Loop reading from the near end/).fill('0.917');
  await page.getByLabel(/Loop reading from the far end/).fill('0.683');
  await page.getByRole('button', { name: 'Estimate and save' }).click();
  // x = (R_A − R_B + 2rL) / (4r) with r = 0.5 Ω / 12 m: (0.917 − 0.683 + 1.0) / (1/6) ≈ 7.4 m
  await expect(page.getByTestId('estimate')).toContainText('About 7.4 m');
  await expect(page.getByText('Located', { exact: true })).toBeVisible();

  // Repair: the damaged 1.5 m is cut out; the recorded length shrinks from 12 m to 10.5 m.
  await page.getByLabel('Length removed (m)').fill('1.5');
  await expect(page.getByTestId('new-length')).toHaveText('12 m now → 10.5 m after the cut');
  await page.getByRole('button', { name: 'Record the repair' }).click();
  await expect(page.getByText('Section cut out: 1.5 m removed, 12 m → 10.5 m')).toBeVisible();
  // The estimate stays on the cable as it was when it was made, and says so.
  await expect(page.getByTestId('shortened-since')).toHaveText(
    'Located on the item as it was then, 12 m long; it is 10.5 m now, after a cut-out.',
  );
  await expect(page.getByTestId('estimate')).toContainText('from the far end of the 12 m it was then');
  // Saved once: the form is disarmed, so a second tap cannot record the repair twice.
  await expect(page.getByTestId('repair-disarmed')).toBeVisible();
  await expect(page.getByRole('button', { name: 'Record the repair' })).toHaveCount(0);

  // Retest the cable: all seven steps again, keyboard only.
  await page.getByRole('link', { name: 'Retest the affected steps →' }).click();
  const cable = page.locator('section[aria-label="Left floor cable"]');
  await expect(cable).toContainText('10.5 m');
  const retestSteps = cable.locator('li[data-step]');
  for (let s = 0; s < 7; s++) {
    const step = (await retestSteps.nth(s).getAttribute('data-step'))!;
    await typeAndRecord(
      page,
      retestSteps.nth(s).locator('input[id^="reading-"]'),
      step.startsWith('insulation') ? 'OL' : step.startsWith('loop') ? '0.9' : '0.45',
    );
    await expect(retestSteps.nth(s).getByTestId('latest')).toContainText('Pass');
    // Each step measured again since the repair is marked as its retest.
    await expect(retestSteps.nth(s)).toHaveAttribute('data-retested', 'yes');
    if (s < 6) await expect(page.getByTestId('retest-banner')).toBeVisible();
  }
  await expect(page.getByTestId('strip-status')).toContainText('Clear');
  await expect(page.getByTestId('retest-done')).toHaveText('Fault closed · strip clear');
  await expect(page.getByTestId('retest-banner')).toHaveCount(0);

  // The board follows on its own.
  await expect(tile).toHaveAttribute('data-status', 'clear', { timeout: 30_000 });
  await directorContext.close();
});
