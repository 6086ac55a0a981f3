// The record behind a certificate cannot be bent around sign-off: a correction does not erase a
// fault, a test-lead null is a record of its own within common-practice limits, revoking a venue
// certificate takes its strips with it, and the equipment register does not show a technician
// the history of venues they are not assigned to. Each test is an attack that worked before.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, DEMO_PASSWORD, type TestApp } from '../setup/test-app';
import { GOOD_VALUE, newReading, stepOf, stripByLabel, venueIds } from '../api/testing-helpers';
import { auditLog, certificates, events, faults, leadNulls, readings, strips, venues } from '../../server/db/schema';
import { reopenIfSignedOff } from '../../server/services/venue-lifecycle';
import { signOffRepository } from '../../server/db/sign-off.repository';
import { snapshot, snapshotInTurns } from '../../server/services/sign-off-readiness';
import type { CertificatePayload } from '../../server/signing/certificate-record';
import { pdfText } from '../setup/pdf-read';

let t: TestApp;
let hall: string;
let annex: string;
beforeAll(async () => {
  t = await createTestApp();
  ({ hall, annex } = await venueIds(t));
});
afterAll(() => t.close());

const faultRow = (id: string) => t.db.select().from(faults).where(eq(faults.id, id)).get()!;
const etagOf = async (agent: Awaited<ReturnType<TestApp['agentFor']>>, faultId: string) =>
  (await agent.get(`/api/faults/${faultId}`)).headers.etag as string;

