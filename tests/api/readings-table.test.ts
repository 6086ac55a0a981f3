import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp } from '../setup/test-app';
import { venueIds } from './testing-helpers';
import { addOtherOrg } from '../setup/other-org';
import * as s from '../../server/db/schema';
import { csvCell, safeFileName } from '../../server/services/readings-table.service';

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
  id: string; stripLabel: string; positionName: string; assetTag: string | null; testKind: string; conductors: string;
  valueText: string; valueOhm: number | null; verdict: string; limitOhm: number | null; source: string;
  profileName: string; profileVersion: number; takenByName: string; takenAt: string;
  supersedesId: string | null; supersededBy: string | null; superseded: boolean; correctionReason: string | null;
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
      if (c === '"' && text[i + 1] === '"') { cell += '"'; i++; }
      else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') { row.push(cell); cell = ''; }
    else if (c === '\r') continue;
    else if (c === '\n') { row.push(cell); rows.push(row); row = []; cell = ''; }
    else cell += c;
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
      .prepare('select count(*) as n from readings r join steps st on r.step_id = st.id join positions p on st.position_id = p.id join strips x on p.strip_id = x.id where x.venue_id = ?')
      .get(hallId) as { n: number };
    expect(rows.length).toBe(inHall.n);
    expect(rows.length).toBeGreaterThan(200);
    const near = rows.find((r) => r.stripLabel === 'Strip 2' && r.positionName === 'Left floor cable' && r.conductors === 'A' && r.testKind === 'continuity')!;
    expect(near).toMatchObject({
      valueText: '2.31', valueOhm: 2.31, verdict: 'near-limit', limitOhm: 2.5, source: 'FIE Material Rules, art. m.55.5',
      profileName: 'Competition default', profileVersion: 1, takenByName: 'Sam Reyes', superseded: false, supersededBy: null,
    });
    expect(near.assetTag).toMatch(/^FC-/);
  });

  test('a correction and the reading it supersedes are both listed, linked, with the reason', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const before = ((await sam.get(`/api/venues/${hallId}/readings`)).body as Row[]).find((r) => r.stripLabel === 'Strip 3' && r.verdict === 'fail')!;
    const correction = await sam.post('/api/readings').send({
      id: crypto.randomUUID(), stepId: t.db.select().from(s.readings).where(eq(s.readings.id, before.id)).get()!.stepId,
      value: '0.34', supersedesId: before.id, correctionReason: 'Typed 3.4 for 0.34',
    });
    expect(correction.status).toBe(201);
    const rows = (await sam.get(`/api/venues/${hallId}/readings`)).body as Row[];
    expect(rows.find((r) => r.id === before.id)).toMatchObject({ superseded: true, supersededBy: correction.body.id, valueText: '3.4', verdict: 'fail' });
    expect(rows.find((r) => r.id === correction.body.id)).toMatchObject({ supersedesId: before.id, correctionReason: 'Typed 3.4 for 0.34', superseded: false, valueText: '0.34' });
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
    const res = await marco.get(`/api/venues/${annexId}/readings.csv`).buffer(true).parse((r, cb) => {
      let data = '';
      r.setEncoding('utf8');
      r.on('data', (c: string) => (data += c));
      r.on('end', () => cb(null, data));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toBe('attachment; filename="Riverside-Annex-readings.csv"');
    const rows = parseCsv(res.body as string);
    expect(rows[0].slice(0, 10)).toEqual(['Strip', 'Position', 'Asset tag', 'Test', 'Conductors', 'Value as typed', 'Lead null (ohm)', 'Value (ohm)', 'Over range', 'Verdict']);
    expect(rows[0]).toContain('Profile version');
    expect(rows.length - 1).toBe(((await marco.get(`/api/venues/${annexId}/readings`)).body as Row[]).length);
    const header = rows[0];
    const first = Object.fromEntries(header.map((h, i) => [h, rows[1][i]]));
    expect(first).toMatchObject({ Strip: 'Annex 1', Position: 'Left floor cable', Profile: 'Competition default', 'Profile version': '1', 'Taken by': 'Lee Varga' });
    // Lee's demo readings were typed with a 0.05 Ω test-lead null: typed − null = the value judged.
    expect(first).toMatchObject({ 'Lead null (ohm)': '0.05', 'Lead null meter': 'Meter 2' });
    expect(Number(first['Value as typed']) - 0.05).toBeCloseTo(Number(first['Value (ohm)']), 9);
  });

  test('cells that a spreadsheet would run as a formula are defused with a leading apostrophe', async () => {
    const marco = await t.agentFor(DEMO.director);
    // A strip label and a correction reason typed as formulas.
    let plan = await marco.get(`/api/venues/${annexId}`);
    const strip = plan.body.strips[0];
    plan = await marco.patch(`/api/strips/${strip.id}`).set('If-Match', plan.headers.etag).send({ label: '=HYPERLINK("http://x.example","a")' });
    expect(plan.status).toBe(200);
    const old = ((await marco.get(`/api/venues/${annexId}/readings`)).body as Row[])[0];
    const stepId = t.db.select().from(s.readings).where(eq(s.readings.id, old.id)).get()!.stepId;
    const fix = await marco.post('/api/readings').send({ id: crypto.randomUUID(), stepId, value: '0.5', supersedesId: old.id, correctionReason: '@SUM(1+1) +cmd -2' });
    expect(fix.status).toBe(201);
    const res = await marco.get(`/api/venues/${annexId}/readings.csv`).buffer(true).parse((r, cb) => {
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
