import sharp from 'sharp';
import exifReader from 'exif-reader';
import { test, expect, apiAs } from './fixtures';
import { roundTripNsFor, syntheticTdrTrace } from '../tests/setup/synthetic-trace';

const nsOf = (text: string | null) => Number((text ?? '').replace(/[^\d.-]/g, ''));

test.describe('a scope trace on a fault', () => {
  test('Sam uploads a trace on Strip 6, sees the markers at the right times, nudges one and the estimate follows', async ({
    page,
    signIn,
  }) => {
    await signIn('technician');
    const venues = await apiAs<{ id: string; name: string }[]>(page, 'GET', '/api/venues');
    const hall = venues.body.find((v) => v.name === 'Riverside Sports Hall')!;
    const faults = await apiAs<{ id: string; stripLabel: string; positionName: string }[]>(page, 'GET', `/api/venues/${hall.id}/faults`);
    const fault = faults.body.find((f) => f.stripLabel === 'Strip 6' && f.positionName === 'Left floor cable')!;

    // The demo short: 7.4 m from the apparatus on a 12 m cable of VF 0.6 (invented demo data).
    const trace = syntheticTdrTrace({ roundTripNs: roundTripNsFor(7.4, 0.6), samples: 3000 });
    const sampleNs = trace.sampleIntervalS * 1e9;

    await page.goto(`/faults/${fault.id}`);
    await expect(page.getByRole('heading', { name: 'Photos, scope traces and files' })).toBeVisible();
    await expect(page.getByTestId('camera-input')).toHaveAttribute('capture', 'environment');
    await page
      .getByTestId('file-input')
      .setInputFiles({ name: 'strip6-left-AB.csv', mimeType: 'text/csv', buffer: Buffer.from(trace.csv) });
    await expect(page.getByText('strip6-left-AB.csv is attached.')).toBeVisible();
    await expect(page.getByTestId('trace-plot').locator('canvas')).toBeVisible();

    const incident = nsOf(await page.getByTestId('marker-incident-time').textContent());
    const reflection = nsOf(await page.getByTestId('marker-reflection-time').textContent());
    expect(Math.abs(incident - trace.incidentS * 1e9)).toBeLessThan(sampleNs);
    expect(Math.abs(reflection - trace.reflectionS * 1e9)).toBeLessThan(sampleNs);
    expect(Math.abs(nsOf(await page.getByTestId('trace-round-trip').textContent()) - trace.roundTripNs)).toBeLessThan(sampleNs);
    await expect(page.getByTestId('trace-polarity')).toHaveText('Opposite way: a short');
    await expect(page.getByTestId('trace-distance')).toContainText('7.4 m');

    // Ten samples later by hand: the round trip grows by 2 ns and the distance with it.
    await page.getByRole('button', { name: 'Reflection: 10 samples later' }).click();
    await expect(page.getByTestId('marker-reflection-time')).toHaveText(`${(reflection + 10 * sampleNs).toFixed(2)} ns`);
    const moved = nsOf(await page.getByTestId('trace-round-trip').textContent());
    expect(moved - (reflection - incident)).toBeCloseTo(10 * sampleNs, 1);
    // d = VF · c · Δt / 2 (Ulaby, TDR section): 2 ns more at VF 0.6 is 0.18 m further.
    const expectedM = (0.6 * 299_792_458 * moved * 1e-9) / 2;
    expect(Math.abs(nsOf((await page.getByTestId('trace-distance').textContent())!.split(' m')[0]!) - expectedM)).toBeLessThan(0.01);

    // "Save this estimate" posts a TDR estimate; answered here so the demo fault keeps its estimates.
    let posted: Record<string, unknown> | null = null;
    await page.route('**/api/faults/*/estimates', async (route) => {
      posted = route.request().postDataJSON() as Record<string, unknown>;
      await route.fulfill({ status: 201, json: {} });
    });
    await page.getByRole('button', { name: 'Save this estimate' }).click();
    await expect(page.getByText('Saved with the fault’s estimates.')).toBeVisible();
    expect(posted).toMatchObject({ method: 'tdr', velocityFactor: 0.6, fromEnd: 'near' });
    expect(Math.abs((posted!.roundTripNs as number) - moved)).toBeLessThan(0.01);
  });
});

