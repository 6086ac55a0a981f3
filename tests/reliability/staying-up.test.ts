// Staying up: a large trace, workbook or certificate never holds the event loop (worker pool, with
// a bound on jobs in flight), a workbook that unpacks to gigabytes is refused, health says so when
// the database cannot commit, and a bad environment variable stops the start.
import { afterAll, beforeAll, describe, expect, test, vi } from 'vitest';
import { ZipArchive } from 'archiver';
import { randomUUID } from 'node:crypto';
import { loadEnv } from '../../server/config/env';
import { equipment } from '../../server/db/schema';
import { createTestApp, DEMO, ORIGIN, type TestApp } from '../setup/test-app';
import { synthesiseTrace, traceCsv } from '../setup/synthetic-trace';
import { stripByLabel, venueIds } from '../api/testing-helpers';

describe('the environment', () => {
  test('an empty PORT= is refused like any bad value, naming the variable', () => {
    for (const bad of ['', ' ', 'abc', '0', '-1', '65536', '3000.5', '1e3']) {
      expect(() => loadEnv({ PORT: bad }), `PORT=${JSON.stringify(bad)}`).toThrow(/PORT must be/);
    }
    expect(loadEnv({ PORT: '4000' }).PORT).toBe(4000);
    expect(loadEnv({}).PORT).toBe(3000);
  });

  test('the other numbers are held to the same rule; the SMTP fake may still ask for any free port', () => {
    expect(() => loadEnv({ SMTP_FAKE_PORT: '' })).toThrow(/SMTP_FAKE_PORT must be/);
    expect(() => loadEnv({ SIGNIN_RATE_LIMIT: '' })).toThrow(/SIGNIN_RATE_LIMIT must be/);
    expect(() => loadEnv({ SESSION_IDLE_MINUTES: 'soon' })).toThrow(/SESSION_IDLE_MINUTES must be/);
    expect(loadEnv({ SMTP_FAKE_PORT: '0' }).SMTP_FAKE_PORT).toBe(0);
  });

  test('ALLOWED_HOSTS takes host names separated by commas or spaces, and refuses a URL', () => {
    expect(loadEnv({ ALLOWED_HOSTS: 'Hall.Example.org, tablets.local  10.0.0.9' }).ALLOWED_HOSTS).toEqual([
      'hall.example.org',
      'tablets.local',
      '10.0.0.9',
    ]);
    expect(loadEnv({}).ALLOWED_HOSTS).toEqual([]);
    expect(() => loadEnv({ ALLOWED_HOSTS: 'https://hall.example.org' })).toThrow(/ALLOWED_HOSTS/);
  });
});

describe('GET /api/health', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ seed: false });
  });
  afterAll(() => t.close());

  test('when the database opens and reads but cannot commit a write, then 503 (and ok again once it can)', async () => {
    expect((await t.request.get('/api/health')).body).toMatchObject({ status: 'ok', db: 'ok' });
    // The error is logged for the operator; here it is expected.
    const logged = vi.spyOn(t.deps.log, 'error').mockImplementation(() => {});
    t.sqlite.pragma('query_only = ON');
    try {
      expect(t.sqlite.prepare('select 1 as one').get()).toEqual({ one: 1 });
      const res = await t.request.get('/api/health');
      expect(res.status).toBe(503);
      expect(res.body).toMatchObject({ status: 'degraded', db: 'error' });
      expect(logged).toHaveBeenCalled();
    } finally {
      t.sqlite.pragma('query_only = OFF');
    }
    expect((await t.request.get('/api/health')).status).toBe(200);
  });
});

/** Waits (on the state, at most 20 s) until the pool holds `n` jobs. */
async function inFlight(t: TestApp, n: number) {
  for (let i = 0; i < 1000 && t.deps.workers.inFlight !== n; i++) await new Promise((r) => setTimeout(r, 20));
  expect(t.deps.workers.inFlight).toBe(n);
}

