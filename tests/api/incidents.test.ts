// Competition days: an incident on a signed-off venue suspends its strip only; a tested spare is
// swapped in, the connection retested, the incident resolved and the venue amended with a new strip
// certificate while the venue certificate stays valid. Values judged against the demo profile's
// limits (FIE Material Rules as kept in the profile; insulation "OL" is open, a pass).
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, DEMO_PASSWORD, type TestApp } from '../setup/test-app';
import { addOtherOrg, OTHER_ADMIN, OTHER_DIRECTOR, OTHER_PASSWORD } from '../setup/other-org';
import { pdfText } from '../setup/pdf-read';
import { GOOD_VALUE, newReading, stepOf, stripByLabel, venueIds } from './testing-helpers';
import { auditLog, certificates, incidents, strips, venues } from '../../server/db/schema';

let t: TestApp;
let annex: string;
beforeAll(async () => {
  t = await createTestApp();
  ({ annex } = await venueIds(t));
  await addOtherOrg(t);
});
afterAll(() => t.close());

interface RetestStep {
  stepId: string;
  positionName: string;
  testKind: string;
  conductors: string;
  why: string;
  done: boolean;
}

const binary = (res: NodeJS.ReadableStream, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

describe('an incident from opening to the amended certificate', () => {
  const state: { incidentId?: string; stripId?: string; oldStrip?: string; venueNumber?: string; newStrip?: string; removedId?: string } =
    {};

  test('a spare reel is put in the pool and tested with its kind’s checklist, like any position', async () => {
    const ada = await t.agentFor(DEMO.admin);
    await ada.post('/api/equipment').send({ assetTag: 'SPR-901', kind: 'reel', lengthM: 20, description: 'Spare reel' }).expect(201);
    const marco = await t.agentFor(DEMO.director);
    const pool = await marco.put(`/api/venues/${annex}/spares`).send({ assetTags: ['spr-901'] });
    expect(pool.status, JSON.stringify(pool.body)).toBe(200);
    expect(pool.body.spares).toHaveLength(1);
    expect(pool.body.spares[0]).toMatchObject({ tested: false, stepsPassed: 0, usedIn: null });
    // A reel's checklist: continuity A, B, C, insulation A-B, A-C, B-C, and the loop A+B the demo
    // profile asks of reels (common practice).
    expect(pool.body.spares[0].stepsTotal).toBe(7);
    const lee = await t.agentFor(DEMO.annexTechnician);
    const strip = (await lee.get(`/api/strips/${pool.body.stripId}`).expect(200)).body as {
      sparePool: boolean;
      positions: { steps: { id: string; testKind: string }[] }[];
    };
    // The strip answer says it is the pool (the testing screen offers no incident on it).
    expect(strip.sparePool).toBe(true);
    expect((await lee.get(`/api/strips/${(await stripByLabel(t, annex, 'Annex 1')).id}`).expect(200)).body.sparePool).toBe(false);
    for (const step of strip.positions[0].steps) {
      await lee.post('/api/readings').send(newReading(step.id, GOOD_VALUE[step.testKind])).expect(201);
    }
    const after = await marco.get(`/api/venues/${annex}/spares`).expect(200);
    expect(after.body.spares[0]).toMatchObject({ tested: true, stepsPassed: 7 });
    // The pool is no strip of the venue: the board does not list it.
    const board = await marco.get(`/api/venues/${annex}/board`).expect(200);
    expect(board.body.strips.map((s: { id: string }) => s.id)).not.toContain(pool.body.stripId);
  });

  test('the director cannot edit the pool through the plan routes: 409 problem+json, the pool unchanged', async () => {
    const marco = await t.agentFor(DEMO.director);
    const poolId = (await marco.get(`/api/venues/${annex}/spares`).expect(200)).body.stripId as string;
    const before = (await marco.get(`/api/strips/${poolId}`).expect(200)).body as { label: string; positions: { id: string }[] };
    const tag = (await marco.get(`/api/venues/${annex}`)).headers.etag as string;
    const attempts = [
      marco.patch(`/api/strips/${poolId}`).set('If-Match', tag).send({ label: 'Pool renamed' }),
      marco.post(`/api/strips/${poolId}/withdraw`).set('If-Match', tag).send({ reason: 'Not needed today' }),
      marco.post(`/api/strips/${poolId}/positions`).set('If-Match', tag).send({ name: 'Extra reel', equipmentKind: 'reel' }),
      marco.delete(`/api/positions/${before.positions[0].id}`).set('If-Match', tag),
    ];
    for (const res of await Promise.all(attempts)) {
      expect(res.status, JSON.stringify(res.body)).toBe(409);
      expect(res.headers['content-type']).toContain('application/problem+json');
      expect(res.body.code).toBe('spare-pool');
    }
    const after = (await marco.get(`/api/strips/${poolId}`).expect(200)).body as typeof before;
    expect(after.label).toBe(before.label);
    expect(after.positions.map((p) => p.id)).toEqual(before.positions.map((p) => p.id));
    expect((await marco.get(`/api/venues/${annex}/spares`).expect(200)).body.spares).toHaveLength(1);
    // Another organisation learns nothing of the strip, not even that it is a pool (ASVS 8.2.2).
    const other = await t.agentFor(OTHER_DIRECTOR, OTHER_PASSWORD);
    const foreign = await other.patch(`/api/strips/${poolId}`).set('If-Match', tag).send({ label: 'Pool renamed' });
    expect(foreign.status, JSON.stringify(foreign.body)).toBe(404);
    expect(foreign.headers['content-type']).toContain('application/problem+json');
  });

  test('the venue is signed off; an incident on Annex 2 suspends that strip only (the same clientId twice is one incident)', async () => {
    const marco = await t.agentFor(DEMO.director);
    const signed = await marco.post(`/api/venues/${annex}/sign-off`).send({ password: DEMO_PASSWORD });
    expect(signed.status, JSON.stringify(signed.body)).toBe(201);
    const strip = await stripByLabel(t, annex, 'Annex 2');
    state.stripId = strip.id;
    const certs = signed.body.certificates as { number: string; kind: string; stripId?: string }[];
    state.oldStrip = certs.find((c) => c.stripId === strip.id)!.number;
    state.venueNumber = certs.find((c) => c.kind === 'venue')!.number;
    const reel = stepOf(strip, 'Left reel', 'continuity', 'A').position;
    state.removedId = reel.equipment!.id;

    const lee = await t.agentFor(DEMO.annexTechnician);
    const clientId = randomUUID();
    const body = { stripId: strip.id, positionId: reel.id, symptom: 'Touches on the left not registering', clientId };
    const first = await lee.post(`/api/venues/${annex}/incidents`).send(body);
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    expect(first.body).toMatchObject({ stripId: strip.id, positionId: reel.id, status: 'open', resolvedAt: null });
    const again = await lee.post(`/api/venues/${annex}/incidents`).send(body);
    expect(again.status).toBe(200);
    expect(again.body.id).toBe(first.body.id);
    expect(t.db.select().from(incidents).where(eq(incidents.venueId, annex)).all()).toHaveLength(1);
    state.incidentId = first.body.id;

    expect(t.db.select().from(venues).where(eq(venues.id, annex)).get()!.status).toBe('signed-off');
    const board = await marco.get(`/api/venues/${annex}/board`).expect(200);
    expect(board.body.strips[0]).toMatchObject({ id: strip.id, status: 'out-of-service', openIncidents: 1 });
    expect(board.body.strips[0].minutesSinceIncident).toBeGreaterThanOrEqual(0);
    expect(board.body.counts['out-of-service']).toBe(1);
    // The testing screen's answer for the strip says the same as the board.
    const onTablet = await lee.get(`/api/strips/${strip.id}`).expect(200);
    expect(onTablet.body.status).toBe('out-of-service');
    const list = await marco.get(`/api/venues/${annex}/certificates`).expect(200);
    const byNumber = new Map(list.body.certificates.map((c: { number: string }) => [c.number, c]));
    expect(byNumber.get(state.oldStrip)).toMatchObject({ status: 'valid' });
    expect((byNumber.get(state.oldStrip) as { supersededPendingSince: string | null }).supersededPendingSince).not.toBeNull();
    expect(byNumber.get(state.venueNumber)).toMatchObject({ status: 'valid', supersededPendingSince: null });
    const check = await t.request.get(`/api/verify/${state.venueNumber}`).expect(200);
    expect(check.body).toMatchObject({ status: 'valid', outOfService: [{ stripId: strip.id, strip: 'Annex 2' }], amendments: [] });
  });

  test('resolving before the retest is refused with what is missing (409 problem+json)', async () => {
    const lee = await t.agentFor(DEMO.annexTechnician);
    const res = await lee.post(`/api/incidents/${state.incidentId}/resolve`);
    expect(res.status).toBe(409);
    expect(res.headers['content-type']).toContain('application/problem+json');
    expect(res.body.code).toBe('retest-incomplete');
    const missing = res.body.missing as RetestStep[];
    // The incident's position is measured again: its seven steps.
    expect(missing.map((m) => `${m.positionName} ${m.testKind} ${m.conductors}`).sort()).toEqual(
      ['A', 'B', 'C']
        .map((c) => `Left reel continuity ${c}`)
        .concat(
          ['A-B', 'A-C', 'B-C'].map((c) => `Left reel insulation ${c}`),
          ['Left reel loop A-B'],
        )
        .sort(),
    );
  });

  test('the tested spare goes in: only the position’s continuity steps are asked again; the removed reel is to inspect', async () => {
    const lee = await t.agentFor(DEMO.annexTechnician);
    const strip = await stripByLabel(t, annex, 'Annex 2');
    const reel = stepOf(strip, 'Left reel', 'continuity', 'A').position;
    const res = await lee.post(`/api/incidents/${state.incidentId}/swap`).send({ positionId: reel.id, replacementAssetTag: 'SPR-901' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.incident.swaps).toHaveLength(1);
    expect(res.body.incident.swaps[0]).toMatchObject({
      replacement: { assetTag: 'SPR-901' },
      spareTested: true,
      removed: { id: state.removedId },
    });
    const missing = res.body.retest.missing as RetestStep[];
    expect(missing.map((m) => `${m.testKind} ${m.conductors} ${m.why}`).sort()).toEqual([
      'continuity A after-swap',
      'continuity B after-swap',
      'continuity C after-swap',
    ]);
    const marco = await t.agentFor(DEMO.director);
    const removed = await marco.get(`/api/equipment/${state.removedId}`).expect(200);
    expect(removed.body.item.toInspectIncidentId).toBe(state.incidentId);
    expect(removed.body.inspection).toMatchObject({ flagged: true, toInspect: true });
    expect(removed.body.incidents.map((i: { id: string; role: string }) => [i.id, i.role])).toContainEqual([state.incidentId, 'removed']);
    const pool = await marco.get(`/api/venues/${annex}/spares`).expect(200);
    expect(pool.body.spares[0].usedIn).toMatchObject({ incidentId: state.incidentId, stripLabel: 'Annex 2', positionName: 'Left reel' });
  });

  test('after the continuity retest the incident resolves, and the director amends: a new strip certificate, the venue one stays valid', async () => {
    const lee = await t.agentFor(DEMO.annexTechnician);
    const strip = await stripByLabel(t, annex, 'Annex 2');
    for (const c of ['A', 'B', 'C']) {
      await lee
        .post('/api/readings')
        .send(newReading(stepOf(strip, 'Left reel', 'continuity', c).step.id, '0.6'))
        .expect(201);
    }
    const resolved = await lee.post(`/api/incidents/${state.incidentId}/resolve`);
    expect(resolved.status, JSON.stringify(resolved.body)).toBe(200);
    expect(resolved.body.incident.status).toBe('resolved');
    expect(resolved.body.incident.resolvedAt).not.toBeNull();

    const marco = await t.agentFor(DEMO.director);
    const wrong = await marco
      .post(`/api/venues/${annex}/amendments`)
      .send({ password: 'not-the-password', incidentIds: [state.incidentId] });
    expect(wrong.status).toBe(401);
    const amended = await marco.post(`/api/venues/${annex}/amendments`).send({ password: DEMO_PASSWORD, incidentIds: [state.incidentId] });
    expect(amended.status, JSON.stringify(amended.body)).toBe(201);
    expect(amended.body.certificates).toHaveLength(1);
    expect(amended.body.certificates[0]).toMatchObject({ kind: 'strip', stripId: strip.id, status: 'valid', supersedes: state.oldStrip });
    state.newStrip = amended.body.certificates[0].number;

    const old = await t.request.get(`/api/verify/${state.oldStrip}`).expect(200);
    expect(old.body).toMatchObject({ status: 'superseded', successorNumber: state.newStrip });
    const fresh = await t.request.get(`/api/verify/${state.newStrip}`).expect(200);
    expect(fresh.body).toMatchObject({ status: 'valid', kind: 'strip', strips: ['Annex 2'] });
    const venueCheck = await t.request.get(`/api/verify/${state.venueNumber}`).expect(200);
    expect(venueCheck.body).toMatchObject({
      status: 'valid',
      outOfService: [],
      amendments: [{ number: state.newStrip, stripId: strip.id, strip: 'Annex 2' }],
    });
    expect(t.db.select().from(venues).where(eq(venues.id, annex)).get()!.status).toBe('signed-off');
    const board = await marco.get(`/api/venues/${annex}/board`).expect(200);
    expect(board.body.strips.find((s: { id: string }) => s.id === strip.id).status).toBe('clear');
    const actions = t.db
      .select()
      .from(auditLog)
      .where(eq(auditLog.entityId, state.incidentId!))
      .all()
      .map((a) => a.action);
    expect(actions).toEqual(expect.arrayContaining(['incident.opened', 'incident.swapped', 'incident.resolved']));
  });

  test('the incident list and report: minutes out of service, the swap and the retest readings; the ZIP carries the report', async () => {
    const nina = await t.agentFor(DEMO.organiser);
    const list = await nina.get(`/api/venues/${annex}/incidents`).expect(200);
    const row = list.body.incidents[0];
    expect(row.minutesOutOfService).toBe(Math.ceil((Date.parse(row.resolvedAt) - Date.parse(row.openedAt)) / 60_000));
    expect(row.amendment).toMatchObject({ number: state.newStrip });
    const pdf = await nina
      .get(`/api/venues/${annex}/incident-report.pdf`)
      .buffer(true)
      .parse(binary as never);
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    const text = await pdfText(new Uint8Array(pdf.body as Buffer));
    expect(text).toContain('Annex 2');
    expect(text).toContain('SPR-901');
    expect(text).toContain('Touches on the left not registering');
    const zip = await nina
      .get(`/api/venues/${annex}/certificates.zip`)
      .buffer(true)
      .parse(binary as never);
    expect(zip.status).toBe(200);
    expect((zip.body as Buffer).includes(Buffer.from('incidents-'))).toBe(true);
    expect((zip.body as Buffer).includes(Buffer.from(state.newStrip!))).toBe(true);
  });
});

describe('a plan change after the amendment', () => {
  test('still re-opens the whole venue: every certificate superseded, no strip left suspended', async () => {
    const marco = await t.agentFor(DEMO.director);
    const lee = await t.agentFor(DEMO.annexTechnician);
    const strip = await stripByLabel(t, annex, 'Annex 4');
    await lee.post(`/api/venues/${annex}/incidents`).send({ stripId: strip.id, symptom: 'Floor cable trodden flat' }).expect(201);
    expect(t.db.select().from(strips).where(eq(strips.id, strip.id)).get()!.outOfServiceSince).not.toBeNull();
    const tag = (await marco.get(`/api/venues/${annex}`)).headers.etag as string;
    const added = await marco
      .post(`/api/strips/${strip.id}/positions`)
      .set('If-Match', tag)
      .send({ name: 'Second apparatus', equipmentKind: 'apparatus' });
    expect(added.status, JSON.stringify(added.body)).toBe(201);
    expect(t.db.select().from(venues).where(eq(venues.id, annex)).get()!.status).toBe('testing');
    expect(
      t.db
        .select()
        .from(certificates)
        .where(eq(certificates.venueId, annex))
        .all()
        .filter((c) => c.status === 'valid'),
    ).toEqual([]);
    expect(
      t.db
        .select()
        .from(strips)
        .where(eq(strips.venueId, annex))
        .all()
        .filter((x) => x.outOfServiceSince),
    ).toEqual([]);
  });
});

describe('who may open incidents', () => {
  test('a technician not assigned to the venue is refused (403), another organisation’s admin is told it does not exist (404)', async () => {
    const strip = await stripByLabel(t, annex, 'Annex 3');
    const sam = await t.agentFor(DEMO.technician);
    const refused = await sam.post(`/api/venues/${annex}/incidents`).send({ stripId: strip.id, symptom: 'No lights on the box' });
    expect(refused.status).toBe(403);
    const other = await t.agentFor(OTHER_ADMIN, OTHER_PASSWORD);
    expect((await other.get(`/api/venues/${annex}/incidents`)).status).toBe(404);
    expect((await other.post(`/api/venues/${annex}/incidents`).send({ stripId: strip.id, symptom: 'No lights on the box' })).status).toBe(
      403,
    );
    const count = t.db.select().from(incidents).where(eq(incidents.stripId, strip.id)).all().length;
    expect(count).toBe(0);
  });

  test('bad input changes nothing: 422 problem+json naming the field', async () => {
    const lee = await t.agentFor(DEMO.annexTechnician);
    const res = await lee.post(`/api/venues/${annex}/incidents`).send({ stripId: 'x', symptom: '' });
    expect(res.status).toBe(422);
    expect(res.headers['content-type']).toContain('application/problem+json');
    expect(res.body.errors.map((e: { path: string }) => e.path)).toEqual(expect.arrayContaining(['stripId', 'symptom']));
  });
});

describe('the tablet’s time on an incident typed offline', () => {
  const minutesAgo = (m: number) => new Date(Date.now() - m * 60_000).toISOString();

  test('a replay with an earlier openedAt keeps it; a retest taken after it, received before the incident, counts for resolve', async () => {
    const lee = await t.agentFor(DEMO.annexTechnician);
    const strip = await stripByLabel(t, annex, 'Annex 1');
    const reel = strip.positions.find((p) => p.name === 'Left reel')!;
    const openedAt = minutesAgo(10);
    // The readings of the retest reach the server first (the tablet sends readings before incidents).
    for (const step of reel.steps) {
      const r = await lee.post('/api/readings').send(newReading(step.id, GOOD_VALUE[step.testKind], { takenAt: minutesAgo(5) }));
      expect(r.status, JSON.stringify(r.body)).toBe(201);
    }
    const body = { stripId: strip.id, positionId: reel.id, symptom: 'Reel jammed half way', clientId: randomUUID(), openedAt };
    const res = await lee.post(`/api/venues/${annex}/incidents`).send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.openedAt).toBe(openedAt);
    const detail = await lee.get(`/api/incidents/${res.body.id}`).expect(200);
    const mine = (detail.body.retest.steps as RetestStep[]).filter((s) => s.why === 'after-incident');
    expect(mine).toHaveLength(reel.steps.length);
    expect(mine.every((s) => s.done)).toBe(true);
    expect(detail.body.canResolve).toBe(true);
    const resolved = await lee.post(`/api/incidents/${res.body.id}/resolve`);
    expect(resolved.status, JSON.stringify(resolved.body)).toBe(200);
  });

  test('a tablet time outside the readings’ window is not believed: arrival time, the tablet’s kept in the audit', async () => {
    const lee = await t.agentFor(DEMO.annexTechnician);
    const strip = await stripByLabel(t, annex, 'Annex 1');
    // Older than the 7 days a tablet keeps its queue (shared/domain/reading-time.ts).
    const claimed = minutesAgo(8 * 24 * 60);
    const before = new Date().toISOString();
    const res = await lee
      .post(`/api/venues/${annex}/incidents`)
      .send({ stripId: strip.id, symptom: 'Box lights flicker', openedAt: claimed });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.openedAt >= before).toBe(true);
    const audit = t.db.select().from(auditLog).where(eq(auditLog.entityId, res.body.id)).all();
    const opened = audit.find((a) => a.action === 'incident.opened')!;
    expect(JSON.parse(opened.detailJson)).toMatchObject({ tabletOpenedAt: claimed, tabletClock: 'too-old' });
  });

  test('the same clientId with another strip or symptom is 409 problem+json, never a second incident', async () => {
    const lee = await t.agentFor(DEMO.annexTechnician);
    const one = await stripByLabel(t, annex, 'Annex 1');
    const two = await stripByLabel(t, annex, 'Annex 2');
    const clientId = randomUUID();
    const body = { stripId: one.id, symptom: 'Scoring box dead', clientId, openedAt: minutesAgo(3) };
    const first = await lee.post(`/api/venues/${annex}/incidents`).send(body);
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    const same = await lee.post(`/api/venues/${annex}/incidents`).send(body);
    expect(same.status).toBe(200);
    expect(same.body).toEqual(first.body);
    for (const other of [
      { ...body, stripId: two.id },
      { ...body, symptom: 'Floor cable cut' },
    ]) {
      const res = await lee.post(`/api/venues/${annex}/incidents`).send(other);
      expect(res.status).toBe(409);
      expect(res.headers['content-type']).toContain('application/problem+json');
      expect(res.body.code).toBe('client-id-used');
      expect(res.body.detail).toMatch(/already used for another incident/);
    }
    expect(t.db.select().from(incidents).where(eq(incidents.clientId, clientId)).all()).toHaveLength(1);
  });
});
