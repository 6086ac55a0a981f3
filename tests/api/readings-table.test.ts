import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp } from '../setup/test-app';
import { venueIds } from './testing-helpers';
import { addOtherOrg } from '../setup/other-org';
import * as s from '../../server/db/schema';
import { csvCell, safeFileName } from '../../server/lib/spreadsheet';

let t: TestApp;
let other: Awaited<ReturnType<typeof addOtherOrg>>;
let hallId: string;
let annexId: string;
beforeAll(async () => {
  t = await createTestApp();
  other = await addOtherOrg(t);
  ({ hall: hallId, annex: annexId } = await venueIds(t));
});
afterAll(() => t.close());

type Row = {
  id: string;
  stripLabel: string;
  positionName: string;
  assetTag: string | null;
  testKind: string;
  conductors: string;
  valueText: string;
  valueOhm: number | null;
  verdict: string;
  limitOhm: number | null;
  source: string;
  profileName: string;
  profileVersion: number;
  takenByName: string;
  takenAt: string;
  supersedesId: string | null;
  supersededBy: string | null;
  superseded: boolean;
  correctionReason: string | null;
};

/** Parses our CSV (RFC 4180, quoted cells may hold commas, quotes and line breaks). */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') {
      row.push(cell);
      cell = '';
    } else if (c === '\r') continue;
    else if (c === '\n') {
      row.push(cell);
      rows.push(row);
      row = [];
      cell = '';
    } else cell += c;
  }
  return rows;
}

describe('GET /api/venues/:id/readings', () => {
  test('every reading of the venue with strip, position, tag, value as typed, verdict, limit, source, profile version, who and when', async () => {
    const nina = await t.agentFor(DEMO.organiser);
    const res = await nina.get(`/api/venues/${hallId}/readings`);
    expect(res.status).toBe(200);
    const rows = res.body as Row[];
    const inHall = t.sqlite
      .prepare(
        'select count(*) as n from readings r join steps st on r.step_id = st.id join positions p on st.position_id = p.id join strips x on p.strip_id = x.id where x.venue_id = ?',
      )
      .get(hallId) as { n: number };
    expect(rows.length).toBe(inHall.n);
    expect(rows.length).toBeGreaterThan(200);
    const near = rows.find(
      (r) => r.stripLabel === 'Strip 2' && r.positionName === 'Left floor cable' && r.conductors === 'A' && r.testKind === 'continuity',
    )!;
    expect(near).toMatchObject({
      valueText: '2.31',
      valueOhm: 2.31,
      verdict: 'near-limit',
      limitOhm: 2.5,
      source: 'FIE Material Rules, art. m.55.5',
      profileName: 'Competition default',
      profileVersion: 1,
      takenByName: 'Sam Reyes',
      superseded: false,
      supersededBy: null,
    });
    expect(near.assetTag).toMatch(/^FC-/);
  });

  test('a correction and the reading it supersedes are both listed, linked, with the reason', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const before = ((await sam.get(`/api/venues/${hallId}/readings`)).body as Row[]).find(
      (r) => r.stripLabel === 'Strip 3' && r.verdict === 'fail',
    )!;
    const correction = await sam.post('/api/readings').send({
      id: crypto.randomUUID(),
      stepId: t.db.select().from(s.readings).where(eq(s.readings.id, before.id)).get()!.stepId,
      value: '0.34',
      supersedesId: before.id,
      correctionReason: 'Typed 3.4 for 0.34',
    });
    expect(correction.status).toBe(201);
    const rows = (await sam.get(`/api/venues/${hallId}/readings`)).body as Row[];
    expect(rows.find((r) => r.id === before.id)).toMatchObject({
      superseded: true,
      supersededBy: correction.body.id,
      valueText: '3.4',
      verdict: 'fail',
    });
    expect(rows.find((r) => r.id === correction.body.id)).toMatchObject({
      supersedesId: before.id,
      correctionReason: 'Typed 3.4 for 0.34',
      superseded: false,
      valueText: '0.34',
    });
  });

  test('another organisation’s venue is 404; a technician not assigned is 403', async () => {
    const marco = await t.agentFor(DEMO.director);
    expect((await marco.get(`/api/venues/${other.venueId}/readings`)).status).toBe(404);
    expect((await marco.get(`/api/venues/${other.venueId}/readings.csv`)).status).toBe(404);
    const lee = await t.agentFor(DEMO.annexTechnician);
    expect((await lee.get(`/api/venues/${hallId}/readings`)).status).toBe(403);
    expect((await lee.get(`/api/venues/${hallId}/readings.csv`)).status).toBe(403);
    expect((await lee.get(`/api/venues/${annexId}/readings`)).status).toBe(200);
  });
});