describe('large jobs run off the request thread', () => {
  let t: TestApp;
  let bigTrace: string;
  beforeAll(async () => {
    // One worker and no queue: the second large job at once is refused.
    t = await createTestApp({ workers: { threads: 1, queue: 0 } });
    bigTrace = traceCsv(
      synthesiseTrace({
        samples: 1_000_000,
        dtS: 0.1e-9,
        incidentS: 2000e-9,
        roundTripS: 1234.5e-9,
        rho: -1,
        riseS: 20e-9,
        noiseV: 0.01,
        seed: 5,
      }),
    );
  });
  afterAll(() => t.close());

  test(
    'while a million-sample trace is analysed, health and a reading are answered, before the analysis is',
    { timeout: 60_000 },
    async () => {
      const tech = await t.agentFor(DEMO.technician);
      const { hall } = await venueIds(t);
      const strip = await stripByLabel(t, hall, 'Strip 14');
      const done: string[] = [];
      const analysis = tech
        .post('/api/waveforms/analyse?velocityFactor=0.7')
        .set('Content-Type', 'text/csv')
        .send(bigTrace)
        .then((res) => {
          done.push('analysis');
          return res;
        });
      await inFlight(t, 1);
      const health = await t.request.get('/api/health');
      done.push('health');
      const reading = await tech.post('/api/readings').send({ id: randomUUID(), stepId: strip.positions[1].steps[0].id, value: '0.4' });
      done.push('reading');
      expect(health.status).toBe(200);
      expect(reading.status).toBe(201);
      const res = await analysis;
      expect(res.status).toBe(200);
      expect(res.body.sampleCount).toBe(1_000_000);
      expect(done).toEqual(['health', 'reading', 'analysis']);
    },
  );

  test(
    'when the pool is full, the next large job is answered 503 with Retry-After at once, and the running one completes',
    { timeout: 60_000 },
    async () => {
      const tech = await t.agentFor(DEMO.technician);
      // .then() sends it now (a supertest request goes out when it is awaited or .then is called).
      const first = tech
        .post('/api/waveforms/analyse')
        .set('Content-Type', 'text/csv')
        .send(bigTrace)
        .then((r) => r);
      await inFlight(t, 1);
      const second = await tech
        .post('/api/waveforms/analyse')
        .set('Content-Type', 'text/csv')
        .send(traceCsv(synthesiseTrace({ roundTripS: 80e-9 })));
      expect(second.status).toBe(503);
      expect(Number(second.headers['retry-after'])).toBeGreaterThan(0);
      expect(second.headers['content-type']).toMatch(/^application\/problem\+json/);
      expect(second.body.code).toBe('busy');
      expect((await first).status).toBe(200);
      // Room again: the small trace is analysed now.
      await inFlight(t, 0);
      const again = await tech
        .post('/api/waveforms/analyse')
        .set('Content-Type', 'text/csv')
        .send(traceCsv(synthesiseTrace({ roundTripS: 80e-9 })));
      expect(again.status).toBe(200);
    },
  );

  test('a refusal inside a worker reaches the caller as the same 422 problem it always was', async () => {
    const tech = await t.agentFor(DEMO.technician);
    const res = await tech.post('/api/waveforms/analyse').set('Content-Type', 'text/csv').send('time,volts\nnot,numbers\n');
    expect(res.status).toBe(422);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.code).toBe('waveform-refused');
  });
});

/** A minimal workbook whose one cell (a shared string) is `cellBytes` long: it compresses to very little. */
async function workbookWithCell(cellBytes: number): Promise<Buffer> {
  const zip = new ZipArchive({ zlib: { level: 9 } });
  const chunks: Buffer[] = [];
  zip.on('data', (c: Buffer) => chunks.push(c));
  const finished = new Promise<void>((resolve, reject) => {
    zip.on('end', () => resolve());
    zip.on('error', reject);
  });
  const ns = 'http://schemas.openxmlformats.org';
  zip.append(
    `<?xml version="1.0" encoding="UTF-8"?><Types xmlns="${ns}/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/><Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/><Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/><Override PartName="/xl/sharedStrings.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sharedStrings+xml"/></Types>`,
    { name: '[Content_Types].xml' },
  );
  zip.append(
    `<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="${ns}/package/2006/relationships"><Relationship Id="rId1" Type="${ns}/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/></Relationships>`,
    { name: '_rels/.rels' },
  );
  zip.append(
    `<?xml version="1.0" encoding="UTF-8"?><workbook xmlns="${ns}/spreadsheetml/2006/main" xmlns:r="${ns}/officeDocument/2006/relationships"><sheets><sheet name="Register" sheetId="1" r:id="rId1"/></sheets></workbook>`,
    { name: 'xl/workbook.xml' },
  );
  zip.append(
    `<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="${ns}/package/2006/relationships"><Relationship Id="rId1" Type="${ns}/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/><Relationship Id="rId2" Type="${ns}/officeDocument/2006/relationships/sharedStrings" Target="sharedStrings.xml"/></Relationships>`,
    { name: 'xl/_rels/workbook.xml.rels' },
  );
  zip.append(
    `<?xml version="1.0" encoding="UTF-8"?><worksheet xmlns="${ns}/spreadsheetml/2006/main"><sheetData><row r="1"><c r="A1" t="inlineStr"><is><t>Asset tag</t></is></c><c r="B1" t="inlineStr"><is><t>Kind</t></is></c></row><row r="2"><c r="A2" t="inlineStr"><is><t>FC-900</t></is></c><c r="B2" t="s"><v>0</v></c></row></sheetData></worksheet>`,
    { name: 'xl/worksheets/sheet1.xml' },
  );
  zip.append(
    `<?xml version="1.0" encoding="UTF-8"?><sst xmlns="${ns}/spreadsheetml/2006/main" count="1" uniqueCount="1"><si><t>${'A'.repeat(cellBytes)}</t></si></sst>`,
    {
      name: 'xl/sharedStrings.xml',
    },
  );
  await zip.finalize();
  await finished;
  return Buffer.concat(chunks);
}

describe('spreadsheet imports are bounded by what they unpack to', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  const send = async (bytes: Buffer, route: 'import/preview' | 'import') => {
    const ada = await t.agentFor(DEMO.admin);
    return ada.post(`/api/equipment/${route}`).set('Origin', ORIGIN).attach('file', bytes, 'register.xlsx');
  };

  test(
    'when a small workbook unpacks to 64 MB (one huge cell), then 413 problem+json and nothing is written',
    { timeout: 60_000 },
    async () => {
      const bomb = await workbookWithCell(64 * 2 ** 20);
      expect(bomb.length).toBeLessThan(200 * 1024);
      const before = t.db.select().from(equipment).all().length;
      for (const route of ['import/preview', 'import'] as const) {
        const res = await send(bomb, route);
        expect(res.status, route).toBe(413);
        expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
        expect(res.body.code).toBe('workbook-too-large');
      }
      expect(t.db.select().from(equipment).all().length).toBe(before);
    },
  );

  test('the same workbook with an ordinary cell is read', async () => {
    const res = await send(await workbookWithCell(10), 'import/preview');
    expect(res.status).toBe(200);
    expect(res.body.format).toBe('xlsx');
  });
});