describe('a correction never closes a fault', () => {
  test('a failing reading corrected to a pass with a short reason: refused; with a real reason: recorded, and the fault stays open', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 15');
    const { step } = stepOf(strip, 'Left floor cable', 'continuity', 'A');
    const fail = await sam.post('/api/readings').send(newReading(step.id, '55'));
    expect(fail.body.verdict).toBe('fail');
    const faultId = fail.body.faultId as string;

    const short = await sam
      .post('/api/readings')
      .send(newReading(step.id, '0.55', { supersedesId: fail.body.id, correctionReason: 'oops' }));
    expect(short.status).toBe(422);
    expect(short.body.errors[0]).toMatchObject({ path: 'correctionReason' });
    expect(short.body.errors[0].message).toMatch(/at least 10 characters/);

    const fix = await sam
      .post('/api/readings')
      .send(newReading(step.id, '0.55', { supersedesId: fail.body.id, correctionReason: 'Missed the decimal point' }));
    expect(fix.status).toBe(201);
    expect(fix.body.verdict).toBe('pass');
    expect(faultRow(faultId).status).toBe('open');
    const after = await stripByLabel(t, hall, 'Strip 15');
    expect(after.status).toBe('fault-open');
  });

  test('a technician cannot close a fault (or mark it repaired) by editing its status', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 15');
    const { step } = stepOf(strip, 'Right floor cable', 'continuity', 'B');
    const fail = await sam.post('/api/readings').send(newReading(step.id, 'OL'));
    const faultId = fail.body.faultId as string;
    for (const status of ['closed', 'repaired']) {
      const res = await sam
        .patch(`/api/faults/${faultId}`)
        .set('If-Match', await etagOf(sam, faultId))
        .send({ status });
      expect(res.status, status).toBe(422);
      expect(res.body.errors[0].path).toBe('status');
    }
    expect(faultRow(faultId).status).toBe('open');
  });

  test('a correction made after a repair is no retest: the repaired fault waits for a new measurement', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 16');
    const position = strip.positions.find((p) => p.name === 'Left reel')!;
    // Every step of the reel measured and passing, then one fails and opens a fault.
    const first = new Map<string, string>();
    for (const s of position.steps) {
      const r = await sam.post('/api/readings').send(newReading(s.id, GOOD_VALUE[s.testKind]));
      first.set(s.id, r.body.id);
    }
    const failing = position.steps[0];
    const fail = await sam.post('/api/readings').send(newReading(failing.id, '9'));
    const faultId = fail.body.faultId as string;
    await sam.post(`/api/faults/${faultId}/repairs`).send({ action: 'connector-remade' }).expect(201);
    // Re-measured: the failing step. The others are only "corrected", with values typed now.
    await sam.post('/api/readings').send(newReading(failing.id, GOOD_VALUE[failing.testKind])).expect(201);
    for (const s of position.steps.slice(1)) {
      await sam
        .post('/api/readings')
        .send(newReading(s.id, GOOD_VALUE[s.testKind], { supersedesId: first.get(s.id), correctionReason: 'Same value, typed again' }))
        .expect(201);
    }
    expect(faultRow(faultId).status).toBe('repaired');
    // Measuring them again is the retest.
    for (const s of position.steps.slice(1)) await sam.post('/api/readings').send(newReading(s.id, GOOD_VALUE[s.testKind])).expect(201);
    expect(faultRow(faultId).status).toBe('closed');
  });

  test('only the event’s director dismisses a typing mistake, with a sentence that lands in the audit trail', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const marco = await t.agentFor(DEMO.director);
    const strip = await stripByLabel(t, hall, 'Strip 17');
    const { step } = stepOf(strip, 'Left floor cable', 'continuity', 'C');
    const fail = await sam.post('/api/readings').send(newReading(step.id, '45'));
    const faultId = fail.body.faultId as string;
    await sam
      .post('/api/readings')
      .send(newReading(step.id, '0.45', { supersedesId: fail.body.id, correctionReason: 'Missed the decimal point' }))
      .expect(201);

    const reason = 'Typed 45 for 0.45; the meter showed 0.45 Ω, checked again with Sam.';
    const bySam = await sam
      .post(`/api/faults/${faultId}/dismiss`)
      .set('If-Match', await etagOf(sam, faultId))
      .send({ reason });
    expect(bySam.status).toBe(403);
    const terse = await marco
      .post(`/api/faults/${faultId}/dismiss`)
      .set('If-Match', await etagOf(marco, faultId))
      .send({ reason: 'typo' });
    expect(terse.status).toBe(422);
    expect(terse.body.errors[0].message).toMatch(/at least 20 characters/);
    expect((await marco.post(`/api/faults/${faultId}/dismiss`).send({ reason })).status).toBe(428);

    const ok = await marco
      .post(`/api/faults/${faultId}/dismiss`)
      .set('If-Match', await etagOf(marco, faultId))
      .send({ reason });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ status: 'closed', dismissal: { reason, byName: 'Marco Dal Bello' } });
    const audit = t.db
      .select()
      .from(auditLog)
      .where(eq(auditLog.entityId, faultId))
      .all()
      .find((a) => a.action === 'fault.dismissed')!;
    expect(JSON.parse(audit.detailJson)).toMatchObject({ reason, previousStatus: 'open' });
    expect((await stripByLabel(t, hall, 'Strip 17')).openFaults.some((f) => f.id === faultId)).toBe(false);
    const again = await marco
      .post(`/api/faults/${faultId}/dismiss`)
      .set('If-Match', await etagOf(marco, faultId))
      .send({ reason });
    expect(again.status).toBe(409);
  });
});

