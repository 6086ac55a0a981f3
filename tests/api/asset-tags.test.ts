// PUT /api/venues/:id/equipment: asset tags for many positions of a venue in one edit.
// The rules checked come from the product brief (items attached to positions by asset tag, one item
// in one position), RFC 9457 (problem+json answers) and RFC 9110 §13.1.1 / RFC 6585 §3 (If-Match:
// 412 when stale, 428 without).
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { and, eq, isNull } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp } from '../setup/test-app';
import { addOtherOrg, OTHER_ADMIN, OTHER_DIRECTOR, OTHER_PASSWORD } from '../setup/other-org';
import { venueIds } from './testing-helpers';
import * as s from '../../server/db/schema';

type Position = { id: string; name: string; equipmentKind: string; equipment: { assetTag: string } | null };
type Strip = { id: string; label: string; zone: string | null; positions: Position[] };
type Plan = { venue: { id: string; version: number }; strips: Strip[] };

let t: TestApp;
let hallId: string;
let annexId: string;

beforeAll(async () => {
  t = await createTestApp();
  await addOtherOrg(t);
  ({ hall: hallId, annex: annexId } = await venueIds(t));
});
afterAll(() => t.close());

const route = (venueId: string) => `/api/venues/${venueId}/equipment`;
const director = () => t.agentFor(DEMO.director);
async function loadPlan(venueId = hallId) {
  const res = await (await director()).get(`/api/venues/${venueId}`);
  return { plan: res.body as Plan, etag: res.headers.etag as string };
}
const strip = (plan: Plan, label: string) => plan.strips.find((x) => x.label === label)!;
const tagsOf = (st: Strip) => st.positions.map((p) => p.equipment?.assetTag ?? null);
const openPlacements = (positionId: string) =>
  t.db
    .select()
    .from(s.positionAssignments)
    .where(and(eq(s.positionAssignments.positionId, positionId), isNull(s.positionAssignments.removedAt)))
    .all();

async function newItems(kind: string, tags: string[]) {
  const marco = await director();
  for (const assetTag of tags) {
    const res = await marco
      .post('/api/equipment')
      .send({ assetTag, kind, ...(kind === 'apparatus' ? {} : { lengthM: kind === 'reel' ? 20 : 12 }) });
    expect(res.status).toBe(201);
  }
}

