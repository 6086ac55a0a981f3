import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp } from '../setup/test-app';
import * as s from '../../server/db/schema';
import { addOtherOrg, OTHER_DIRECTOR, OTHER_PASSWORD } from '../setup/other-org';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

type Item = { id: string; assetTag: string; kind: string; lengthM: number | null; version: number; velocityFactor: number | null };

async function itemByTag(tag: string) {
  const marco = await t.agentFor(DEMO.director);
  const list = (await marco.get('/api/equipment').query({ q: tag })).body as Item[];
  return list.find((i) => i.assetTag === tag)!;
}

describe('GET /api/equipment', () => {
  test('when filtered by kind and text, then only matching items of our organisation come back', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const res = await sam.get('/api/equipment').query({ kind: 'reel', q: 'RL-00' });
    expect(res.status).toBe(200);
    expect(res.body.length).toBeGreaterThan(0);
    expect(res.body.every((i: Item) => i.kind === 'reel' && i.assetTag.startsWith('RL-00'))).toBe(true);
  });

  test('when the filter is not a kind, then 422 names the field; anonymous callers get 401', async () => {
    const nina = await t.agentFor(DEMO.organiser);
    const res = await nina.get('/api/equipment').query({ kind: 'toaster' });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].path).toBe('kind');
    expect((await t.request.get('/api/equipment')).status).toBe(401);
  });
});

describe('POST /api/equipment', () => {
  test('when a director registers an item, then it is stored with its tag upper-cased and audited', async () => {
    const marco = await t.agentFor(DEMO.director);
    const res = await marco
      .post('/api/equipment')
      .send({ assetTag: 'fc-900', kind: 'floor-cable', description: 'Spare 15 m floor cable', lengthM: 15, conductorMm2: 0.75 });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ assetTag: 'FC-900', kind: 'floor-cable', lengthM: 15, status: 'in-service', version: 1 });
    expect(res.headers.etag).toBe('"1"');
    const audit = t.db.select().from(s.auditLog).where(eq(s.auditLog.entityId, res.body.id)).all();
    expect(audit.map((a) => a.action)).toEqual(['equipment.created']);
  });

  test('when the asset tag is already in the register, then 409 names the tag', async () => {
    const ada = await t.agentFor(DEMO.admin);
    const res = await ada.post('/api/equipment').send({ assetTag: 'FC-001', kind: 'floor-cable' });
    expect(res.status).toBe(409);
    expect(res.body.code).toBe('duplicate-asset-tag');
    expect(res.body.detail).toContain('FC-001');
  });

  test('when the input is bad, then 422 lists the fields, never 500', async () => {
    const ada = await t.agentFor(DEMO.admin);
    const res = await ada.post('/api/equipment').send({ assetTag: '', kind: 'spoon', lengthM: -3, colour: 'red' });
    expect(res.status).toBe(422);
    const paths = res.body.errors.map((e: { path: string }) => e.path);
    expect(paths).toEqual(expect.arrayContaining(['assetTag', 'kind', 'lengthM', '(body)']));
  });

  test('when a technician or an organiser tries, then 403', async () => {
    for (const who of [DEMO.technician, DEMO.organiser]) {
      const agent = await t.agentFor(who);
      expect((await agent.post('/api/equipment').send({ assetTag: 'X-1', kind: 'other' })).status).toBe(403);
    }
  });
});

describe('PATCH /api/equipment/:id', () => {
  test('when If-Match is current, then the change is stored and the version moves on; a stale one gets 412 and changes nothing', async () => {
    const marco = await t.agentFor(DEMO.director);
    const ada = await t.agentFor(DEMO.admin);
    const item = await itemByTag('RL-010');
    const first = await marco.patch(`/api/equipment/${item.id}`).set('If-Match', `"${item.version}"`).send({ notes: 'Spring weak' });
    expect(first.status).toBe(200);
    expect(first.body.version).toBe(item.version + 1);
    expect(first.headers.etag).toBe(`"${item.version + 1}"`);

    const second = await ada.patch(`/api/equipment/${item.id}`).set('If-Match', `"${item.version}"`).send({ notes: 'Overwritten?' });
    expect(second.status).toBe(412);
    expect(second.body.detail).toMatch(/changed RL-010 meanwhile/);
    expect(second.body.currentVersion).toBe(item.version + 1);
    expect((await marco.get(`/api/equipment/${item.id}`)).body.item.notes).toBe('Spring weak');
  });

  test('when If-Match is missing, then 428; another organisation’s item or a bad id are 404 / 422', async () => {
    const marco = await t.agentFor(DEMO.director);
    const item = await itemByTag('RL-011');
    expect((await marco.patch(`/api/equipment/${item.id}`).send({ notes: 'x' })).status).toBe(428);
    expect((await marco.patch(`/api/equipment/${crypto.randomUUID()}`).set('If-Match', '"1"').send({ notes: 'x' })).status).toBe(404);
    expect((await marco.patch('/api/equipment/nope').set('If-Match', '"1"').send({ notes: 'x' })).status).toBe(422);
  });

  test('when the new tag is taken, then 409', async () => {
    const marco = await t.agentFor(DEMO.director);
    const item = await itemByTag('RL-012');
    const res = await marco.patch(`/api/equipment/${item.id}`).set('If-Match', `"${item.version}"`).send({ assetTag: 'RL-013' });
    expect(res.status).toBe(409);
    expect(res.body.detail).toContain('RL-013');
  });
});

