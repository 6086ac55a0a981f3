import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp } from '../setup/test-app';
import { certificates, faults, readings, signingKeys, signOffs, steps, users, venues } from '../../server/db/schema';
import { GOOD_VALUE, newReading, stepOf, stripByLabel, venueIds, type StripDto } from './testing-helpers';

let t: TestApp;
let hall: string;
let annex: string;
beforeAll(async () => {
  t = await createTestApp();
  ({ hall, annex } = await venueIds(t));
});
afterAll(() => t.close());

const countReadings = (id: string) => t.db.select().from(readings).where(eq(readings.id, id)).all().length;

describe('POST /api/readings', () => {
  let strip: StripDto;
  beforeAll(async () => {
    strip = await stripByLabel(t, hall, 'Strip 20');
  });

  test('when a floor cable reads 2.6 Ω on line A, then it fails the 2.5 Ω limit and names the FIE rule', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const { step } = stepOf(strip, 'Left floor cable', 'continuity', 'A');
    const res = await sam.post('/api/readings').send(newReading(step.id, '2.6'));
    expect(res.status).toBe(201);
    // FIE Material Rules m.55.5: ≤ 2.5 Ω per wire (cables connecting reel to apparatus)
    expect(res.body).toMatchObject({
      stepId: step.id,
      valueOhm: 2.6,
      overRange: false,
      verdict: 'fail',
      limitOhm: 2.5,
      source: 'FIE Material Rules, art. m.55.5',
      profileVersion: 1,
    });
    expect(res.body.explanation).toMatch(/over/);
    expect(res.body.takenBy).toBeTruthy();
    expect(res.body.takenAt).toMatch(/^\d{4}-\d\d-\d\dT/);
  });

  test('when a floor cable reads 2.5 Ω, then it is exactly at the limit and passes (near limit)', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const { step } = stepOf(strip, 'Right floor cable', 'continuity', 'A');
    const res = await sam.post('/api/readings').send(newReading(step.id, '2.5'));
    // FIE Material Rules m.55.5: ≤ 2.5 Ω per wire; the 90 % near-limit band is a house rule
    expect(res.body).toMatchObject({ verdict: 'near-limit', limitOhm: 2.5 });
    const ok = await sam.post('/api/readings').send(newReading(stepOf(strip, 'Right floor cable', 'continuity', 'B').step.id, '800m'));
    expect(ok.body).toMatchObject({ verdict: 'pass', valueOhm: 0.8 });
  });

  test('when a reel reads 3.1 Ω, then it fails the 3 Ω reel limit', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const { step } = stepOf(strip, 'Left reel', 'continuity', 'B');
    const res = await sam.post('/api/readings').send(newReading(step.id, '3.1 Ω'));
    // FIE Material Rules m.55.1: ≤ 3 Ω per wire (reel wire, socket to socket)
    expect(res.body).toMatchObject({ verdict: 'fail', limitOhm: 3, source: 'FIE Material Rules, art. m.55.1' });
  });

  test('when a conductive piste reads 5.2 Ω end to end, then it fails the 5 Ω piste limit', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const piste = await stripByLabel(t, hall, 'Strip 7');
    const { step } = stepOf(piste, 'Piste', 'piste-end-to-end', 'piste');
    const res = await sam.post('/api/readings').send(newReading(step.id, '5.2'));
    // FIE Material Rules m.57.1: ≤ 5 Ω (conductive piste, end to end)
    expect(res.body).toMatchObject({ verdict: 'fail', limitOhm: 5, source: 'FIE Material Rules, art. m.57.1' });
  });

  test('when insulation reads OL, then it passes the house-rule minimum; 400 Ω fails and warns the apparatus may register', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const ol = await sam.post('/api/readings').send(newReading(stepOf(strip, 'Right reel', 'insulation', 'A-C').step.id, 'OL'));
    // House rule (no published value; FIE m.29.1a/m.31.1a say "well insulated"): fail below 100 kΩ
    expect(ol.body).toMatchObject({
      verdict: 'pass',
      valueOhm: null,
      overRange: true,
      limitOhm: 100e3,
      limitKind: 'min',
      source: 'House rule (no published value)',
    });
    const low = await sam.post('/api/readings').send(newReading(stepOf(strip, 'Right reel', 'insulation', 'B-C').step.id, '400'));
    expect(low.body.verdict).toBe('fail');
    // FIE Material Rules, Annex B: a valid foil hit always registers below 500 Ω
    expect(low.body.explanation).toMatch(/500 Ω/);
  });

  test('when the reading names the technician’s test-lead null, then its value is subtracted and both are stored', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const lead = await sam.post('/api/lead-nulls').send({ id: randomUUID(), value: '0.3' });
    expect(lead.status).toBe(201);
    const { step } = stepOf(strip, 'Right floor cable', 'continuity', 'C');
    const res = await sam.post('/api/readings').send(newReading(step.id, '0.8', { leadNullId: lead.body.id }));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ valueOhm: 0.5, leadOffsetOhm: 0.3, leadNullId: lead.body.id, valueText: '0.8' });
    const stored = t.db.select().from(readings).where(eq(readings.id, res.body.id)).get()!;
    expect(stored).toMatchObject({ valueOhm: 0.5, leadOffsetOhm: 0.3, leadNullId: lead.body.id });
  });

  test('when the same id and body come again, then it answers 200 with the stored reading and stores one row', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const body = newReading(stepOf(strip, 'Left reel', 'continuity', 'A').step.id, '1.3');
    const first = await sam.post('/api/readings').send(body);
    expect(first.status).toBe(201);
    const again = await sam.post('/api/readings').send(body);
    expect(again.status).toBe(200);
    expect(again.body).toEqual(first.body);
    expect(countReadings(body.id)).toBe(1);
  });

  test('when the same id comes with a different body, then it answers 422 and keeps the first reading', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const body = newReading(stepOf(strip, 'Left reel', 'continuity', 'C').step.id, '1.3');
    expect((await sam.post('/api/readings').send(body)).status).toBe(201);
    const other = await sam.post('/api/readings').send({ ...body, value: '1.4' });
    expect(other.status).toBe(422);
    expect(other.body.code).toBe('idempotency-mismatch');
    expect(other.body.errors[0].path).toBe('id');
    const stored = t.db.select().from(readings).where(eq(readings.id, body.id)).get()!;
    expect(stored.valueText).toBe('1.3');
  });

  test('when the value cannot be read, then it answers 422 with the parser’s message on the value field', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const stepId = stepOf(strip, 'Left reel', 'insulation', 'A-B').step.id;
    for (const value of ['abc', '-1', '5 V']) {
      const res = await sam.post('/api/readings').send(newReading(stepId, value));
      expect(res.status).toBe(422);
      expect(res.body.errors).toEqual([expect.objectContaining({ path: 'value' })]);
    }
    const neg = await sam.post('/api/readings').send(newReading(stepId, '-1'));
    expect(neg.body.detail).toMatch(/cannot be negative/);
  });

  test('when a continuity reading could carry a thousands separator ("2,500"), then it is refused offering both readings, and nothing is stored', async () => {
    // SI Brochure §5.4.4: a comma or a point is a decimal marker, never a thousands separator; "2,500" read as 2.5 Ω would pass
    // near the 2.5 Ω floor-cable limit (FIE Material Rules, art. m.55.5), read as 2500 Ω it fails
    const sam = await t.agentFor(DEMO.technician);
    const stepId = stepOf(strip, 'Left floor cable', 'continuity', 'B').step.id;
    const reading = newReading(stepId, '2,500');
    const res = await sam.post('/api/readings').send(reading);
    expect(res.status).toBe(422);
    expect(res.body.errors).toEqual([
      expect.objectContaining({ path: 'value', message: expect.stringContaining('did you mean 2500 Ω or 2.500 Ω?') }),
    ]);
    expect(countReadings(reading.id)).toBe(0);
    const underflow = await sam.post('/api/readings').send(newReading(stepId, '1e-400'));
    expect(underflow.status).toBe(422);
    expect(underflow.body.detail).toMatch(/underflows/);
    // As the meter shows it on its kΩ range, a point before the prefix is a decimal.
    const kilo = await sam.post('/api/readings').send(newReading(stepId, '2.500k'));
    expect(kilo.body).toMatchObject({ valueOhm: 2500, verdict: 'fail' });
  });

  test('when fields are missing or wrong, then it answers 422 naming them, never 500', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const res = await sam.post('/api/readings').send({ id: 'nope', value: '', extra: 1 });
    expect(res.status).toBe(422);
    const paths = (res.body.errors as { path: string }[]).map((e) => e.path);
    expect(paths).toEqual(expect.arrayContaining(['id', 'stepId', 'value']));
    const unknownStep = await sam.post('/api/readings').send(newReading(randomUUID(), '1'));
    expect(unknownStep.status).toBe(404);
    const stepId = stepOf(strip, 'Left reel', 'insulation', 'A-B').step.id;
    const badLead = await sam.post('/api/readings').send(newReading(stepId, '1', { leadOffsetOhm: 0.2 }));
    expect(badLead.status).toBe(422);
    expect(badLead.body.errors[0].path).toBe('leadOffsetOhm');
    const unknownLead = await sam.post('/api/readings').send(newReading(stepId, '1', { leadNullId: randomUUID() }));
    expect(unknownLead.status).toBe(422);
    expect(unknownLead.body.errors[0].path).toBe('leadNullId');
    const reasonOnly = await sam.post('/api/readings').send(newReading(stepId, '1', { correctionReason: 'Typed the wrong line' }));
    expect(reasonOnly.status).toBe(422);
    expect(reasonOnly.body.errors[0].path).toBe('supersedesId');
  });

  test('who may record: the assigned technician and the director; not Lee (another venue), the organiser or the admin; not anonymous', async () => {
    const stepId = stepOf(strip, 'Right reel', 'continuity', 'A').step.id;
    const marco = await t.agentFor(DEMO.director);
    expect((await marco.post('/api/readings').send(newReading(stepId, '1.1'))).status).toBe(201);
    const lee = await t.agentFor(DEMO.annexTechnician);
    const denied = await lee.post('/api/readings').send(newReading(stepId, '1.1'));
    expect(denied.status).toBe(403);
    expect(denied.body.detail).toMatch(/not assigned/);
    for (const who of [DEMO.organiser, DEMO.admin]) {
      const agent = await t.agentFor(who);
      expect((await agent.post('/api/readings').send(newReading(stepId, '1.1'))).status).toBe(403);
    }
    expect((await t.request.post('/api/readings').set('Origin', 'http://localhost:3999').send(newReading(stepId, '1.1'))).status).toBe(401);
  });

  test('when the step was taken off the checklist, then it answers 409 step-removed and stores nothing', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const stepId = stepOf(strip, 'Right reel', 'loop', 'A-B').step.id;
    t.db.update(steps).set({ removedAt: new Date().toISOString() }).where(eq(steps.id, stepId)).run();
    const body = newReading(stepId, '2');
    const res = await sam.post('/api/readings').send(body);
    expect(res.status).toBe(409);
    expect(res.body.code).toBe('step-removed');
    expect(res.body.detail).toMatch(/taken off the checklist/);
    expect(countReadings(body.id)).toBe(0);
    const again = await stripByLabel(t, hall, 'Strip 20');
    expect(again.positions.flatMap((p) => p.steps).some((s) => s.id === stepId)).toBe(false);
  });
});