test.describe('a photo on a fault', () => {
  test('Sam attaches a photo that carries its location: the control says it is removed, and the stored photo has no GPS', async ({
    page,
    signIn,
  }) => {
    await signIn('technician');
    const venues = await apiAs<{ id: string; name: string }[]>(page, 'GET', '/api/venues');
    const hall = venues.body.find((v) => v.name === 'Riverside Sports Hall')!;
    const faults = await apiAs<{ id: string; stripLabel: string }[]>(page, 'GET', `/api/venues/${hall.id}/faults`);
    const fault = faults.body.find((f) => f.stripLabel === 'Strip 6')!;
    const photo = await sharp({ create: { width: 320, height: 240, channels: 3, background: '#c87828' } })
      .jpeg()
      .withExif({
        IFD2: { DateTimeOriginal: '2026:11:21 08:15:42', BodySerialNumber: 'SN-4471-0098' },
        IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 1234/100' },
      })
      .toBuffer();

    await page.goto(`/faults/${fault.id}`);
    await expect(page.getByTestId('photo-privacy')).toHaveText(/without their location \(GPS\) and the device.s serial number/);
    await page.getByTestId('file-input').setInputFiles({ name: 'connector.jpg', mimeType: 'image/jpeg', buffer: photo });
    await expect(page.getByText('connector.jpg is attached.')).toBeVisible();
    await page.screenshot({ path: test.info().outputPath('photo-attached.png'), fullPage: true });

    const list = await apiAs<{ id: string; originalName: string; sha256: string }[]>(page, 'GET', `/api/faults/${fault.id}/attachments`);
    const stored = list.body.find((a) => a.originalName === 'connector.jpg')!;
    const file = await page.request.get(`/api/attachments/${stored.id}`);
    const exif = exifReader((await sharp(await file.body()).metadata()).exif!);
    expect(exif.GPSInfo).toBeUndefined();
    expect(exif.Photo?.BodySerialNumber).toBeUndefined();
    expect(exif.Photo?.DateTimeOriginal).toEqual(new Date('2026-11-21T08:15:42Z'));
  });
});

test.describe('importing the register', () => {
  test('Ada previews a club spreadsheet and sees each row that would not be imported, and why', async ({ page, signIn }) => {
    await signIn('admin');
    const csv = [
      'Tag,Type,Description,Length (ft),Status',
      'FC-801,Floor cable,Spare,39.37,OK',
      'XX-1,Trampoline,Not ours,10,',
      'FC-802,Floor cable,Bad length,twelve,',
      'FC-803,Floor cable,Twice,12,',
      'FC-803,Floor cable,Twice again,12,',
    ].join('\n');
    await page.goto('/equipment');
    await page.getByRole('link', { name: 'Import from a spreadsheet' }).click();
    await expect(page.getByRole('heading', { level: 1, name: 'Import the register from a spreadsheet' })).toBeVisible();
    await page.getByTestId('import-file').setInputFiles({ name: 'club.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });

    const table = page.getByTestId('import-preview');
    await expect(table.locator('tr[data-row="2"]')).toHaveAttribute('data-action', 'create');
    await expect(table.locator('tr[data-row="2"]')).toContainText('12 m');
    await expect(table.locator('tr[data-row="3"]')).toHaveAttribute('data-action', 'error');
    await expect(table.locator('tr[data-row="3"]')).toContainText('Unknown kind “Trampoline”');
    await expect(table.locator('tr[data-row="4"]')).toContainText('“twelve” is not a length');
    await expect(table.locator('tr[data-row="5"]')).toContainText('Duplicate in file: FC-803 is also on row 6.');
    await expect(table.locator('tr[data-row="6"]')).toContainText('Duplicate in file: FC-803 is also on row 5.');
    await expect(page.getByLabel('Asset tag')).toHaveValue('0');
    await expect(page.getByRole('button', { name: 'Import 1 new and 0 updated' })).toBeEnabled();
    // Nothing written by the preview.
    const register = await apiAs<{ assetTag: string }[]>(page, 'GET', '/api/equipment?q=FC-80');
    expect(register.body.map((e) => e.assetTag)).not.toContain('FC-801');
  });
});