describe('the test-lead null is a record of its own', () => {
  test('an offset sent with the reading itself is refused: 12.9 Ω on a 3 Ω reel is not a pass', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 18');
    const { step } = stepOf(strip, 'Left reel', 'continuity', 'A');
    const body = newReading(step.id, '12.9', { leadOffsetOhm: 9.9 });
    const res = await sam.post('/api/readings').send(body);
    expect(res.status).toBe(422);
    expect(res.body.errors[0].path).toBe('leadOffsetOhm');
    expect(t.db.select().from(readings).where(eq(readings.id, body.id)).all()).toHaveLength(0);
  });

  test('a null above 1 Ω is refused (worn leads are replaced: common practice), and so is one above the reading', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const worn = await sam.post('/api/lead-nulls').send({ id: randomUUID(), value: '1.2' });
    expect(worn.status).toBe(422);
    expect(worn.body.detail).toMatch(/Replace them/);
    const ok = await sam.post('/api/lead-nulls').send({ id: randomUUID(), value: '0.4', meter: 'Meter 1' });
    expect(ok.status).toBe(201);
    const strip = await stripByLabel(t, hall, 'Strip 18');
    const below = await sam
      .post('/api/readings')
      .send(newReading(stepOf(strip, 'Left reel', 'continuity', 'B').step.id, '0.3', { leadNullId: ok.body.id }));
    expect(below.status).toBe(422);
    expect(below.body.detail).toMatch(/below the nulled test-lead resistance/);
  });

  test('a reading names the null it used; someone else’s null is refused', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const marco = await t.agentFor(DEMO.director);
    const mine = await sam.post('/api/lead-nulls').send({ id: randomUUID(), value: '0.1', meter: 'Meter 1' });
    const theirs = await marco.post('/api/lead-nulls').send({ id: randomUUID(), value: '0.2' });
    const strip = await stripByLabel(t, hall, 'Strip 18');
    const stepId = stepOf(strip, 'Right reel', 'continuity', 'A').step.id;
    const refused = await sam.post('/api/readings').send(newReading(stepId, '1.3', { leadNullId: theirs.body.id }));
    expect(refused.status).toBe(422);
    expect(refused.body.errors[0].path).toBe('leadNullId');
    const used = await sam.post('/api/readings').send(newReading(stepId, '1.3', { leadNullId: mine.body.id }));
    expect(used.status).toBe(201);
    expect(used.body).toMatchObject({ valueText: '1.3', valueOhm: 1.2, leadOffsetOhm: 0.1, leadNullId: mine.body.id });
    const stored = t.db.select().from(leadNulls).where(eq(leadNulls.id, mine.body.id)).get()!;
    expect(stored).toMatchObject({ valueOhm: 0.1, meter: 'Meter 1' });
  });
});

describe('revoking certificates', () => {
  test('revoking the venue certificate revokes its strip certificates and re-opens the venue', async () => {
    const marco = await t.agentFor(DEMO.director);
    const signed = await marco.post(`/api/venues/${annex}/sign-off`).send({ password: DEMO_PASSWORD });
    expect(signed.status).toBe(201);
    const certs = signed.body.certificates as { number: string; kind: string }[];
    const venueCert = certs.find((c) => c.kind === 'venue')!.number;
    const res = await marco.post(`/api/certificates/${venueCert}/revoke`).send({ reason: 'Signed against the wrong limit profile.' });
    expect(res.status).toBe(200);
    for (const c of certs.filter((x) => x.kind === 'strip')) {
      const v = await t.request.get(`/api/verify/${c.number}`);
      expect(v.body.status).toBe('revoked');
      expect(v.body.revokedReason).toContain(venueCert);
    }
    expect(t.db.select().from(venues).where(eq(venues.id, annex)).get()!.status).toBe('testing');
  });

  test('revoking one strip certificate: the venue certificate says it no longer covers that strip', async () => {
    const marco = await t.agentFor(DEMO.director);
    const signed = await marco.post(`/api/venues/${annex}/sign-off`).send({ password: DEMO_PASSWORD });
    expect(signed.status).toBe(201);
    const certs = signed.body.certificates as { number: string; kind: string; stripId?: string }[];
    const venueCert = certs.find((c) => c.kind === 'venue')!.number;
    const strip = certs.find((c) => c.kind === 'strip')!;
    await marco
      .post(`/api/certificates/${strip.number}/revoke`)
      .send({ reason: 'The reel was swapped before the first bout.' })
      .expect(200);
    const v = await t.request.get(`/api/verify/${venueCert}`);
    expect(v.body.status).toBe('valid');
    expect(v.body.notCovering).toEqual([
      expect.objectContaining({ strip: 'Annex 1', number: strip.number, revokedReason: 'The reel was swapped before the first bout.' }),
    ]);
    const others = certs.filter((c) => c.kind === 'strip' && c.number !== strip.number);
    for (const c of others) expect((await t.request.get(`/api/verify/${c.number}`)).body.status).toBe('valid');
  });
});