describe('POST /api/readings — corrections', () => {
  test('when a reading is corrected with a reason, then a new reading supersedes it and the old one stays', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 21');
    const { step } = stepOf(strip, 'Left floor cable', 'continuity', 'B');
    const first = await sam.post('/api/readings').send(newReading(step.id, '0.6'));
    const fix = await sam
      .post('/api/readings')
      .send(newReading(step.id, '0.65', { supersedesId: first.body.id, correctionReason: 'Misread the display' }));
    expect(fix.status).toBe(201);
    expect(fix.body).toMatchObject({ supersedesId: first.body.id, correctionReason: 'Misread the display', valueOhm: 0.65 });
    expect(countReadings(first.body.id)).toBe(1);
    const after = await stripByLabel(t, hall, 'Strip 21');
    expect(stepOf(after, 'Left floor cable', 'continuity', 'B').step.latest!.id).toBe(fix.body.id);
  });

  test('when the corrected reading belongs to another step, then it answers 422 on supersedesId', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 21');
    const a = stepOf(strip, 'Left floor cable', 'continuity', 'A').step;
    const c = stepOf(strip, 'Left floor cable', 'continuity', 'C').step;
    const first = await sam.post('/api/readings').send(newReading(a.id, '0.6'));
    const res = await sam
      .post('/api/readings')
      .send(newReading(c.id, '0.6', { supersedesId: first.body.id, correctionReason: 'wrong line' }));
    expect(res.status).toBe(422);
    expect(res.body.errors[0].path).toBe('supersedesId');
  });

  test('when a mistyped failure is corrected to a pass, then the fault it opened stays open for the director to dismiss', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 21');
    const { step } = stepOf(strip, 'Right floor cable', 'continuity', 'A');
    const typo = await sam.post('/api/readings').send(newReading(step.id, '55'));
    expect(typo.body.verdict).toBe('fail');
    expect(typo.body.faultId).toBeTruthy();
    await sam
      .post('/api/readings')
      .send(newReading(step.id, '0.55', { supersedesId: typo.body.id, correctionReason: 'Missed the decimal point' }));
    expect(t.db.select().from(faults).where(eq(faults.id, typo.body.faultId)).get()!.status).toBe('open');
  });

  test('when the correction keeps the corrected reading’s lead null, then it is subtracted even for the director', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const marco = await t.agentFor(DEMO.director);
    const strip = await stripByLabel(t, hall, 'Strip 21');
    const { step } = stepOf(strip, 'Right floor cable', 'continuity', 'B');
    const lead = await sam.post('/api/lead-nulls').send({ id: randomUUID(), value: '0.1' });
    const first = await sam.post('/api/readings').send(newReading(step.id, '6.5', { leadNullId: lead.body.id }));
    const fix = await marco
      .post('/api/readings')
      .send(newReading(step.id, '0.65', { leadNullId: lead.body.id, supersedesId: first.body.id, correctionReason: 'Typed 6.5 for 0.65' }));
    expect(fix.status).toBe(201);
    expect(fix.body).toMatchObject({ valueOhm: 0.55, leadOffsetOhm: 0.1, leadNullId: lead.body.id });
    // Not on a new reading of the director's own.
    const own = await marco.post('/api/readings').send(newReading(step.id, '0.65', { leadNullId: lead.body.id }));
    expect(own.status).toBe(422);
  });
});

