import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createTestApp, DEMO, type TestApp } from '../setup/test-app';
import { venueIds } from './testing-helpers';
import { addOtherOrg, OTHER_DIRECTOR, OTHER_PASSWORD } from '../setup/other-org';
import * as s from '../../server/db/schema';

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

type Entry = {
  action: string;
  entityType: string;
  entityId: string;
  actorName: string | null;
  at: string;
  detail: Record<string, unknown>;
};

describe('GET /api/venues/:id/audit', () => {
  test('plan changes to the venue, its strips, positions and steps, and its readings are listed with who did them, newest first', async () => {
    const marco = await t.agentFor(DEMO.director);
    let plan = await marco.get(`/api/venues/${annexId}`);
    const strip = plan.body.strips[1];
    plan = await marco.patch(`/api/strips/${strip.id}`).set('If-Match', plan.headers.etag).send({ zone: 'Annex gallery' });
    plan = await marco.delete(`/api/steps/${strip.positions[1].steps[5].id}`).set('If-Match', plan.headers.etag);
    plan = await marco.put(`/api/positions/${strip.positions[1].id}/equipment`).set('If-Match', plan.headers.etag).send({ assetTag: null });
    plan = await marco.patch(`/api/venues/${annexId}`).set('If-Match', plan.headers.etag).send({ name: 'Riverside Annex North' });
    expect(plan.status).toBe(200);
    const lee = await t.agentFor(DEMO.annexTechnician);
    const reading = await lee.post('/api/readings').send({ id: crypto.randomUUID(), stepId: strip.positions[2].steps[0].id, value: '0.5' });
    expect(reading.status).toBe(201);

    const res = await marco.get(`/api/venues/${annexId}/audit`);
    expect(res.status).toBe(200);
    const entries = res.body as Entry[];
    const mine = entries.filter((e) => e.actorName === 'Marco Dal Bello').map((e) => e.action);
    expect(mine.slice(0, 4)).toEqual(['venue.updated', 'position.equipment-removed', 'step.dropped', 'strip.updated']);
    expect(entries.find((e) => e.action === 'venue.updated')!.detail).toMatchObject({
      changed: { name: { from: 'Riverside Annex', to: 'Riverside Annex North' } },
    });
    // Readings of the venue's steps are part of its trail.
    expect(entries.find((e) => e.entityId === reading.body.id)).toMatchObject({ action: 'reading.recorded', actorName: 'Lee Varga' });
    // Nothing from the other venue.
    const hallStrips = t.db
      .select()
      .from(s.strips)
      .all()
      .filter((x) => x.venueId === hallId)
      .map((x) => x.id);
    expect(entries.some((e) => hallStrips.includes(e.entityId) || e.entityId === hallId)).toBe(false);

    const nina = await t.agentFor(DEMO.organiser);
    expect((await nina.get(`/api/venues/${annexId}/audit`)).status).toBe(200);
  });

  test('technicians may not read the audit trail (403); another organisation’s venue is 404', async () => {
    const lee = await t.agentFor(DEMO.annexTechnician);
    expect((await lee.get(`/api/venues/${annexId}/audit`)).status).toBe(403);
    const marco = await t.agentFor(DEMO.director);
    expect((await marco.get(`/api/venues/${other.venueId}/audit`)).status).toBe(404);
  });
});

describe('GET /api/audit', () => {
  test('filters by entity, own organisation only', async () => {
    const ada = await t.agentFor(DEMO.admin);
    const created = await ada.post('/api/equipment').send({ assetTag: 'RL-900', kind: 'reel' });
    await ada.patch(`/api/equipment/${created.body.id}`).set('If-Match', created.headers.etag).send({ notes: 'New spring' });
    const res = await ada.get('/api/audit').query({ entityType: 'equipment', entityId: created.body.id });
    expect(res.status).toBe(200);
    expect((res.body as Entry[]).map((e) => e.action)).toEqual(['equipment.updated', 'equipment.created']);
    expect((res.body as Entry[])[0]).toMatchObject({
      actorName: 'Ada Quill',
      detail: { assetTag: 'RL-900', changed: { notes: { from: null, to: 'New spring' } } },
    });

    // Hilltop's director sees none of it.
    const hilltop = await t.agentFor(OTHER_DIRECTOR, OTHER_PASSWORD);
    expect((await hilltop.get('/api/audit').query({ entityId: created.body.id })).body).toEqual([]);
  });

  test('organisers and technicians get 403; a silly filter is 422', async () => {
    for (const who of [DEMO.organiser, DEMO.technician]) {
      const agent = await t.agentFor(who);
      expect((await agent.get('/api/audit')).status).toBe(403);
    }
    const marco = await t.agentFor(DEMO.director);
    const res = await marco.get('/api/audit').query({ entityType: 'x'.repeat(100) });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].path).toBe('entityType');
  });
});