describe('GET /api/venues/:id/readings.csv', () => {
  test('a CSV attachment with a header row and one line per reading, named after the venue', async () => {
    const marco = await t.agentFor(DEMO.director);
    const res = await marco
      .get(`/api/venues/${annexId}/readings.csv`)
      .buffer(true)
      .parse((r, cb) => {
        let data = '';
        r.setEncoding('utf8');
        r.on('data', (c: string) => (data += c));
        r.on('end', () => cb(null, data));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toBe('attachment; filename="Riverside-Annex-readings.csv"');
    const rows = parseCsv(res.body as string);
    expect(rows[0].slice(0, 10)).toEqual([
      'Strip',
      'Position',
      'Asset tag',
      'Test',
      'Conductors',
      'Value as typed',
      'Lead null (ohm)',
      'Value (ohm)',
      'Over range',
      'Verdict',
    ]);
    expect(rows[0]).toContain('Profile version');
    expect(rows.length - 1).toBe(((await marco.get(`/api/venues/${annexId}/readings`)).body as Row[]).length);
    const header = rows[0];
    const first = Object.fromEntries(header.map((h, i) => [h, rows[1][i]]));
    expect(first).toMatchObject({
      Strip: 'Annex 1',
      Position: 'Left floor cable',
      Profile: 'Competition default',
      'Profile version': '1',
      'Taken by': 'Lee Varga',
    });
    // Lee's demo readings were typed with a 0.05 Ω test-lead null: typed − null = the value judged.
    expect(first).toMatchObject({ 'Lead null (ohm)': '0.05', 'Lead null meter': 'Meter 2' });
    expect(Number(first['Value as typed']) - 0.05).toBeCloseTo(Number(first['Value (ohm)']), 9);
  });

  test('cells that a spreadsheet would run as a formula are defused with a leading apostrophe', async () => {
    const marco = await t.agentFor(DEMO.director);
    // A strip label and a correction reason typed as formulas.
    let plan = await marco.get(`/api/venues/${annexId}`);
    const strip = plan.body.strips[0];
    plan = await marco
      .patch(`/api/strips/${strip.id}`)
      .set('If-Match', plan.headers.etag)
      .send({ label: '=HYPERLINK("http://x.example","a")' });
    expect(plan.status).toBe(200);
    const old = ((await marco.get(`/api/venues/${annexId}/readings`)).body as Row[])[0];
    const stepId = t.db.select().from(s.readings).where(eq(s.readings.id, old.id)).get()!.stepId;
    const fix = await marco
      .post('/api/readings')
      .send({ id: crypto.randomUUID(), stepId, value: '0.5', supersedesId: old.id, correctionReason: '@SUM(1+1) +cmd -2' });
    expect(fix.status).toBe(201);
    const res = await marco
      .get(`/api/venues/${annexId}/readings.csv`)
      .buffer(true)
      .parse((r, cb) => {
        let data = '';
        r.setEncoding('utf8');
        r.on('data', (c: string) => (data += c));
        r.on('end', () => cb(null, data));
      });
    const rows = parseCsv(res.body as string);
    const labels = rows.slice(1).map((r) => r[0]);
    expect(labels).toContain(`'=HYPERLINK("http://x.example","a")`);
    expect(labels.some((l) => l.startsWith('='))).toBe(false);
    const reasonCol = rows[0].indexOf('Correction reason');
    expect(rows.slice(1).map((r) => r[reasonCol])).toContain("'@SUM(1+1) +cmd -2");
    for (const r of rows.slice(1)) for (const cell of r) expect(cell).not.toMatch(/^[=+\-@]/);
  });

  test('the guard and the file name on their own', () => {
    expect(csvCell('+1')).toBe("'+1");
    expect(csvCell('-0.2')).toBe("'-0.2");
    expect(csvCell('plain')).toBe('plain');
    expect(csvCell('a,"b"')).toBe('"a,""b"""');
    expect(csvCell(null)).toBe('');
    expect(safeFileName('Salle Étoile / "Nord"\r\n')).toBe('Salle-Etoile-Nord');
    expect(safeFileName('../../')).toBe('venue');
  });
});

describe('GET /api/venues/:id/readings.csv times', () => {
  test('taken and received at are ISO 8601 with the venue offset, the same instant as stored', async () => {
    const marco = await t.agentFor(DEMO.director);
    let plan = await marco.get(`/api/venues/${annexId}`);
    plan = await marco.patch(`/api/venues/${annexId}`).set('If-Match', plan.headers.etag).send({ timeZone: 'Europe/Paris' });
    expect(plan.status).toBe(200);
    expect(plan.body.venue.timeZone).toBe('Europe/Paris');
    const res = await marco
      .get(`/api/venues/${annexId}/readings.csv`)
      .buffer(true)
      .parse((r, cb) => {
        let data = '';
        r.setEncoding('utf8');
        r.on('data', (c: string) => (data += c));
        r.on('end', () => cb(null, data));
      });
    const [header, ...lines] = parseCsv(res.body as string);
    const taken = header.indexOf('Taken at');
    const received = header.indexOf('Received at');
    expect(lines.length).toBeGreaterThan(0);
    const stored = new Map(
      (t.sqlite.prepare('select id, taken_at as at from readings').all() as { id: string; at: string }[]).map((r) => [r.id, r.at]),
    );
    for (const l of lines) {
      // The demo's readings are in November: Paris is on CET, UTC+01:00 (IANA tz database, Rule EU: summer time ends on the last Sunday of October).
      expect(l[taken]).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\+01:00$/);
      expect(Math.floor(Date.parse(l[taken]) / 1000)).toBe(Math.floor(Date.parse(stored.get(l[header.indexOf('Reading id')])!) / 1000));
      if (l[received]) expect(l[received]).toMatch(/\+01:00$/);
    }
    // A name Intl does not know is refused and changes nothing (422, the field named).
    plan = await marco.get(`/api/venues/${annexId}`);
    const bad = await marco.patch(`/api/venues/${annexId}`).set('If-Match', plan.headers.etag).send({ timeZone: 'Mars/Olympus_Mons' });
    expect(bad.status).toBe(422);
    expect(bad.headers['content-type']).toMatch(/problem\+json/);
    expect((await marco.get(`/api/venues/${annexId}`)).body.venue.timeZone).toBe('Europe/Paris');
  });
});

describe('GET /api/venues/:id/readings.csv with the table’s filters', () => {
  const csvOf = async (agent: Awaited<ReturnType<TestApp['agentFor']>>, url: string) => {
    const res = await agent
      .get(url)
      .buffer(true)
      .parse((r, cb) => {
        let data = '';
        r.setEncoding('utf8');
        r.on('data', (c: string) => (data += c));
        r.on('end', () => cb(null, data));
      });
    expect(res.status).toBe(200);
    const [header, ...lines] = parseCsv(res.body as string);
    return lines.map((l) => Object.fromEntries(header.map((h, i) => [h, l[i]])));
  };
  // Expected counts come straight from the database, not from the service under test.
  const countInHall = (where: string, ...args: unknown[]) =>
    (
      t.sqlite
        .prepare(
          `select count(*) as n from readings r join steps st on r.step_id = st.id join positions p on st.position_id = p.id join strips x on p.strip_id = x.id where x.venue_id = ? and ${where}`,
        )
        .get(hallId, ...args) as { n: number }
    ).n;

  test('verdict and strip: only the failed readings of that strip', async () => {
    const marco = await t.agentFor(DEMO.director);
    const strip3 = t.sqlite.prepare("select id from strips where venue_id = ? and label = 'Strip 3'").get(hallId) as { id: string };
    const rows = await csvOf(marco, `/api/venues/${hallId}/readings.csv?verdict=fail&strip=${strip3.id}`);
    const expected = countInHall("r.verdict = 'fail' and x.id = ?", strip3.id);
    expect(expected).toBeGreaterThan(0);
    expect(rows).toHaveLength(expected);
    for (const r of rows) expect(r).toMatchObject({ Strip: 'Strip 3', Verdict: 'fail' });
  });

  test('who and a from–to window: only that person’s readings taken inside it', async () => {
    const marco = await t.agentFor(DEMO.director);
    const sam = t.sqlite.prepare('select id from users where email = ?').get(DEMO.technician) as { id: string };
    const times = (t.sqlite.prepare('select taken_at as at from readings order by julianday(taken_at)').all() as { at: string }[]).map(
      (r) => r.at,
    );
    const from = new Date(Date.parse(times[Math.floor(times.length / 4)])).toISOString();
    const to = new Date(Date.parse(times[Math.floor((times.length * 3) / 4)])).toISOString();
    const url = `/api/venues/${hallId}/readings.csv?who=${sam.id}&from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}`;
    const rows = await csvOf(marco, url);
    const expected = countInHall(
      'r.taken_by = ? and julianday(r.taken_at) >= julianday(?) and julianday(r.taken_at) <= julianday(?)',
      sam.id,
      from,
      to,
    );
    expect(expected).toBeGreaterThan(0);
    expect(expected).toBeLessThan(countInHall('r.taken_by = ?', sam.id));
    expect(rows).toHaveLength(expected);
    for (const r of rows) {
      expect(r['Taken by']).toBe('Sam Reyes');
      // The CSV gives times to the second (ISO 8601 with the venue's offset).
      expect(Date.parse(r['Taken at'])).toBeGreaterThanOrEqual(Math.floor(Date.parse(from) / 1000) * 1000);
      expect(Date.parse(r['Taken at'])).toBeLessThanOrEqual(Date.parse(to));
    }
    // The same time written with another zone is the same instant.
    const shifted = new Date(Date.parse(from) + 2 * 3600_000).toISOString().replace('Z', '+02:00');
    const again = await csvOf(
      marco,
      `/api/venues/${hallId}/readings.csv?who=${sam.id}&from=${encodeURIComponent(shifted)}&to=${encodeURIComponent(to)}`,
    );
    expect(again).toHaveLength(expected);
  });

  test('the JSON list takes the same filters', async () => {
    const marco = await t.agentFor(DEMO.director);
    const res = await marco.get(`/api/venues/${hallId}/readings?verdict=near-limit&test=continuity`);
    expect(res.status).toBe(200);
    expect(res.body).toHaveLength(countInHall("r.verdict = 'near-limit' and st.test_kind = 'continuity'"));
    for (const r of res.body as Row[]) expect(r).toMatchObject({ verdict: 'near-limit', testKind: 'continuity' });
  });

  test.each([
    ['verdict=broken', 'verdict'],
    ['strip=strip-3', 'strip'],
    ['who=1', 'who'],
    ['from=yesterday', 'from'],
    ['from=2026-03-14T09:00:00', 'from'],
    ['from=2026-03-14T10:00:00Z&to=2026-03-14T09:00:00Z', 'to'],
    ['verdict=fail&verdict=pass', 'verdict'],
    ['colour=red', ''],
  ])('a bad filter (%s) is 422 problem+json that names it', async (query, field) => {
    const marco = await t.agentFor(DEMO.director);
    const res = await marco.get(`/api/venues/${hallId}/readings.csv?${query}`);
    expect(res.status).toBe(422);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.detail).toContain(field);
  });
});