describe('POST /api/equipment/:id/calibrations', () => {
  test('when a good cable of known length is measured, then the velocity factor is stored on the item and in its history', async () => {
    const marco = await t.agentFor(DEMO.director);
    const item = await itemByTag('FC-020');
    // 12 m and back at VF 0.66: 2 · 12 / (0.66 · c) = 121.3 ns.
    const roundTripNs = ((2 * 12) / (0.66 * 299_792_458)) * 1e9;
    const res = await marco.post(`/api/equipment/${item.id}/calibrations`).send({ roundTripNs, lengthM: 12 });
    expect(res.status).toBe(201);
    expect(res.body.velocityFactor).toBeCloseTo(0.66, 6);
    const detail = (await marco.get(`/api/equipment/${item.id}`)).body;
    expect(detail.item.velocityFactor).toBeCloseTo(0.66, 6);
    expect(detail.calibrations).toHaveLength(1);
    expect(detail.calibrations[0]).toMatchObject({ lengthM: 12, byName: 'Marco Dal Bello' });
  });

  test('when the numbers are not physical, then 422 says why and names the field', async () => {
    const marco = await t.agentFor(DEMO.director);
    const item = await itemByTag('FC-021');
    const res = await marco.post(`/api/equipment/${item.id}/calibrations`).send({ roundTripNs: 10, lengthM: 12 });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].path).toBe('roundTripNs');
    const missing = await marco.post(`/api/equipment/${item.id}/calibrations`).send({ lengthM: 12 });
    expect(missing.status).toBe(422);
    expect(missing.body.errors[0].path).toBe('roundTripNs');
  });
});

describe('GET /api/equipment/:id', () => {
  test('the item page holds its readings, faults, the strips it sat on, and a cut-out repair with the shortened length', async () => {
    const nina = await t.agentFor(DEMO.organiser);
    // The A–B short of the demo sits on Strip 6's left floor cable.
    const fault = t.db.select().from(s.faults).where(eq(s.faults.kind, 'short')).get()!;
    const item = t.db.select().from(s.equipment).where(eq(s.equipment.id, fault.equipmentId!)).get()!;
    expect(item.lengthM).toBe(12);
    // A cut-out as the repair service records it: the repair row and the item's new length.
    const repairId = crypto.randomUUID();
    t.db
      .insert(s.repairs)
      .values({
        id: repairId,
        faultId: fault.id,
        equipmentId: item.id,
        action: 'cut-out',
        lengthRemovedM: 0.6,
        lengthBeforeM: 12,
        createdBy: fault.openedBy,
      })
      .run();
    t.db.update(s.equipment).set({ lengthM: 11.4 }).where(eq(s.equipment.id, item.id)).run();

    const res = await nina.get(`/api/equipment/${item.id}`);
    expect(res.status).toBe(200);
    expect(res.body.item).toMatchObject({ assetTag: item.assetTag, lengthM: 11.4 });
    expect(res.body.originalLengthM).toBe(12);
    expect(res.body.lengthRemovedM).toBeCloseTo(0.6);
    expect(res.body.repairs).toEqual([
      expect.objectContaining({ id: repairId, action: 'cut-out', lengthAfterM: 11.4, byName: 'Sam Reyes' }),
    ]);
    expect(res.body.faults).toEqual([
      expect.objectContaining({ id: fault.id, kind: 'short', stripLabel: 'Strip 6', venueName: 'Riverside Sports Hall' }),
    ]);
    expect(res.body.placements).toEqual([
      expect.objectContaining({ stripLabel: 'Strip 6', positionName: 'Left floor cable', eventName: 'Autumn Cup 2026', removedAt: null }),
    ]);
    // Every step of that cable was read once in the demo (6 steps + loop).
    expect(res.body.readings).toHaveLength(7);
    expect(res.body.readings.some((r: { verdict: string; conductors: string }) => r.verdict === 'fail' && r.conductors === 'A-B')).toBe(
      true,
    );
  });

  test('another organisation’s item is 404 and never listed', async () => {
    const other = await addOtherOrg(t);
    const marco = await t.agentFor(DEMO.director);
    expect((await marco.get(`/api/equipment/${other.equipmentId}`)).status).toBe(404);
    expect((await marco.post(`/api/equipment/${other.equipmentId}/calibrations`).send({ roundTripNs: 100, lengthM: 10 })).status).toBe(404);
    expect(((await marco.get('/api/equipment')).body as Item[]).some((i) => i.assetTag === 'HB-001')).toBe(false);
    // Asset tags are unique per organisation: Hilltop may use FC-001 too.
    const hilltop = await t.agentFor(OTHER_DIRECTOR, OTHER_PASSWORD);
    expect((await hilltop.post('/api/equipment').send({ assetTag: 'FC-001', kind: 'floor-cable' })).status).toBe(201);
  });

  test('an unknown item is 404', async () => {
    const sam = await t.agentFor(DEMO.technician);
    expect((await sam.get(`/api/equipment/${crypto.randomUUID()}`)).status).toBe(404);
  });
});