describe('PUT /api/venues/:id/equipment', () => {
  test('when every position of a strip is given a tag, then all are attached in one edit (one version step, history kept)', async () => {
    await newItems('floor-cable', ['BT-FC-1', 'BT-FC-2']);
    await newItems('reel', ['BT-RL-1', 'BT-RL-2']);
    const { plan, etag } = await loadPlan();
    const st = strip(plan, 'Strip 20');
    const floors = st.positions.filter((p) => p.equipmentKind === 'floor-cable');
    const reels = st.positions.filter((p) => p.equipmentKind === 'reel');
    const apparatus = st.positions.find((p) => p.equipmentKind === 'apparatus')!;
    const body = {
      positions: [
        { positionId: apparatus.id, assetTag: null },
        { positionId: floors[0].id, assetTag: 'bt-fc-1' },
        { positionId: floors[1].id, assetTag: 'BT-FC-2' },
        { positionId: reels[0].id, assetTag: 'BT-RL-1' },
        { positionId: reels[1].id, assetTag: 'BT-RL-2' },
      ],
    };
    const res = await (await director()).put(route(hallId)).set('If-Match', etag).send(body);
    expect(res.status).toBe(200);
    expect((res.body as Plan).venue.version).toBe(plan.venue.version + 1);
    const after = strip(res.body as Plan, 'Strip 20');
    expect(Object.fromEntries(after.positions.map((p) => [p.name, p.equipment?.assetTag ?? null]))).toMatchObject({
      'Scoring apparatus': null,
      [floors[0].name]: 'BT-FC-1',
      [floors[1].name]: 'BT-FC-2',
      [reels[0].name]: 'BT-RL-1',
      [reels[1].name]: 'BT-RL-2',
    });
    // The placement history: one open placement per filled position, none for the emptied one.
    expect(openPlacements(floors[0].id)).toHaveLength(1);
    expect(openPlacements(apparatus.id)).toHaveLength(0);
    const audit = t.db
      .select()
      .from(s.auditLog)
      .all()
      .filter((a) => a.action.startsWith('position.equipment-') && a.entityId && body.positions.some((p) => p.positionId === a.entityId));
    expect(audit).toHaveLength(5);
  });

  test('when two positions swap their items in one list, then both move (an item freed in the list may be used in it)', async () => {
    const { plan, etag } = await loadPlan();
    const st = strip(plan, 'Strip 21');
    const [left, right] = st.positions.filter((p) => p.equipmentKind === 'floor-cable');
    const [a, b] = [left.equipment!.assetTag, right.equipment!.assetTag];
    const res = await (
      await director()
    )
      .put(route(hallId))
      .set('If-Match', etag)
      .send({
        positions: [
          { positionId: left.id, assetTag: b },
          { positionId: right.id, assetTag: a },
        ],
      });
    expect(res.status).toBe(200);
    const after = strip(res.body as Plan, 'Strip 21');
    expect(after.positions.find((p) => p.id === left.id)!.equipment!.assetTag).toBe(b);
    expect(after.positions.find((p) => p.id === right.id)!.equipment!.assetTag).toBe(a);
  });

  test('when a whole row is given tags, then every strip of the row takes its item', async () => {
    const { plan, etag } = await loadPlan();
    const row = plan.strips.filter((x) => x.zone === 'Row C');
    expect(row.length).toBe(8);
    const tags = row.map((_, i) => `ROWC-${i + 1}`);
    await newItems('apparatus', tags);
    const positions = row.map((x, i) => ({ positionId: x.positions.find((p) => p.equipmentKind === 'apparatus')!.id, assetTag: tags[i] }));
    const res = await (await director()).put(route(hallId)).set('If-Match', etag).send({ positions });
    expect(res.status).toBe(200);
    const after = (res.body as Plan).strips.filter((x) => x.zone === 'Row C');
    expect(after.map((x) => x.positions.find((p) => p.equipmentKind === 'apparatus')!.equipment?.assetTag)).toEqual(tags);
  });

  test('when a tag is listed twice, then 422 says which rows repeat it, and nothing changes', async () => {
    await newItems('reel', ['DUP-RL-1']);
    const { plan, etag } = await loadPlan();
    const st = strip(plan, 'Strip 22');
    const before = tagsOf(st);
    const [r1, r2] = st.positions.filter((p) => p.equipmentKind === 'reel');
    const res = await (
      await director()
    )
      .put(route(hallId))
      .set('If-Match', etag)
      .send({
        positions: [
          { positionId: r1.id, assetTag: 'DUP-RL-1' },
          { positionId: r2.id, assetTag: 'dup-rl-1' },
        ],
      });
    expect(res.status).toBe(422);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.errors).toEqual([
      { path: 'positions.1.assetTag', message: expect.stringContaining('DUP-RL-1 is given twice (rows 1 and 2)') },
    ]);
    const now = await loadPlan();
    expect(now.plan.venue.version).toBe(plan.venue.version);
    expect(tagsOf(strip(now.plan, 'Strip 22'))).toEqual(before);
  });

  test('when one tag of the list cannot go, then every problem is named, the good rows are not saved either', async () => {
    await newItems('floor-cable', ['GOOD-FC-1']);
    await newItems('floor-cable', ['OLD-FC-1']);
    const marco = await director();
    const old = t.db.select().from(s.equipment).where(eq(s.equipment.assetTag, 'OLD-FC-1')).get()!;
    const retire = await marco
      .patch(`/api/equipment/${old.id}`)
      .set('If-Match', (await marco.get(`/api/equipment/${old.id}`)).headers.etag)
      .send({ status: 'retired' });
    expect(retire.status).toBe(200);
    const { plan, etag } = await loadPlan();
    const st = strip(plan, 'Strip 23');
    const before = tagsOf(st);
    const [left, right] = st.positions.filter((p) => p.equipmentKind === 'floor-cable');
    const reel = st.positions.find((p) => p.equipmentKind === 'reel')!;
    const res = await marco
      .put(route(hallId))
      .set('If-Match', etag)
      .send({
        positions: [
          { positionId: left.id, assetTag: 'GOOD-FC-1' },
          { positionId: right.id, assetTag: 'OLD-FC-1' },
          { positionId: reel.id, assetTag: 'NO-SUCH-9' },
        ],
      });
    expect(res.status).toBe(422);
    expect(res.body.detail).toMatch(/^Nothing was saved: 2 rows need a change/);
    expect(res.body.errors.map((e: { path: string }) => e.path)).toEqual(['positions.1.assetTag', 'positions.2.assetTag']);
    expect(res.body.errors[0].message).toContain('OLD-FC-1 is retired');
    expect(res.body.errors[1].message).toContain('no item with the asset tag NO-SUCH-9');
    const now = await loadPlan();
    expect(now.plan.venue.version).toBe(plan.venue.version);
    expect(tagsOf(strip(now.plan, 'Strip 23'))).toEqual(before);
    expect(t.db.select().from(s.positions).where(eq(s.positions.id, left.id)).get()!.equipmentId).not.toBe(
      t.db.select().from(s.equipment).where(eq(s.equipment.assetTag, 'GOOD-FC-1')).get()!.id,
    );
  });

  test('when an item sits on a strip left out of the list, then 409 names where it is; a wrong kind is 422', async () => {
    const { plan, etag } = await loadPlan();
    const busy = strip(plan, 'Strip 1').positions.find((p) => p.equipmentKind === 'floor-cable')!.equipment!.assetTag;
    const target = strip(plan, 'Strip 24').positions.filter((p) => p.equipmentKind === 'floor-cable');
    const marco = await director();
    const res = await marco
      .put(route(hallId))
      .set('If-Match', etag)
      .send({ positions: [{ positionId: target[0].id, assetTag: busy }] });
    expect(res.status).toBe(409);
    expect(res.body.errors[0].message).toContain(`${busy} is already on Strip 1`);
    const kind = await marco
      .put(route(hallId))
      .set('If-Match', etag)
      .send({ positions: [{ positionId: target[0].id, assetTag: 'BT-RL-1' }] });
    expect(kind.status).toBe(422);
    expect(kind.body.errors[0].message).toMatch(/BT-RL-1 is a reel, but this position takes a floor cable/);
    expect((await loadPlan()).plan.venue.version).toBe(plan.venue.version);
  });

  test('when a position of another venue is listed, then 422 and nothing changes', async () => {
    const annex = await loadPlan(annexId);
    const { plan, etag } = await loadPlan();
    const res = await (
      await director()
    )
      .put(route(hallId))
      .set('If-Match', etag)
      .send({ positions: [{ positionId: annex.plan.strips[0].positions[0].id, assetTag: null }] });
    expect(res.status).toBe(422);
    expect(res.body.errors[0]).toEqual({ path: 'positions.0.positionId', message: 'Row 1 is not a position of this venue.' });
    expect((await loadPlan()).plan.venue.version).toBe(plan.venue.version);
  });

  test('without If-Match 428, with a stale one 412, and nothing changes', async () => {
    const { plan, etag } = await loadPlan();
    const body = { positions: [{ positionId: strip(plan, 'Strip 19').positions[0].id, assetTag: null }] };
    const marco = await director();
    expect((await marco.put(route(hallId)).send(body)).status).toBe(428);
    expect(
      (
        await marco
          .put(route(hallId))
          .set('If-Match', `"${plan.venue.version - 1}"`)
          .send(body)
      ).status,
    ).toBe(412);
    expect(tagsOf(strip((await loadPlan()).plan, 'Strip 19'))).toEqual(tagsOf(strip(plan, 'Strip 19')));
    expect(etag).toBe(`"${plan.venue.version}"`);
  });

  test('another organisation’s director (404) and admin, technicians assigned or not, and the organiser (403) are refused', async () => {
    const { plan, etag } = await loadPlan();
    const body = { positions: [{ positionId: strip(plan, 'Strip 18').positions[0].id, assetTag: null }] };
    const hilltopDirector = await t.agentFor(OTHER_DIRECTOR, OTHER_PASSWORD);
    expect((await hilltopDirector.put(route(hallId)).set('If-Match', etag).send(body)).status).toBe(404);
    const hilltopAdmin = await t.agentFor(OTHER_ADMIN, OTHER_PASSWORD);
    expect((await hilltopAdmin.put(route(hallId)).set('If-Match', etag).send(body)).status).toBe(403);
    for (const who of [DEMO.technician, DEMO.annexTechnician, DEMO.organiser, DEMO.admin]) {
      expect((await (await t.agentFor(who)).put(route(hallId)).set('If-Match', etag).send(body)).status).toBe(403);
    }
    const now = await loadPlan();
    expect(now.plan.venue.version).toBe(plan.venue.version);
    expect(tagsOf(strip(now.plan, 'Strip 18'))).toEqual(tagsOf(strip(plan, 'Strip 18')));
  });
});