describe('POST /api/readings — faults opened automatically', () => {
  test('continuity over the limit opens a high-resistance fault; over range opens an open fault; insulation failure a short between the pair', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 22');
    const high = await sam.post('/api/readings').send(newReading(stepOf(strip, 'Left floor cable', 'continuity', 'A').step.id, '2.6'));
    const open = await sam.post('/api/readings').send(newReading(stepOf(strip, 'Left reel', 'continuity', 'C').step.id, 'OL'));
    const short = await sam.post('/api/readings').send(newReading(stepOf(strip, 'Right floor cable', 'insulation', 'A-B').step.id, '2k'));
    const kinds = [high, open, short].map((r) => {
      expect(r.body.verdict).toBe('fail');
      const f = t.db.select().from(faults).where(eq(faults.id, r.body.faultId)).get()!;
      return [f.kind, f.conductors, f.status];
    });
    expect(kinds).toEqual([
      ['high-resistance', 'A', 'open'],
      ['open', 'C', 'open'],
      ['short', 'A-B', 'open'],
    ]);
    const after = await stripByLabel(t, hall, 'Strip 22');
    expect(after.status).toBe('fault-open');
    expect(after.openFaults).toHaveLength(3);
  });

  test('a second failure on the same step answers the same fault and opens no other', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 22');
    const { step } = stepOf(strip, 'Right reel', 'continuity', 'B');
    const one = await sam.post('/api/readings').send(newReading(step.id, '4'));
    const two = await sam.post('/api/readings').send(newReading(step.id, '4.2'));
    expect(two.body.faultId).toBe(one.body.faultId);
    expect(t.db.select().from(faults).where(eq(faults.stepId, step.id)).all()).toHaveLength(1);
  });

  test('a passing reading carries no fault', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 22');
    const res = await sam.post('/api/readings').send(newReading(stepOf(strip, 'Right reel', 'continuity', 'A').step.id, '1.2'));
    expect(res.body).toMatchObject({ verdict: 'pass', faultId: null });
  });
});

