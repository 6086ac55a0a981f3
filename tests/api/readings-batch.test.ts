// POST /api/readings/batch: a tablet's queue after time offline, sent in one request. Each reading
// is answered with the status and body it would have had alone, in the order sent, and all are
// stored in one commit (the commit itself: tests/api/group-commit.test.ts and the durability test).
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, ORIGIN, type TestApp } from '../setup/test-app';
import { addOtherOrg } from '../setup/other-org';
import { faults, readings, steps } from '../../server/db/schema';
import { newReading, stepOf, stripByLabel, venueIds, type StripDto } from './testing-helpers';
import type { ReadingBatchResult } from '../../shared/schemas/readings';

let t: TestApp;
let hall: string;
let annex: string;
beforeAll(async () => {
  t = await createTestApp();
  ({ hall, annex } = await venueIds(t));
});
afterAll(() => t.close());

const stored = (id: string) => t.db.select().from(readings).where(eq(readings.id, id)).all();
type Agent = Awaited<ReturnType<TestApp['agentFor']>>;
const batch = async (agent: Agent, list: unknown[]) => {
  const res = await agent.post('/api/readings/batch').send({ readings: list });
  return { res, results: (res.body as { results: ReadingBatchResult[] }).results };
};

describe('POST /api/readings/batch', () => {
  let strip: StripDto;
  beforeAll(async () => {
    strip = await stripByLabel(t, hall, 'Strip 21');
  });

  test('when readings are sent together, then each is judged as alone, in order, and stored once', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const a = stepOf(strip, 'Left floor cable', 'continuity', 'A').step;
    const b = stepOf(strip, 'Left floor cable', 'continuity', 'B').step;
    const sent = [newReading(a.id, '2.6'), newReading(b.id, '0.5'), newReading(a.id, '2.31')];
    const { res, results } = await batch(sam, sent);
    expect(res.status).toBe(200);
    expect(results.map((r) => [r.id, r.status])).toEqual(sent.map((s) => [s.id, 201]));
    // FIE Material Rules m.55.5: at most 2.5 Ω per wire of a floor cable; 2.31 Ω is over 90 % of it.
    expect(results.map((r) => r.reading!.verdict)).toEqual(['fail', 'pass', 'near-limit']);
    expect(results[0].reading).toMatchObject({ limitOhm: 2.5, source: 'FIE Material Rules, art. m.55.5' });
    // The failure opened a fault, as a reading sent alone does; the later reading of the step sees it.
    expect(results[0].reading!.faultId).toBeTruthy();
    expect(t.db.select().from(faults).where(eq(faults.readingId, sent[0].id)).all()).toHaveLength(1);
    for (const s of sent) expect(stored(s.id)).toHaveLength(1);
    // The later reading of step A is its latest, as the order sent says.
    const after = await stripByLabel(t, hall, 'Strip 21');
    expect(stepOf(after, 'Left floor cable', 'continuity', 'A').step.latest!.id).toBe(sent[2].id);
  });

  test('when the same batch comes again (an answer lost on the way), then every reading answers 200 with the stored one and nothing is stored twice', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const c = stepOf(strip, 'Right floor cable', 'continuity', 'C').step;
    const sent = [newReading(c.id, '0.4'), newReading(c.id, '0.45')];
    const first = await batch(sam, sent);
    expect(first.results.map((r) => r.status)).toEqual([201, 201]);
    const again = await batch(sam, sent);
    expect(again.results.map((r) => r.status)).toEqual([200, 200]);
    expect(again.results.map((r) => r.reading!.receivedAt)).toEqual(first.results.map((r) => r.reading!.receivedAt));
    for (const s of sent) expect(stored(s.id)).toHaveLength(1);
  });

  test('when one id is sent twice in a batch, then the second is a replay (same body) or refused (other body), as two requests would be', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const a = stepOf(strip, 'Right floor cable', 'continuity', 'A').step;
    const r = newReading(a.id, '0.5');
    const { results } = await batch(sam, [r, r, { ...r, value: '0.6' }]);
    expect(results.map((x) => x.status)).toEqual([201, 200, 422]);
    expect(results[2].problem).toMatchObject({ status: 422, code: 'idempotency-mismatch' });
    expect(stored(r.id)).toHaveLength(1);
    expect(stored(r.id)[0].valueText).toBe('0.5');
  });

  test('when one reading is refused, then it alone is: its result carries the problem it would have had, the others are stored', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const lead = stepOf(strip, 'Left reel', 'continuity', 'A').step;
    const removed = stepOf(strip, 'Left reel', 'continuity', 'B').step;
    t.db.update(steps).set({ removedAt: new Date().toISOString() }).where(eq(steps.id, removed.id)).run();
    const annexStrip = await stripByLabel(t, annex, 'Annex 1');
    const other = await addOtherOrg(t);
    const sent = [
      newReading(lead.id, '0.5'),
      newReading(removed.id, '0.5'), // taken off the checklist
      newReading(annexStrip.positions.flatMap((p) => p.steps)[0].id, '0.5'), // Sam is not assigned to the Annex
      newReading(other.stepId, '0.5'), // another organisation's step
      newReading(lead.id, 'twelve'), // not a meter reading
      { id: randomUUID(), stepId: lead.id }, // no value: refused by the schema, as alone
      { id: 42, value: '0.5' },
      newReading(lead.id, '0.6'),
    ];
    const { res, results } = await batch(sam, sent);
    expect(res.status).toBe(200);
    expect(results.map((r) => r.status)).toEqual([201, 409, 403, 404, 422, 422, 422, 201]);
    expect(results.map((r) => r.id)).toEqual([...sent.slice(0, 6).map((s) => s.id as string), null, sent[7].id]);
    expect(results[1].problem).toMatchObject({ code: 'step-removed', type: '/problems/step-removed' });
    expect(results[1].problem!.detail).toMatch(/taken off the checklist/);
    expect(results[2].problem!.detail).toMatch(/not assigned/);
    expect(results[4].problem!.errors!.map((e) => e.path)).toEqual(['value']);
    expect(results[5].problem!.errors!.map((e) => e.path)).toEqual(['value']);
    for (const r of results) expect(r.status >= 400 ? r.reading : r.problem).toBeUndefined();
    // Compare with the same refusals sent alone.
    const alone = await sam.post('/api/readings').send(newReading(removed.id, '0.5'));
    expect([alone.status, alone.body.code]).toEqual([409, results[1].problem!.code]);
    expect(sent.slice(1, 7).every((s) => typeof s.id !== 'string' || stored(s.id).length === 0)).toBe(true);
    expect(stored(sent[0].id as string)).toHaveLength(1);
    expect(stored(sent[7].id as string)).toHaveLength(1);
  });

  test('when readings were typed offline, then each counts at its own takenAt within the window, else at its arrival with the tablet time kept', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const { step } = stepOf(strip, 'Right reel', 'continuity', 'A');
    const typed = new Date(Date.now() - 40 * 60_000).toISOString();
    const monthOld = new Date(Date.now() - 30 * 24 * 3_600_000).toISOString();
    const { results } = await batch(sam, [
      newReading(step.id, '0.7', { takenAt: typed }),
      newReading(step.id, '0.8', { takenAt: monthOld }),
    ]);
    expect(results[0].reading!.takenAt).toBe(typed);
    expect(results[1].reading!.takenAt).toBe(results[1].reading!.receivedAt);
    const audit = t.sqlite
      .prepare("select detail_json from audit_log where entity_type = 'reading' and entity_id = ?")
      .pluck()
      .get(results[1].id) as string;
    expect(JSON.parse(audit)).toMatchObject({ tabletTakenAt: monthOld, tabletClock: 'too-old' });
  });

  test("when a batch of 200 corrections with long reasons is over the API's usual 100 kB, then it is still taken", async () => {
    const marco = await t.agentFor(DEMO.director);
    const big = await stripByLabel(t, hall, 'Strip 22');
    const all = big.positions.flatMap((p) => p.steps);
    const firsts = Array.from({ length: 200 }, (_, i) =>
      newReading(all[i % all.length].id, all[i % all.length].testKind === 'insulation' ? 'OL' : '0.5'),
    );
    expect((await batch(marco, firsts)).results.every((r) => r.status === 201)).toBe(true);
    const reason = 'Read again with fresh probes after cleaning the pins; the first value was taken through a dirty contact. ';
    const corrections = firsts.map((f) =>
      newReading(f.stepId, f.value, { supersedesId: f.id, correctionReason: reason.repeat(4).slice(0, 480) }),
    );
    expect(JSON.stringify({ readings: corrections }).length).toBeGreaterThan(100_000);
    const { res, results } = await batch(marco, corrections);
    expect(res.status).toBe(200);
    expect(results.every((r) => r.status === 201 && r.reading!.supersedesId)).toBe(true);
  });

  test('when the batch itself is not right, then it answers 422 naming it and stores nothing', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const stepId = strip.positions.flatMap((p) => p.steps)[0].id;
    const tooMany = Array.from({ length: 201 }, () => newReading(stepId, '0.5'));
    for (const body of [
      { readings: [] },
      { readings: tooMany },
      { readings: 'all of them' },
      {},
      [newReading(stepId, '0.5')],
      { readings: [newReading(stepId, '0.5')], extra: 1 },
    ]) {
      const res = await sam.post('/api/readings/batch').send(body);
      expect(res.status, JSON.stringify(body).slice(0, 80)).toBe(422);
      expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    }
    expect(tooMany.some((r) => stored(r.id).length > 0)).toBe(false);
  });

  test('who may send a batch: the testers; the organiser and the admin are refused whole (403), anonymous 401', async () => {
    const stepId = stepOf(strip, 'Right reel', 'continuity', 'B').step.id;
    for (const who of [DEMO.organiser, DEMO.admin]) {
      const agent = await t.agentFor(who);
      const body = newReading(stepId, '1.1');
      expect((await agent.post('/api/readings/batch').send({ readings: [body] })).status).toBe(403);
      expect(stored(body.id)).toHaveLength(0);
    }
    expect(
      (
        await t.request
          .post('/api/readings/batch')
          .set('Origin', ORIGIN)
          .send({ readings: [newReading(stepId, '1.1')] })
      ).status,
    ).toBe(401);
    const marco = await t.agentFor(DEMO.director);
    expect((await batch(marco, [newReading(stepId, '1.1')])).results[0].status).toBe(201);
  });
});