describe('the certificate carries the record', () => {
  test('dismissed faults and the test-lead nulls are signed and printed on the annex; a dismissal or a new fault after sign-off suspends its strip only', async () => {
    const marco = await t.agentFor(DEMO.director);
    const lee = await t.agentFor(DEMO.annexTechnician);
    const [annex3, annex4] = [await stripByLabel(t, annex, 'Annex 3'), await stripByLabel(t, annex, 'Annex 4')];
    const statusOf = () => t.db.select().from(venues).where(eq(venues.id, annex)).get()!.status;
    if (statusOf() !== 'signed-off') await marco.post(`/api/venues/${annex}/sign-off`).send({ password: DEMO_PASSWORD }).expect(201);

    const f1 = await lee.post('/api/faults').send({ positionId: annex3.positions[1].id, kind: 'intermittent', conductors: 'A' });
    expect(f1.status).toBe(201);
    // A change on one strip: Annex 3 is out of service, the venue stays signed off.
    expect(statusOf()).toBe('signed-off');
    expect(t.db.select().from(strips).where(eq(strips.id, annex3.id)).get()!.outOfServiceSince).not.toBeNull();
    const reason = 'Opened on the wrong strip: Lee meant Annex 2, whose fault was already dismissed.';
    await marco
      .post(`/api/faults/${f1.body.id}/dismiss`)
      .set('If-Match', await etagOf(marco, f1.body.id))
      .send({ reason })
      .expect(200);
    // A plan change re-opens the venue (as a director's edit would), so it is signed off again whole.
    const ev = t.db
      .select()
      .from(events)
      .where(eq(events.id, t.db.select().from(venues).where(eq(venues.id, annex)).get()!.eventId))
      .get()!;
    t.db.transaction((tx) =>
      reopenIfSignedOff(tx, { venueId: annex, orgId: ev.orgId, actorId: ev.directorId!, reason: 'Plan changed: rotation check.' }),
    );
    expect(statusOf()).toBe('testing');
    const f2 = await lee.post('/api/faults').send({ positionId: annex4.positions[1].id, kind: 'open', conductors: 'B' }).expect(201);
    const signed = await marco
      .post(`/api/venues/${annex}/sign-off`)
      .send({ password: DEMO_PASSWORD, exceptions: [{ stripId: annex4.id, reason: 'Left floor cable waits for a repair.' }] });
    expect(signed.status, JSON.stringify(signed.body)).toBe(201);
    const venueNumber = (signed.body.certificates as { number: string; kind: string }[]).find((c) => c.kind === 'venue')!.number;
    const row = t.db.select().from(certificates).where(eq(certificates.number, venueNumber)).get()!;
    const payload = JSON.parse(row.payloadJson) as CertificatePayload;
    expect(payload.format).toBe('stripwarden-certificate/3');
    expect(payload.dismissedFaults.map((f) => [f.stripLabel, f.reason, f.dismissedBy])).toContainEqual([
      'Annex 3',
      reason,
      'Marco Dal Bello',
    ]);
    expect(payload.dismissedFaults.some((f) => f.faultId === f2.body.id)).toBe(false);
    // Lee's demo readings were all typed with one 0.05 Ω null (Meter 2).
    expect(payload.leadNulls).toContainEqual(expect.objectContaining({ valueOhm: 0.05, takenBy: 'Lee Varga', meter: 'Meter 2' }));
    const pdf = (
      await marco
        .get(`/api/certificates/${venueNumber}/pdf`)
        .buffer(true)
        .parse((res, cb) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => cb(null, Buffer.concat(chunks)));
        })
    ).body as Buffer;
    // PDF.js reads the certificate back as a viewer would.
    const text = (await pdfText(pdf)).replace(/\s+/g, ' ');
    expect(text).toContain('Annex C');
    expect(text).toContain('Test-lead nulls used');
    expect(text).toContain('Opened on the wrong strip');
    expect(text).toMatch(/LEAD NULL/);

    await marco
      .post(`/api/faults/${f2.body.id}/dismiss`)
      .set('If-Match', await etagOf(marco, f2.body.id))
      .send({ reason: 'Opened by mistake: the cable was never tested here.' })
      .expect(200);
    expect(statusOf()).toBe('signed-off');
    expect(t.db.select().from(certificates).where(eq(certificates.number, venueNumber)).get()!.status).toBe('valid');
    expect(t.db.select().from(strips).where(eq(strips.id, annex4.id)).get()!.outOfServiceSince).not.toBeNull();
  });
});