describe('POST /api/readings — on a signed-off venue', () => {
  test('a new reading puts its strip out of service only: the venue stays signed off, the strip certificate is superseded-pending', async () => {
    const director = t.db.select().from(users).where(eq(users.email, DEMO.director)).get()!;
    t.db.update(venues).set({ status: 'signed-off' }).where(eq(venues.id, annex)).run();
    const signOffId = randomUUID();
    const strip = await stripByLabel(t, annex, 'Annex 2');
    const other = await stripByLabel(t, annex, 'Annex 3');
    t.db.insert(signingKeys).values({ kid: 'test-key', publicJwkJson: '{}' }).run();
    t.db
      .insert(signOffs)
      .values({ id: signOffId, venueId: annex, signedBy: director.id, statement: 'All clear', readingsDigest: 'x' })
      .run();
    const cert = (number: string, kind: 'venue' | 'strip', stripId: string | null) =>
      t.db
        .insert(certificates)
        .values({ id: randomUUID(), number, signOffId, venueId: annex, kind, stripId, payloadJson: '{}', jws: 'x', keyId: 'test-key' })
        .run();
    cert('SW-TEST-1', 'venue', null);
    cert('SW-TEST-2', 'strip', strip.id);
    cert('SW-TEST-3', 'strip', other.id);

    const lee = await t.agentFor(DEMO.annexTechnician);
    const res = await lee.post('/api/readings').send(newReading(stepOf(strip, 'Left reel', 'continuity', 'A').step.id, '1.3'));
    expect(res.status).toBe(201);
    expect(res.body.stripSuspended).toBe(true);
    expect(res.body).not.toHaveProperty('venueReopened');
    const next = await lee.post('/api/readings').send(newReading(stepOf(strip, 'Left reel', 'continuity', 'B').step.id, '1.3'));
    expect(next.status).toBe(201);
    // The strip was already out: nothing new to tell the tablet (no notice for every retest reading).
    expect(next.body).not.toHaveProperty('stripSuspended');
    expect(t.db.select().from(venues).where(eq(venues.id, annex)).get()!.status).toBe('signed-off');
    expect(t.db.select().from(signOffs).where(eq(signOffs.id, signOffId)).get()!.status).toBe('active');
    const byNumber = new Map(
      t.db
        .select()
        .from(certificates)
        .where(eq(certificates.venueId, annex))
        .all()
        .map((c) => [c.number, c]),
    );
    expect([...byNumber.values()].map((c) => c.status)).toEqual(['valid', 'valid', 'valid']);
    expect(byNumber.get('SW-TEST-2')!.supersededPendingSince).not.toBeNull();
    expect(byNumber.get('SW-TEST-1')!.supersededPendingSince).toBeNull();
    expect(byNumber.get('SW-TEST-3')!.supersededPendingSince).toBeNull();
    const marco = await t.agentFor(DEMO.director);
    const board = await marco.get(`/api/venues/${annex}/board`).expect(200);
    expect(board.body.strips[0]).toMatchObject({ id: strip.id, status: 'out-of-service' });
    expect(board.body.strips.find((s: { id: string }) => s.id === other.id).status).not.toBe('out-of-service');
  });
});

