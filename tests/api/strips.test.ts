import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { randomUUID } from 'node:crypto';
import { createTestApp, DEMO, DEMO_PASSWORD, type TestApp } from '../setup/test-app';
import { organisations, users } from '../../server/db/schema';
import { hashPassword, TEST_SCRYPT } from '../../server/auth/password';
import { newReading, stepOf, venueIds } from './testing-helpers';

let t: TestApp;
let hall: string;
let stripIds: Record<string, string>;
beforeAll(async () => {
  t = await createTestApp();
  ({ hall } = await venueIds(t));
  const marco = await t.agentFor(DEMO.director);
  const list = (await marco.get(`/api/venues/${hall}/strips`)).body as { id: string; label: string }[];
  stripIds = Object.fromEntries(list.map((s) => [s.label, s.id]));
});
afterAll(() => t.close());

describe('GET /api/strips/:id', () => {
  test('a conductive strip has its positions in order, each with its item and active steps, and the piste steps', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const res = await sam.get(`/api/strips/${stripIds['Strip 1']}`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      label: 'Strip 1',
      status: 'clear',
      zone: 'Row A',
      conductivePiste: true,
      venueId: hall,
      venueName: 'Riverside Sports Hall',
      venueStatus: 'testing',
    });
    expect(res.body.profile).toMatchObject({ name: 'Competition default', version: 1 });
    expect(res.body.profile.rules.length).toBeGreaterThan(5);
    expect(res.body.positions.map((p: { name: string }) => p.name)).toEqual([
      'Scoring apparatus',
      'Left floor cable',
      'Right floor cable',
      'Left reel',
      'Right reel',
      'Piste',
    ]);
    const cable = res.body.positions[1];
    expect(cable.equipment).toMatchObject({ kind: 'floor-cable', lengthM: 12, velocityFactor: 0.6, conductorMm2: 0.75 });
    expect(cable.equipment.assetTag).toMatch(/^FC-\d{3}$/);
    expect(cable.steps.map((s: { testKind: string; conductors: string }) => `${s.testKind} ${s.conductors}`)).toEqual([
      'continuity A',
      'continuity B',
      'continuity C',
      'insulation A-B',
      'insulation A-C',
      'insulation B-C',
      'loop A-B',
    ]);
    expect(cable.steps[0].instruction).toMatch(/Line A end to end/);
    expect(cable.steps[0].latest).toMatchObject({ verdict: expect.stringMatching(/pass|near-limit/), profileVersion: 1 });
    const piste = res.body.positions[5];
    expect(piste.steps.map((s: { testKind: string; conductors: string }) => [s.testKind, s.conductors])).toEqual([
      ['piste-end-to-end', 'piste'],
      ['piste-earth', 'piste-C'],
    ]);
    expect(res.body.openFaults).toEqual([]);
    expect(res.body.nextStripId).toBe(stripIds['Strip 2']);
    expect(res.body.previousStripId).toBeNull();
  });

  test('a strip with a failure lists its open fault; a not-started strip has no latest readings', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const six = (await sam.get(`/api/strips/${stripIds['Strip 6']}`)).body;
    expect(six.status).toBe('fault-open');
    expect(six.openFaults).toEqual([
      expect.objectContaining({ kind: 'short', conductors: 'A-B', status: 'located', positionName: 'Left floor cable' }),
    ]);
    const last = (await sam.get(`/api/strips/${stripIds['Strip 24']}`)).body;
    expect(last.status).toBe('not-started');
    expect(
      last.positions.flatMap((p: { steps: { latest: unknown }[] }) => p.steps).every((s: { latest: unknown }) => s.latest === null),
    ).toBe(true);
    expect(last.nextStripId).toBeNull();
  });

  test('the latest reading wins: measuring a step again shows the new value', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = (await sam.get(`/api/strips/${stripIds['Strip 24']}`)).body;
    const { step } = stepOf(strip, 'Left reel', 'continuity', 'A');
    await sam.post('/api/readings').send(newReading(step.id, '1.4'));
    const second = await sam.post('/api/readings').send(newReading(step.id, '1.35'));
    const after = (await sam.get(`/api/strips/${stripIds['Strip 24']}`)).body;
    expect(stepOf(after, 'Left reel', 'continuity', 'A').step.latest).toMatchObject({ id: second.body.id, valueOhm: 1.35 });
    expect(after.status).toBe('in-progress');
    expect(after.counts).toMatchObject({ done: 1, total: 4 * 7 });
  });

  test('who may read: Sam, the director, the organiser and the admin; Lee 403; another organisation 404; anonymous 401; a bad id 422', async () => {
    for (const who of [DEMO.technician, DEMO.director, DEMO.organiser, DEMO.admin]) {
      const agent = await t.agentFor(who);
      expect((await agent.get(`/api/strips/${stripIds['Strip 2']}`)).status).toBe(200);
    }
    const lee = await t.agentFor(DEMO.annexTechnician);
    expect((await lee.get(`/api/strips/${stripIds['Strip 2']}`)).status).toBe(403);
    const orgId = randomUUID();
    t.db.insert(organisations).values({ id: orgId, name: 'Another League' }).run();
    t.db
      .insert(users)
      .values({
        id: randomUUID(),
        orgId,
        email: 'td@another.example',
        name: 'Other Director',
        role: 'director',
        passwordHash: await hashPassword(DEMO_PASSWORD, TEST_SCRYPT),
      })
      .run();
    const other = await t.agentFor('td@another.example');
    expect((await other.get(`/api/strips/${stripIds['Strip 2']}`)).status).toBe(404);
    const strip = (await (await t.agentFor(DEMO.director)).get(`/api/strips/${stripIds['Strip 2']}`)).body;
    const stepId = strip.positions[1].steps[0].id;
    expect((await other.post('/api/readings').send(newReading(stepId, '1'))).status).toBe(404);
    expect((await t.request.get(`/api/strips/${stripIds['Strip 2']}`)).status).toBe(401);
    expect((await lee.get('/api/strips/strip-2')).status).toBe(422);
    expect((await lee.get(`/api/strips/${randomUUID()}`)).status).toBe(404);
  });
});