describe('PATCH /api/strips/:id with assetTags (the strip card saves once)', () => {
  test('the strip’s details and its tags change in one edit; a refused tag keeps the details unchanged too', async () => {
    await newItems('reel', ['CARD-RL-1']);
    const { plan, etag } = await loadPlan();
    const st = strip(plan, 'Strip 17');
    const reel = st.positions.find((p) => p.equipmentKind === 'reel')!;
    const marco = await director();
    const refused = await marco
      .patch(`/api/strips/${st.id}`)
      .set('If-Match', etag)
      .send({ label: 'Strip 17b', assetTags: [{ positionId: reel.id, assetTag: 'NOPE-1' }] });
    expect(refused.status).toBe(422);
    expect(refused.body.errors).toEqual([
      { path: 'assetTags.0.assetTag', message: expect.stringContaining('no item with the asset tag NOPE-1') },
    ]);
    const between = await loadPlan();
    expect(between.plan.venue.version).toBe(plan.venue.version);
    expect(strip(between.plan, 'Strip 17')).toBeDefined();

    const ok = await marco
      .patch(`/api/strips/${st.id}`)
      .set('If-Match', etag)
      .send({ label: 'Strip 17b', assetTags: [{ positionId: reel.id, assetTag: 'CARD-RL-1' }] });
    expect(ok.status).toBe(200);
    expect((ok.body as Plan).venue.version).toBe(plan.venue.version + 1);
    const after = strip(ok.body as Plan, 'Strip 17b');
    expect(after.positions.find((p) => p.id === reel.id)!.equipment!.assetTag).toBe('CARD-RL-1');
  });
});