describe('GET /api/readings/:id', () => {
  test('answers the stored reading to those who may read the venue; 403 to Lee, 404 for an unknown id, 422 for a bad id', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 23');
    const made = await sam.post('/api/readings').send(newReading(stepOf(strip, 'Left reel', 'continuity', 'A').step.id, '1.25'));
    for (const who of [DEMO.director, DEMO.organiser, DEMO.technician]) {
      const agent = await t.agentFor(who);
      const res = await agent.get(`/api/readings/${made.body.id}`);
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ id: made.body.id, valueOhm: 1.25, verdict: 'pass', profileVersion: 1 });
    }
    const lee = await t.agentFor(DEMO.annexTechnician);
    expect((await lee.get(`/api/readings/${made.body.id}`)).status).toBe(403);
    expect((await sam.get(`/api/readings/${randomUUID()}`)).status).toBe(404);
    expect((await sam.get('/api/readings/12')).status).toBe(422);
    expect((await t.request.get(`/api/readings/${made.body.id}`)).status).toBe(401);
  });

  test('every reading written is in the audit trail', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 23');
    const made = await sam.post('/api/readings').send(newReading(stepOf(strip, 'Left reel', 'continuity', 'B').step.id, '1.25'));
    const rows = t.sqlite.prepare("select action from audit_log where entity_type = 'reading' and entity_id = ?").all(made.body.id);
    expect(rows).toEqual([{ action: 'reading.recorded' }]);
  });
});

