import { test, expect } from './fixtures';
import { synthesiseTrace, traceCsv } from '../tests/setup/synthetic-trace';

// The demo's A–B short on Strip 6's left floor cable (server/db/seed-demo.ts): 12 m cable,
// 0.0375 Ω/m per conductor (0.45 Ω end to end), short of 0.3 Ω at 7.4 m from the near end,
// so 0.855 Ω from the near end and 0.645 Ω from the far end.
test('a technician locates the demo short from both ends, sees it on the drawing in metres and in feet, and reads a scope trace', async ({
  page,
  signIn,
}) => {
  await signIn('technician');
  await page.goto('/fault-locator');
  await expect(page.getByRole('heading', { level: 1, name: 'Fault locator' })).toBeVisible();
  await expect(page.getByText(/disconnected at both ends/)).toBeVisible();
  await expect(page.getByText(/high-voltage insulation tester/)).toBeVisible();

  const readings = page.getByRole('form', { name: 'Readings' });
  await expect(readings.getByRole('radio', { name: 'Loop resistance from both ends' })).toBeChecked();
  // A thousands separator is not guessed: both readings are offered.
  await readings.getByLabel(/Loop reading from the near end/).fill('1,000');
  await expect(readings.getByText('did you mean 1000 Ω or 1.000 Ω?', { exact: false })).toBeVisible();
  await readings.getByLabel(/Loop reading from the near end/).fill('0.855');
  await readings.getByLabel(/Loop reading from the far end/).fill('645m'); // as a meter shows it: 645 mΩ
  await readings.getByLabel(/^Cable length/).fill('12');
  await readings.getByLabel(/A sound conductor of this cable/).fill('0.45');

  // Instant, from the shared engine in the browser…
  const distance = page.getByTestId('fault-distance');
  await expect(distance).toHaveText('7.4 m');
  await expect(page.getByText('Worked out as you type')).toBeVisible();
  const marker = page.getByTestId('fault-marker');
  await expect(marker).toBeVisible();
  expect(Number(await marker.getAttribute('data-distance-m'))).toBeCloseTo(7.4, 6);
  await expect(page.getByRole('img', { name: /fault about 7\.4 m from the near end/ })).toBeVisible();

  // …then confirmed by the server.
  await readings.getByRole('button', { name: 'Calculate' }).click();
  await expect(page.getByText('✓ Checked by the server')).toBeVisible();

  // Feet: 7.4 m / 0.3048 = 24.28 ft; the typed length keeps its metres.
  await page.getByRole('group', { name: 'Lengths' }).getByText('ft', { exact: true }).click();
  await expect(distance).toHaveText('24.3 ft');
  await expect(readings.getByLabel(/^Cable length \(ft\)/)).toHaveValue('39.37');
  await expect(page.getByRole('img', { name: /fault about 24\.3 ft from the near end/ })).toBeVisible();
  await expect(page.getByText('✓ Checked by the server')).toBeVisible();
  await page.screenshot({ path: 'test-results/fault-locator-feet.png', fullPage: true });
  // Back to metres, so the preference is as the demo had it.
  await page.getByRole('group', { name: 'Lengths' }).getByText('m', { exact: true }).click();
  await expect(distance).toHaveText('7.4 m');
  await expect(readings.getByLabel(/^Cable length \(m\)/)).toHaveValue('12');

  // Murray loop: the wiring sketch says which arm goes where; 600 m with the faulted line's arm at 1
  // and the sound line's at 3 puts the fault at 2 · 600 · 1/4 = 300 m (x = 2L · a_faulted / (a_faulted + a_sound)).
  await readings.getByText('Murray loop bridge').click();
  await expect(
    page.getByRole('img', { name: /Wiring of the Murray loop: the bridge arm on the faulted line and the bridge arm on the sound line/ }),
  ).toBeVisible();
  await readings.getByLabel(/^Cable length/).fill('600');
  await readings.getByLabel(/^Bridge arm on the faulted line/).fill('3');
  await readings.getByLabel(/^Bridge arm on the sound line/).fill('1');
  // The arms the wrong way round would put the fault beyond the far end: refused on the faulted arm.
  await expect(readings.locator('#locate-faultedArm-error')).toContainText('beyond the end');
  await readings.getByLabel(/^Bridge arm on the faulted line/).fill('1');
  await readings.getByLabel(/^Bridge arm on the sound line/).fill('3');
  await expect(distance).toHaveText('300 m');
  await readings.getByRole('button', { name: 'Calculate' }).click();
  await expect(page.getByText('✓ Checked by the server')).toBeVisible();
  await page.screenshot({ path: 'test-results/fault-locator-murray.png', fullPage: true });

  // A noisy trace with a short 96 ns after the incident edge, 1 ns per sample.
  const csv = traceCsv(synthesiseTrace({ samples: 2000, dtS: 1e-9, roundTripS: 96e-9, rho: -1, noiseV: 0.01, seed: 5 }));
  await page
    .getByLabel('Trace file (CSV from the scope)')
    .setInputFiles({ name: 'strip-6-left.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
  await page.locator('#trace-velocityFactor').fill('0.66');
  await page.getByRole('button', { name: 'Analyse trace' }).click();
  const roundTrip = page.getByTestId('trace-round-trip');
  await expect(roundTrip).toHaveText(/ns$/);
  const deltaNs = Number((await roundTrip.textContent())!.replace(' ns', ''));
  expect(Math.abs(deltaNs - 96)).toBeLessThanOrEqual(1); // within one sample interval
  await expect(page.getByTestId('trace-polarity')).toContainText('short');
  await expect(page.getByTestId('trace-markers')).toContainText(/Incident edge at 300\.\d\d ns, reflection at 39\d\.\d\d ns/);
  await expect(page.getByTestId('trace-distance')).toHaveText(/^9\.\d+ m ±/); // 0.66 · c · 96 ns / 2 ≈ 9.5 m
  await expect(page.getByRole('img', { name: /incident edge at 300\.\d\d ns and the reflection at/ })).toBeVisible();

  // Ten samples later by hand: Δt grows by 10 ns, the distance follows (d = VF · c · Δt / 2),
  // and the TDR method receives the moved round trip.
  await page.getByRole('button', { name: 'Reflection: 10 samples later' }).click();
  await expect(roundTrip).toHaveText(`${(deltaNs + 10).toFixed(2)} ns`);
  await expect(page.getByTestId('trace-polarity')).toContainText('short');
  const movedM = (0.66 * 299_792_458 * (deltaNs + 10) * 1e-9) / 2;
  await expect(page.getByTestId('trace-distance')).toHaveText(new RegExp(`^${movedM.toFixed(1).replace('.', '\\.')} m ±`));
  await page.getByRole('button', { name: 'Use this round trip in the TDR method' }).click();
  await expect(readings.getByRole('radio', { name: /TDR/ })).toBeChecked();
  await expect(readings.getByLabel(/Time from incident edge to reflection/)).toHaveValue(`${(deltaNs + 10).toFixed(2)}`);
});