describe('the equipment register', () => {
  test('a technician sees an item’s history only on the venues they are assigned to', async () => {
    const marco = await t.agentFor(DEMO.director);
    const strip6 = await stripByLabel(t, hall, 'Strip 6');
    const itemId = strip6.positions.find((p) => p.name === 'Left floor cable')!.equipment!.id;
    const full = (await marco.get(`/api/equipment/${itemId}`)).body;
    expect(full.readings.length).toBeGreaterThan(0);
    expect(full.faults.length).toBeGreaterThan(0);

    const lee = await t.agentFor(DEMO.annexTechnician);
    const seen = await lee.get(`/api/equipment/${itemId}`);
    expect(seen.status).toBe(200);
    expect(seen.body.item.id).toBe(itemId);
    expect(seen.body.readings).toEqual([]);
    expect(seen.body.faults).toEqual([]);
    expect(seen.body.placements).toEqual([]);
    expect(JSON.stringify(seen.body)).not.toContain('Riverside Sports Hall');

    const sam = await t.agentFor(DEMO.technician);
    expect((await sam.get(`/api/equipment/${itemId}`)).body.readings.length).toBe(full.readings.length);
  });
});

describe("the sign-off's last check reads the record's fingerprint", () => {
  // Sign-off compares it inside its transaction: equal means nothing it read has changed.
  const fingerprint = (venueId: string) => signOffRepository(t.db).recordFingerprint(venueId);
  const continuityOf = async (venueId: string, label: string) =>
    (await stripByLabel(t, venueId, label)).positions.flatMap((p) => p.steps).find((st) => st.testKind === 'continuity')!;

  test('the snapshot read a few strips at a time is the snapshot read at once, strip by strip and in order', async () => {
    for (const venueId of [hall, annex]) expect(await snapshotInTurns(t.db, venueId)).toEqual(snapshot(t.db, venueId));
    // More strips than one turn reads (20): the hall's are read in two turns or more.
    expect(signOffRepository(t.db).stripIdsOf(hall).length).toBeGreaterThan(20);
  });

  test('a reading, a correction, a withdrawn strip and a fault moving on each change it; the same record, or another venue, does not', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const marco = await t.agentFor(DEMO.director);
    const before = fingerprint(hall);
    expect(fingerprint(hall)).toBe(before);

    // Another venue's reading leaves this one's alone.
    const annexStrip = t.db.select().from(strips).where(eq(strips.venueId, annex)).all()[0]!;
    const annexStep = await continuityOf(annex, annexStrip.label);
    expect((await marco.post('/api/readings').send(newReading(annexStep.id, '0.5'))).status).toBe(201);
    expect(fingerprint(hall)).toBe(before);

    const hallStrip = await stripByLabel(t, hall, 'Strip 14');
    const hallStep = await continuityOf(hall, 'Strip 14');
    const first = await sam.post('/api/readings').send(newReading(hallStep.id, '0.5'));
    expect(first.status).toBe(201);
    const afterReading = fingerprint(hall);
    expect(afterReading).not.toBe(before);

    const fixed = await sam
      .post('/api/readings')
      .send(newReading(hallStep.id, '0.45', { supersedesId: first.body.id, correctionReason: 'Typed the wrong digit on the keypad' }));
    expect(fixed.status).toBe(201);
    const afterCorrection = fingerprint(hall);
    expect(afterCorrection).not.toBe(afterReading);

    t.db.update(strips).set({ withdrawnAt: new Date().toISOString(), withdrawnReason: 'Probe' }).where(eq(strips.id, hallStrip.id)).run();
    expect(fingerprint(hall)).not.toBe(afterCorrection);
    t.db.update(strips).set({ withdrawnAt: null, withdrawnReason: null }).where(eq(strips.id, hallStrip.id)).run();
    expect(fingerprint(hall)).toBe(afterCorrection);

    const failing = await sam.post('/api/readings').send(newReading(hallStep.id, '55'));
    expect(failing.status).toBe(201);
    const faultId = failing.body.faultId as string;
    const withFault = fingerprint(hall);
    expect(withFault).not.toBe(afterCorrection);
    t.db
      .update(faults)
      .set({ status: 'located', version: faultRow(faultId).version + 1 })
      .where(eq(faults.id, faultId))
      .run();
    expect(fingerprint(hall)).not.toBe(withFault);
  });
});