describe('POST /api/readings: the time a reading counts at', () => {
  const minutesAgo = (n: number) => new Date(Date.now() - n * 60_000).toISOString();

  test('when a reading typed offline arrives 30 minutes late, then it counts at the time it was typed and a reading taken after it stays the latest', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 24');
    const { step } = stepOf(strip, 'Right reel', 'continuity', 'A');
    const online = await sam.post('/api/readings').send(newReading(step.id, '0.7'));
    expect(online.status).toBe(201);
    const typedAt = minutesAgo(30);
    const late = await sam.post('/api/readings').send(newReading(step.id, '0.9', { takenAt: typedAt }));
    expect(late.status).toBe(201);
    expect(late.body.takenAt).toBe(typedAt);
    expect(Date.parse(late.body.receivedAt) - Date.parse(typedAt)).toBeGreaterThanOrEqual(30 * 60_000 - 1000);
    const after = await stripByLabel(t, hall, 'Strip 24');
    expect(stepOf(after, 'Right reel', 'continuity', 'A').step.latest!.id).toBe(online.body.id);
    // The same reading sent again (the queue retrying) is a replay, stamp and all.
    const again = await sam.post('/api/readings').send({ id: late.body.id, stepId: step.id, value: '0.9', takenAt: typedAt });
    expect(again.status).toBe(200);
    expect(again.body.takenAt).toBe(typedAt);
  });

  test('when the tablet sends a time with an offset, then it is stored in UTC like the server’s own times', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 24');
    const { step } = stepOf(strip, 'Right reel', 'continuity', 'B');
    const utc = new Date(Date.now() - 10 * 60_000);
    utc.setUTCMilliseconds(0);
    // The same instant written as local time two hours east of UTC (ISO 8601 offset form).
    const east = new Date(utc.getTime() + 2 * 3_600_000).toISOString().replace('.000Z', '+02:00');
    const res = await sam.post('/api/readings').send(newReading(step.id, '0.8', { takenAt: east }));
    expect(res.status).toBe(201);
    expect(res.body.takenAt).toBe(utc.toISOString());
  });

  test('when the tablet’s clock is an hour ahead or a month behind, then the arrival time is used and the tablet’s time is kept in the audit trail', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 24');
    const { step } = stepOf(strip, 'Right reel', 'continuity', 'C');
    for (const [claimed, why] of [
      [new Date(Date.now() + 3_600_000).toISOString(), 'ahead'],
      [minutesAgo(30 * 24 * 60), 'too-old'],
    ] as const) {
      const before = Date.now();
      const res = await sam.post('/api/readings').send(newReading(step.id, '0.8', { takenAt: claimed }));
      expect(res.status).toBe(201);
      expect(res.body.takenAt).toBe(res.body.receivedAt);
      expect(Date.parse(res.body.takenAt)).toBeGreaterThanOrEqual(before - 1000);
      const audit = t.sqlite
        .prepare("select detail_json from audit_log where entity_type = 'reading' and entity_id = ?")
        .pluck()
        .get(res.body.id) as string;
      expect(JSON.parse(audit)).toMatchObject({ tabletTakenAt: claimed, tabletClock: why });
    }
  });

  test('when takenAt is not a date and time, then it answers 422 on takenAt and stores nothing', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 24');
    const { step } = stepOf(strip, 'Right reel', 'continuity', 'A');
    const body = newReading(step.id, '0.8', { takenAt: 'this morning' });
    const res = await sam.post('/api/readings').send(body);
    expect(res.status).toBe(422);
    expect(res.body.errors.map((e: { path: string }) => e.path)).toEqual(['takenAt']);
    expect(countReadings(body.id)).toBe(0);
  });

  test('when a passing reading typed before a repair is sent after it, then it is not the retest: the fault closes only on readings taken after the repair', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 24');
    const position = strip.positions.find((p) => p.name === 'Left floor cable')!;
    const first = position.steps.find((s) => s.testKind === 'continuity')!;
    const failed = await sam.post('/api/readings').send(newReading(first.id, '4.0', { takenAt: minutesAgo(20) }));
    expect(failed.body.verdict).toBe('fail');
    const faultId = failed.body.faultId as string;
    expect((await sam.post(`/api/faults/${faultId}/repairs`).send({ action: 'connector-remade' })).status).toBe(201);
    const statusOf = () => t.db.select().from(faults).where(eq(faults.id, faultId)).get()!.status;

    // Every step passes, but one of the passes was typed (offline) before the repair.
    for (const s of position.steps) {
      const extra = s.id === first.id ? { takenAt: minutesAgo(10) } : {};
      const r = await sam.post('/api/readings').send(newReading(s.id, GOOD_VALUE[s.testKind]!, extra));
      expect(r.body.verdict).not.toBe('fail');
    }
    expect(statusOf()).toBe('repaired');
    // Measured again after the repair: now the retest is complete.
    await sam.post('/api/readings').send(newReading(first.id, GOOD_VALUE[first.testKind]!));
    expect(statusOf()).toBe('closed');
  });
});
