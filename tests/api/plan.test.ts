import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { and, eq, isNull } from 'drizzle-orm';
import { createTestApp, DEMO, DEMO_PASSWORD, type TestApp } from '../setup/test-app';
import { venueIds } from './testing-helpers';
import { addOtherOrg, OTHER_DIRECTOR, OTHER_PASSWORD } from '../setup/other-org';
import * as s from '../../server/db/schema';
import { stepsForKind } from '../../shared/domain/checklist';
import { DEFAULT_LIMIT_PROFILE } from '../../shared/domain/limits';

let t: TestApp;
let other: Awaited<ReturnType<typeof addOtherOrg>>;
let hallId: string;
let annexId: string;
let profileId: string;
let eventId: string;

type Step = { id: string; testKind: string; conductors: string; removedAt: string | null; addedByDirector: boolean };
type Position = {
  id: string;
  name: string;
  equipmentKind: string;
  sortOrder: number;
  tested: boolean;
  equipment: { assetTag: string } | null;
  steps: Step[];
};
type Strip = {
  id: string;
  label: string;
  zone: string | null;
  withdrawnReason: string | null;
  conductivePiste: boolean;
  positions: Position[];
};
type Plan = {
  venue: { id: string; name: string; version: number; status: string };
  strips: Strip[];
  technicians: { id: string; name: string }[];
  profile: { id: string; version: number };
};

beforeAll(async () => {
  t = await createTestApp();
  other = await addOtherOrg(t);
  const venues = t.db.select().from(s.venues).all();
  ({ hall: hallId, annex: annexId } = await venueIds(t));
  profileId = venues[0].profileId;
  eventId = venues[0].eventId;
});
afterAll(() => t.close());

const tag = (res: { headers: Record<string, string> }) => res.headers.etag;

/** A fresh, empty venue of the demo event, planned by Marco. */
async function newVenue(name: string) {
  const marco = await t.agentFor(DEMO.director);
  const res = await marco.post(`/api/events/${eventId}/venues`).send({ name, profileId });
  expect(res.status).toBe(201);
  return res.body as Plan;
}

describe('POST /api/events', () => {
  test('when a director creates an event, then they become its director', async () => {
    const marco = await t.agentFor(DEMO.director);
    const nina = t.db.select().from(s.users).where(eq(s.users.email, DEMO.organiser)).get()!;
    const res = await marco
      .post('/api/events')
      .send({ name: 'Spring Open 2027', startsOn: '2027-03-06', endsOn: '2027-03-07', organiserId: nina.id });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'Spring Open 2027', directorName: 'Marco Dal Bello', organiserName: 'Nina Okafor', venues: [] });
    expect((await marco.get('/api/events')).body.map((e: { name: string }) => e.name)).toContain('Spring Open 2027');
  });

  test('when the dates or the organiser are wrong, then 422 names the fields', async () => {
    const marco = await t.agentFor(DEMO.director);
    const sam = t.db.select().from(s.users).where(eq(s.users.email, DEMO.technician)).get()!;
    const dates = await marco.post('/api/events').send({ name: 'X', startsOn: '2027-03-07', endsOn: '2027-03-06' });
    expect(dates.status).toBe(422);
    expect(dates.body.errors[0].path).toBe('endsOn');
    const bad = await marco.post('/api/events').send({ name: 'X', startsOn: '2027-02-30', endsOn: 'soon' });
    expect(bad.status).toBe(422);
    expect(bad.body.errors.map((e: { path: string }) => e.path)).toEqual(expect.arrayContaining(['startsOn', 'endsOn']));
    const organiser = await marco
      .post('/api/events')
      .send({ name: 'X', startsOn: '2027-03-06', endsOn: '2027-03-06', organiserId: sam.id });
    expect(organiser.status).toBe(422);
    expect(organiser.body.errors[0].path).toBe('organiserId');
  });

  test('organisers, technicians and admins cannot create events (403)', async () => {
    for (const who of [DEMO.organiser, DEMO.technician, DEMO.admin]) {
      const agent = await t.agentFor(who);
      expect((await agent.post('/api/events').send({ name: 'X', startsOn: '2027-03-06', endsOn: '2027-03-06' })).status).toBe(403);
    }
  });
});

describe('GET /api/events and /api/events/:id', () => {
  test('a technician sees only the events and venues they are assigned to', async () => {
    const lee = await t.agentFor(DEMO.annexTechnician);
    const events = (await lee.get('/api/events')).body as { name: string; venues: { name: string }[] }[];
    expect(events.map((e) => e.name)).toEqual(['Autumn Cup 2026']);
    expect(events[0].venues.map((v) => v.name)).toEqual(['Riverside Annex']);
    const detail = await lee.get(`/api/events/${eventId}`);
    expect(detail.body.venues.map((v: { name: string }) => v.name)).toEqual(['Riverside Annex']);
  });

  test('another organisation’s event is 404', async () => {
    const marco = await t.agentFor(DEMO.director);
    expect((await marco.get(`/api/events/${other.eventId}`)).status).toBe(404);
    expect((await marco.post(`/api/events/${other.eventId}/venues`).send({ name: 'X', profileId })).status).toBe(404);
  });
});

describe('GET /api/venues/:id', () => {
  test('the plan has the venue, its strips with positions, items by tag and steps, with the version as ETag', async () => {
    const nina = await t.agentFor(DEMO.organiser);
    const res = await nina.get(`/api/venues/${hallId}`);
    expect(res.status).toBe(200);
    const plan = res.body as Plan;
    expect(tag(res)).toBe(`"${plan.venue.version}"`);
    expect(plan.strips).toHaveLength(24);
    const strip1 = plan.strips[0];
    expect(strip1.positions.map((p) => p.name)).toEqual([
      'Scoring apparatus',
      'Left floor cable',
      'Right floor cable',
      'Left reel',
      'Right reel',
      'Piste',
    ]);
    expect(strip1.positions[1].equipment?.assetTag).toMatch(/^FC-\d{3}$/);
    expect(strip1.positions[1].steps.map((st) => `${st.testKind} ${st.conductors}`)).toEqual([
      'continuity A',
      'continuity B',
      'continuity C',
      'insulation A-B',
      'insulation A-C',
      'insulation B-C',
      'loop A-B',
    ]);
    expect(plan.technicians.map((x) => x.name)).toEqual(['Sam Reyes']);
  });

  test('another organisation’s venue is 404, a technician of another venue 403, a bad id 422', async () => {
    const marco = await t.agentFor(DEMO.director);
    expect((await marco.get(`/api/venues/${other.venueId}`)).status).toBe(404);
    const lee = await t.agentFor(DEMO.annexTechnician);
    expect((await lee.get(`/api/venues/${hallId}`)).status).toBe(403);
    expect((await lee.get(`/api/venues/${annexId}`)).status).toBe(200);
    expect((await marco.get('/api/venues/12')).status).toBe(422);
  });
});

describe('plan edits with If-Match', () => {
  test('when the venue details are saved unchanged, then 200 and nothing is written', async () => {
    const plan = await newVenue('Unchanged hall');
    const marco = await t.agentFor(DEMO.director);
    const loaded = await marco.get(`/api/venues/${plan.venue.id}`);
    const res = await marco.patch(`/api/venues/${plan.venue.id}`).set('If-Match', tag(loaded)).send({ name: 'Unchanged hall' });
    expect(res.status).toBe(200);
    expect(res.body.venue.name).toBe('Unchanged hall');
    expect(
      t.db
        .select()
        .from(s.auditLog)
        .all()
        .filter((a) => a.action === 'venue.updated' && a.entityId === plan.venue.id),
    ).toHaveLength(0);
  });

  test('when two sessions edit the same plan, then the second write with the old ETag gets 412 and changes nothing', async () => {
    const first = await t.agentFor(DEMO.director);
    const second = await t.agentFor(DEMO.director);
    const loaded1 = await first.get(`/api/venues/${annexId}`);
    const loaded2 = await second.get(`/api/venues/${annexId}`);
    expect(tag(loaded1)).toBe(tag(loaded2));

    const ok = await first.patch(`/api/venues/${annexId}`).set('If-Match', tag(loaded1)).send({ name: 'Riverside Annex (east)' });
    expect(ok.status).toBe(200);
    expect(ok.body.venue.version).toBe(loaded1.body.venue.version + 1);
    expect(tag(ok)).toBe(`"${ok.body.venue.version}"`);

    const stale = await second.patch(`/api/venues/${annexId}`).set('If-Match', tag(loaded2)).send({ name: 'Annex West' });
    expect(stale.status).toBe(412);
    expect(stale.body.detail).toMatch(/Someone else changed the plan meanwhile/);
    expect(stale.body.detail).toContain(`version ${ok.body.venue.version}`);
    expect(stale.body).toMatchObject({ currentVersion: ok.body.venue.version, yourVersion: loaded2.body.venue.version });

    // Also for strip, position and step edits, which share the venue's version.
    const strip = loaded2.body.strips[0] as Strip;
    expect((await second.patch(`/api/strips/${strip.id}`).set('If-Match', tag(loaded2)).send({ zone: 'Gallery' })).status).toBe(412);
    expect(
      (await second.post(`/api/strips/${strip.id}/withdraw`).set('If-Match', tag(loaded2)).send({ reason: 'Leaking roof' })).status,
    ).toBe(412);
    expect((await second.delete(`/api/steps/${strip.positions[1].steps[0].id}`).set('If-Match', tag(loaded2))).status).toBe(412);

    const now = (await second.get(`/api/venues/${annexId}`)).body as Plan;
    expect(now.venue.name).toBe('Riverside Annex (east)');
    expect(now.venue.version).toBe(ok.body.venue.version);
    expect(now.strips[0].zone).toBe('Annex');
    expect(now.strips[0].withdrawnReason).toBeNull();
    expect(now.strips[0].positions[1].steps[0].removedAt).toBeNull();
  });

  test('when If-Match is missing, then 428 and nothing changes', async () => {
    const marco = await t.agentFor(DEMO.director);
    const res = await marco.patch(`/api/venues/${annexId}`).send({ name: 'No tag' });
    expect(res.status).toBe(428);
    expect((await marco.get(`/api/venues/${annexId}`)).body.venue.name).not.toBe('No tag');
  });

  test('technicians and organisers cannot edit a plan (403); another organisation’s director gets 404', async () => {
    const plan = await t.agentFor(DEMO.director).then((a) => a.get(`/api/venues/${hallId}`));
    for (const who of [DEMO.technician, DEMO.organiser]) {
      const agent = await t.agentFor(who);
      expect((await agent.patch(`/api/venues/${hallId}`).set('If-Match', tag(plan)).send({ name: 'Mine' })).status).toBe(403);
      expect((await agent.patch(`/api/strips/${plan.body.strips[0].id}`).set('If-Match', tag(plan)).send({ zone: 'Mine' })).status).toBe(
        403,
      );
    }
    const hilltop = await t.agentFor(OTHER_DIRECTOR, OTHER_PASSWORD);
    expect((await hilltop.patch(`/api/venues/${hallId}`).set('If-Match', tag(plan)).send({ name: 'Ours' })).status).toBe(404);
    expect((await hilltop.patch(`/api/strips/${plan.body.strips[0].id}`).set('If-Match', tag(plan)).send({ zone: 'Ours' })).status).toBe(
      404,
    );
    expect(
      (
        await hilltop
          .put(`/api/positions/${plan.body.strips[0].positions[1].id}/equipment`)
          .set('If-Match', tag(plan))
          .send({ assetTag: 'HB-001' })
      ).status,
    ).toBe(404);
  });
});

describe('POST /api/venues/:id/strips/bulk', () => {
  test('when strips are added by count, then each gets the template positions and the checklist steps', async () => {
    const marco = await t.agentFor(DEMO.director);
    const venue = await newVenue('Bulk Hall');
    const res = await marco
      .post(`/api/venues/${venue.venue.id}/strips/bulk`)
      .set('If-Match', `"${venue.venue.version}"`)
      .send({ count: 3, prefix: 'Piste ', startAt: 10, zone: 'Row D', conductivePiste: true });
    expect(res.status).toBe(201);
    const plan = res.body as Plan;
    expect(plan.strips.map((x) => x.label)).toEqual(['Piste 10', 'Piste 11', 'Piste 12']);
    expect(plan.strips.every((x) => x.zone === 'Row D' && x.positions.length === 6)).toBe(true);
    const piste = plan.strips[0].positions.find((p) => p.equipmentKind === 'piste')!;
    expect(piste.steps.map((st) => st.testKind)).toEqual(['piste-end-to-end', 'piste-earth']);
    expect(plan.strips[0].positions[0].steps).toEqual([]); // the apparatus has no cable steps

    const more = await marco
      .post(`/api/venues/${venue.venue.id}/strips/bulk`)
      .set('If-Match', tag(res))
      .send({ labels: ['Final'] });
    expect(more.status).toBe(201);
    expect(more.body.strips.at(-1).positions).toHaveLength(5); // not conductive: no piste position
    const audit = t.db.select().from(s.auditLog).where(eq(s.auditLog.action, 'strip.created')).all();
    expect(audit.filter((a) => JSON.parse(a.detailJson).venueId === venue.venue.id)).toHaveLength(4);
  });

  test('when a label is taken or the body is bad, then 409 / 422 and nothing is added', async () => {
    const marco = await t.agentFor(DEMO.director);
    const plan = await marco.get(`/api/venues/${hallId}`);
    const dup = await marco
      .post(`/api/venues/${hallId}/strips/bulk`)
      .set('If-Match', tag(plan))
      .send({ labels: ['Strip 25', 'Strip 3'] });
    expect(dup.status).toBe(409);
    expect(dup.body.detail).toContain('Strip 3');
    const neither = await marco.post(`/api/venues/${hallId}/strips/bulk`).set('If-Match', tag(plan)).send({ zone: 'Row Z' });
    expect(neither.status).toBe(422);
    expect(neither.body.errors[0].path).toBe('count');
    const tooMany = await marco
      .post(`/api/venues/${hallId}/strips/bulk`)
      .set('If-Match', tag(plan))
      .send({ count: 1000, template: [{ name: '', equipmentKind: 'lamp' }] });
    expect(tooMany.status).toBe(422);
    expect(tooMany.body.errors.map((e: { path: string }) => e.path)).toEqual(
      expect.arrayContaining(['count', 'template.0.name', 'template.0.equipmentKind']),
    );
    const after = await marco.get(`/api/venues/${hallId}`);
    expect(after.body.strips).toHaveLength(24);
    expect(tag(after)).toBe(tag(plan));
  });
});

describe('strips: edit, withdraw, reinstate', () => {
  test('a withdrawn strip shows as withdrawn with its reason, and reinstating clears it; both are audited', async () => {
    const marco = await t.agentFor(DEMO.director);
    let plan = await marco.get(`/api/venues/${hallId}`);
    const strip = (plan.body as Plan).strips.find((x) => x.label === 'Strip 24')!;
    expect((await marco.post(`/api/strips/${strip.id}/withdraw`).set('If-Match', tag(plan)).send({ reason: '' })).status).toBe(422);
    plan = await marco.post(`/api/strips/${strip.id}/withdraw`).set('If-Match', tag(plan)).send({ reason: 'Floor damaged by a forklift' });
    expect(plan.status).toBe(200);
    const board = (await marco.get(`/api/venues/${hallId}/strips`)).body as { label: string; status: string; withdrawnReason: string }[];
    expect(board.find((x) => x.label === 'Strip 24')).toMatchObject({
      status: 'withdrawn',
      withdrawnReason: 'Floor damaged by a forklift',
    });

    plan = await marco.post(`/api/strips/${strip.id}/reinstate`).set('If-Match', tag(plan));
    expect(plan.status).toBe(200);
    expect((plan.body as Plan).strips.find((x) => x.id === strip.id)!.withdrawnReason).toBeNull();
    const actions = t.db
      .select()
      .from(s.auditLog)
      .where(eq(s.auditLog.entityId, strip.id))
      .all()
      .map((a) => a.action);
    expect(actions).toEqual(['strip.withdrawn', 'strip.reinstated']);
  });

  test('renaming to a taken label is 409; making a strip conductive adds its piste position', async () => {
    const marco = await t.agentFor(DEMO.director);
    let plan = await marco.get(`/api/venues/${hallId}`);
    const strip = (plan.body as Plan).strips.find((x) => x.label === 'Strip 20')!;
    expect((await marco.patch(`/api/strips/${strip.id}`).set('If-Match', tag(plan)).send({ label: 'Strip 21' })).status).toBe(409);
    plan = await marco
      .patch(`/api/strips/${strip.id}`)
      .set('If-Match', tag(plan))
      .send({ label: 'Strip 20A', conductivePiste: true, zone: 'Row C' });
    expect(plan.status).toBe(200);
    const changed = (plan.body as Plan).strips.find((x) => x.id === strip.id)!;
    expect(changed).toMatchObject({ label: 'Strip 20A', conductivePiste: true, zone: 'Row C' });
    expect(changed.positions.at(-1)).toMatchObject({ equipmentKind: 'piste', name: 'Piste' });
    expect((await marco.patch(`/api/strips/${strip.id}`).set('If-Match', tag(plan)).send({})).status).toBe(422);
  });
});

describe('PUT /api/positions/:id/equipment', () => {
  test('when an item is attached by tag, then the position shows it and the item’s history keeps both placements', async () => {
    const marco = await t.agentFor(DEMO.director);
    const created = await marco.post('/api/equipment').send({ assetTag: 'FC-500', kind: 'floor-cable', lengthM: 12 });
    let plan = await marco.get(`/api/venues/${hallId}`);
    const position = (plan.body as Plan).strips.find((x) => x.label === 'Strip 23')!.positions[1];
    const oldTag = position.equipment!.assetTag;
    plan = await marco.put(`/api/positions/${position.id}/equipment`).set('If-Match', tag(plan)).send({ assetTag: 'fc-500' });
    expect(plan.status).toBe(200);
    expect((plan.body as Plan).strips.find((x) => x.label === 'Strip 23')!.positions[1].equipment?.assetTag).toBe('FC-500');
    const history = t.db.select().from(s.positionAssignments).where(eq(s.positionAssignments.positionId, position.id)).all();
    expect(history).toHaveLength(2);
    expect(history.find((h) => h.equipmentId === created.body.id)?.removedAt).toBeNull();
    expect(history.find((h) => h.equipmentId !== created.body.id)?.removedAt).not.toBeNull();
    const oldItem = t.db.select().from(s.equipment).where(eq(s.equipment.assetTag, oldTag)).get()!;
    const item = (await marco.get(`/api/equipment/${oldItem.id}`)).body;
    expect(item.placements[0]).toMatchObject({ stripLabel: 'Strip 23', removedAt: expect.any(String) });

    plan = await marco.put(`/api/positions/${position.id}/equipment`).set('If-Match', tag(plan)).send({ assetTag: null });
    expect(plan.status).toBe(200);
    expect((plan.body as Plan).strips.find((x) => x.label === 'Strip 23')!.positions[1].equipment).toBeNull();
  });

  test('when the kind does not match, the item is retired or unknown, then 422 naming assetTag; when it is on another strip, 409', async () => {
    const marco = await t.agentFor(DEMO.director);
    const plan = await marco.get(`/api/venues/${hallId}`);
    const strips = (plan.body as Plan).strips;
    const floor = strips.find((x) => x.label === 'Strip 22')!.positions[1];
    const kind = await marco.put(`/api/positions/${floor.id}/equipment`).set('If-Match', tag(plan)).send({ assetTag: 'RL-001' });
    expect(kind.status).toBe(422);
    expect(kind.body.errors[0].path).toBe('assetTag');
    expect(kind.body.detail).toMatch(/RL-001 is a reel, but Left floor cable takes a floor cable/);

    await marco.post('/api/equipment').send({ assetTag: 'FC-501', kind: 'floor-cable', status: 'retired' });
    const retired = await marco.put(`/api/positions/${floor.id}/equipment`).set('If-Match', tag(plan)).send({ assetTag: 'FC-501' });
    expect(retired.status).toBe(422);
    expect(retired.body.detail).toMatch(/retired/);
    expect((await marco.put(`/api/positions/${floor.id}/equipment`).set('If-Match', tag(plan)).send({ assetTag: 'ZZ-404' })).status).toBe(
      422,
    );
    // Another organisation's tag is simply not in our register.
    expect((await marco.put(`/api/positions/${floor.id}/equipment`).set('If-Match', tag(plan)).send({ assetTag: 'HB-001' })).status).toBe(
      422,
    );

    const onStrip1 = strips[0].positions[1].equipment!.assetTag;
    const busy = await marco.put(`/api/positions/${floor.id}/equipment`).set('If-Match', tag(plan)).send({ assetTag: onStrip1 });
    expect(busy.status).toBe(409);
    expect(busy.body.detail).toContain('Strip 1');
    expect(tag(await marco.get(`/api/venues/${hallId}`))).toBe(tag(plan));
  });
});

describe('GET /api/planning/people', () => {
  test('a director gets the active technicians and organisers to choose from; others 403', async () => {
    const marco = await t.agentFor(DEMO.director);
    const res = await marco.get('/api/planning/people');
    expect(res.status).toBe(200);
    expect(res.body.technicians.map((p: { name: string }) => p.name)).toEqual(['Lee Varga', 'Sam Reyes']);
    expect(res.body.organisers.map((p: { name: string }) => p.name)).toEqual(['Nina Okafor']);
    expect((await (await t.agentFor(DEMO.technician)).get('/api/planning/people')).status).toBe(403);
  });
});

describe('PUT /api/venues/:id/technicians', () => {
  test('only technicians of our organisation can be assigned; an assigned technician may then read the venue', async () => {
    const marco = await t.agentFor(DEMO.director);
    const lee = t.db.select().from(s.users).where(eq(s.users.email, DEMO.annexTechnician)).get()!;
    const sam = t.db.select().from(s.users).where(eq(s.users.email, DEMO.technician)).get()!;
    const nina = t.db.select().from(s.users).where(eq(s.users.email, DEMO.organiser)).get()!;
    let plan = await marco.get(`/api/venues/${hallId}`);
    const bad = await marco
      .put(`/api/venues/${hallId}/technicians`)
      .set('If-Match', tag(plan))
      .send({ userIds: [sam.id, nina.id, other.directorId] });
    expect(bad.status).toBe(422);
    expect(bad.body.errors.map((e: { path: string }) => e.path)).toEqual(['userIds.1', 'userIds.2']);
    expect(
      (
        await marco
          .put(`/api/venues/${hallId}/technicians`)
          .set('If-Match', tag(plan))
          .send({ userIds: ['x'] })
      ).status,
    ).toBe(422);

    plan = await marco
      .put(`/api/venues/${hallId}/technicians`)
      .set('If-Match', tag(plan))
      .send({ userIds: [sam.id, lee.id] });
    expect(plan.status).toBe(200);
    expect((plan.body as Plan).technicians.map((x) => x.name)).toEqual(['Lee Varga', 'Sam Reyes']);
    const leeAgent = await t.agentFor(DEMO.annexTechnician);
    expect((await leeAgent.get(`/api/venues/${hallId}`)).status).toBe(200);
    // Put it back as the demo had it.
    await marco
      .put(`/api/venues/${hallId}/technicians`)
      .set('If-Match', tag(plan))
      .send({ userIds: [sam.id] });
    expect((await leeAgent.get(`/api/venues/${hallId}`)).status).toBe(403);
  });
});

describe('PATCH /api/venues/:id with technicianIds (the venue form saves once)', () => {
  test('name and technicians change in one edit: one version step, both audited; a wrong person refuses the whole edit', async () => {
    const venue = await newVenue('One-save hall');
    const marco = await t.agentFor(DEMO.director);
    const sam = t.db.select().from(s.users).where(eq(s.users.email, DEMO.technician)).get()!;
    const nina = t.db.select().from(s.users).where(eq(s.users.email, DEMO.organiser)).get()!;
    let plan = await marco.get(`/api/venues/${venue.venue.id}`);
    const bad = await marco
      .patch(`/api/venues/${venue.venue.id}`)
      .set('If-Match', tag(plan))
      .send({ name: 'Renamed hall', technicianIds: [sam.id, nina.id] });
    expect(bad.status).toBe(422);
    expect(bad.body.errors).toEqual([{ path: 'technicianIds.1', message: 'Not an active technician of your organisation.' }]);
    const unchanged = (await marco.get(`/api/venues/${venue.venue.id}`)).body as Plan;
    expect(unchanged.venue).toMatchObject({ name: 'One-save hall', version: venue.venue.version });
    expect(unchanged.technicians).toEqual([]);

    plan = await marco
      .patch(`/api/venues/${venue.venue.id}`)
      .set('If-Match', tag(plan))
      .send({ name: 'Renamed hall', technicianIds: [sam.id] });
    expect(plan.status).toBe(200);
    expect(plan.body).toMatchObject({
      venue: { name: 'Renamed hall', version: venue.venue.version + 1 },
      technicians: [{ name: 'Sam Reyes' }],
    });
    const actions = t.db
      .select()
      .from(s.auditLog)
      .all()
      .filter((a) => a.entityId === venue.venue.id)
      .map((a) => a.action);
    expect(actions).toEqual(expect.arrayContaining(['venue.updated', 'venue.technicians-set']));
    // The same technicians again write nothing to the trail.
    await marco
      .patch(`/api/venues/${venue.venue.id}`)
      .set('If-Match', tag(plan))
      .send({ technicianIds: [sam.id] })
      .expect(200);
    expect(
      t.db
        .select()
        .from(s.auditLog)
        .all()
        .filter((a) => a.entityId === venue.venue.id && a.action === 'venue.technicians-set'),
    ).toHaveLength(1);
  });
});

describe('checklist steps', () => {
  test('a director adds a step and drops one; the dropped step is kept with its readings but no longer asked for', async () => {
    const marco = await t.agentFor(DEMO.director);
    let plan = await marco.get(`/api/venues/${hallId}`);
    const position = (plan.body as Plan).strips[0].positions[1];
    plan = await marco
      .post(`/api/positions/${position.id}/steps`)
      .set('If-Match', tag(plan))
      .send({ testKind: 'loop', conductors: 'A-C', required: false });
    expect(plan.status).toBe(201);
    const added = (plan.body as Plan).strips[0].positions[1].steps.at(-1)!;
    expect(added).toMatchObject({ testKind: 'loop', conductors: 'A-C', addedByDirector: true });

    const dropped = position.steps[0];
    const readingsBefore = t.db.select().from(s.readings).where(eq(s.readings.stepId, dropped.id)).all();
    expect(readingsBefore.length).toBeGreaterThan(0);
    plan = await marco.delete(`/api/steps/${dropped.id}`).set('If-Match', tag(plan));
    expect(plan.status).toBe(200);
    expect((plan.body as Plan).strips[0].positions[1].steps.find((x) => x.id === dropped.id)!.removedAt).not.toBeNull();
    expect(t.db.select().from(s.readings).where(eq(s.readings.stepId, dropped.id)).all()).toHaveLength(readingsBefore.length);
    expect((await marco.delete(`/api/steps/${dropped.id}`).set('If-Match', tag(plan))).status).toBe(409);
    const strip = (await marco.get(`/api/strips/${(plan.body as Plan).strips[0].id}`)).body as { positions: { steps: { id: string }[] }[] };
    expect(strip.positions.flatMap((p) => p.steps).some((x) => x.id === dropped.id)).toBe(false);
  });

  test('a step the profile cannot judge, bad conductors, or a duplicate are refused', async () => {
    const marco = await t.agentFor(DEMO.director);
    const plan = await marco.get(`/api/venues/${hallId}`);
    const position = (plan.body as Plan).strips[1].positions[1];
    const noRule = await marco
      .post(`/api/positions/${position.id}/steps`)
      .set('If-Match', tag(plan))
      .send({ testKind: 'piste-earth', conductors: 'piste-C' });
    expect(noRule.status).toBe(422);
    expect(noRule.body.errors[0].path).toBe('testKind');
    const conductors = await marco
      .post(`/api/positions/${position.id}/steps`)
      .set('If-Match', tag(plan))
      .send({ testKind: 'insulation', conductors: 'A' });
    expect(conductors.status).toBe(422);
    expect(conductors.body.errors[0].path).toBe('conductors');
    expect(
      (await marco.post(`/api/positions/${position.id}/steps`).set('If-Match', tag(plan)).send({ testKind: 'continuity', conductors: 'A' }))
        .status,
    ).toBe(409);
  });
});

describe('cloning a venue', () => {
  test('a clone copies strips, positions, items and steps but no readings; technicians only when asked', async () => {
    const marco = await t.agentFor(DEMO.director);
    const res = await marco
      .post(`/api/events/${eventId}/venues`)
      .send({ name: 'Annex again', profileId, cloneFromVenueId: annexId, copyTechnicians: true });
    expect(res.status).toBe(201);
    const clone = res.body as Plan;
    const source = (await marco.get(`/api/venues/${annexId}`)).body as Plan;
    expect(clone.strips.map((x) => x.label)).toEqual(source.strips.map((x) => x.label));
    expect(clone.strips[0].positions.map((p) => [p.name, p.equipment?.assetTag])).toEqual(
      source.strips[0].positions.map((p) => [p.name, p.equipment?.assetTag]),
    );
    const activeSteps = (p: Plan) => p.strips.flatMap((x) => x.positions.flatMap((q) => q.steps.filter((st) => !st.removedAt))).length;
    expect(activeSteps(clone)).toBe(activeSteps(source));
    expect(clone.technicians.map((x) => x.name)).toEqual(['Lee Varga']);
    const readings = (await marco.get(`/api/venues/${clone.venue.id}/readings`)).body;
    expect(readings).toEqual([]);
    const strips = (await marco.get(`/api/venues/${clone.venue.id}/strips`)).body as { status: string }[];
    expect(strips.every((x) => x.status === 'not-started')).toBe(true);

    const noTechs = await marco.post(`/api/events/${eventId}/venues`).send({ name: 'Annex third', profileId, cloneFromVenueId: annexId });
    expect(noTechs.body.technicians).toEqual([]);
  });

  test("a venue's time zone: Europe/London unless given; a clone takes its source's; an unknown name is 422 and nothing is made", async () => {
    const marco = await t.agentFor(DEMO.director);
    const plain = await marco.post(`/api/events/${eventId}/venues`).send({ name: 'Zone default', profileId });
    expect(plain.status).toBe(201);
    expect(plain.body.venue.timeZone).toBe('Europe/London');
    const given = await marco.post(`/api/events/${eventId}/venues`).send({ name: 'Zone given', profileId, timeZone: 'america/new_york' });
    expect(given.body.venue.timeZone).toBe('America/New_York');
    const clone = await marco
      .post(`/api/events/${eventId}/venues`)
      .send({ name: 'Zone clone', profileId, cloneFromVenueId: given.body.venue.id });
    expect(clone.body.venue.timeZone).toBe('America/New_York');
    const venuesBefore = t.sqlite.prepare('select count(*) as n from venues').get() as { n: number };
    const bad = await marco.post(`/api/events/${eventId}/venues`).send({ name: 'Zone bad', profileId, timeZone: 'Atlantis/Central' });
    expect(bad.status).toBe(422);
    expect(bad.body.errors[0].path).toBe('timeZone');
    expect(t.sqlite.prepare('select count(*) as n from venues').get()).toEqual(venuesBefore);
  });

  test('cloning another organisation’s venue is 404; using its profile is 422', async () => {
    const marco = await t.agentFor(DEMO.director);
    expect((await marco.post(`/api/events/${eventId}/venues`).send({ name: 'X', profileId, cloneFromVenueId: other.venueId })).status).toBe(
      404,
    );
    const res = await marco.post(`/api/events/${eventId}/venues`).send({ name: 'X', profileId: other.profileId });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].path).toBe('profileId');
  });
});

describe('a plan change on a signed-off venue', () => {
  test('re-opens it in the same change: the sign-off is superseded and the venue is back to testing', async () => {
    const marco = await t.agentFor(DEMO.director);
    const venue = await newVenue('Signed Hall');
    const director = t.db.select().from(s.users).where(eq(s.users.email, DEMO.director)).get()!;
    t.db.update(s.venues).set({ status: 'signed-off' }).where(eq(s.venues.id, venue.venue.id)).run();
    const signOffId = crypto.randomUUID();
    t.db
      .insert(s.signOffs)
      .values({ id: signOffId, venueId: venue.venue.id, signedBy: director.id, statement: 'All clear', readingsDigest: 'x' })
      .run();
    const plan = await marco.get(`/api/venues/${venue.venue.id}`);
    const res = await marco.post(`/api/venues/${venue.venue.id}/strips/bulk`).set('If-Match', tag(plan)).send({ count: 1 });
    expect(res.status).toBe(201);
    expect(res.body.venue.status).toBe('testing');
    expect(t.db.select().from(s.signOffs).where(eq(s.signOffs.id, signOffId)).get()!.status).toBe('superseded');
    const reopened = t.db
      .select()
      .from(s.auditLog)
      .where(and(eq(s.auditLog.entityId, venue.venue.id), eq(s.auditLog.action, 'venue.reopened')))
      .all();
    expect(reopened).toHaveLength(1);
  });
});

describe('changing the venue’s limit profile', () => {
  test('is a plan edit, and loop steps follow the new profile', async () => {
    const marco = await t.agentFor(DEMO.director);
    const venue = await newVenue('Profile Hall');
    let plan = await marco.post(`/api/venues/${venue.venue.id}/strips/bulk`).set('If-Match', `"${venue.venue.version}"`).send({ count: 1 });
    const floorSteps = (p: Plan) => p.strips[0].positions[1].steps.filter((x) => !x.removedAt).map((x) => x.testKind);
    expect(floorSteps(plan.body)).toContain('loop');
    const copy = await marco.post(`/api/profiles/${profileId}/copy`).send({ name: 'No loops' });
    const noLoops = await marco
      .put(`/api/profiles/${copy.body.id}`)
      .set('If-Match', '"1"')
      .send({ rules: copy.body.rules, loopRequired: [] });
    expect(noLoops.status).toBe(201);
    plan = await marco.patch(`/api/venues/${venue.venue.id}`).set('If-Match', tag(plan)).send({ profileId: noLoops.body.id });
    expect(plan.status).toBe(200);
    expect(plan.body.profile).toMatchObject({ id: noLoops.body.id, version: 2 });
    expect(floorSteps(plan.body)).not.toContain('loop');
    const remaining = t.db
      .select()
      .from(s.steps)
      .where(and(eq(s.steps.testKind, 'loop'), isNull(s.steps.removedAt)))
      .all();
    expect(remaining.length).toBeGreaterThan(0); // other venues keep theirs
  });
});

describe('POST /api/strips/:id/positions', () => {
  /** A fresh venue with two plain strips (five template positions each), and its ETag. */
  async function twoStrips(name: string) {
    const marco = await t.agentFor(DEMO.director);
    const venue = await newVenue(name);
    const res = await marco
      .post(`/api/venues/${venue.venue.id}/strips/bulk`)
      .set('If-Match', `"${venue.venue.version}"`)
      .send({ count: 2 });
    expect(res.status).toBe(201);
    return { marco, res, plan: res.body as Plan };
  }
  const stripOf = (plan: Plan, id: string) => plan.strips.find((x) => x.id === id)!;

  test('when a director adds a spare reel, then it goes last with the reel’s steps, the version moves on and it is audited', async () => {
    const { marco, res, plan } = await twoStrips('Position Hall');
    const strip = plan.strips[0];
    const added = await marco
      .post(`/api/strips/${strip.id}/positions`)
      .set('If-Match', tag(res))
      .send({ name: '  Spare reel ', equipmentKind: 'reel' });
    expect(added.status).toBe(201);
    const after = added.body as Plan;
    expect(after.venue.version).toBe(plan.venue.version + 1);
    expect(tag(added)).toBe(`"${after.venue.version}"`);
    const positions = stripOf(after, strip.id).positions;
    expect(positions).toHaveLength(strip.positions.length + 1);
    const spare = positions.at(-1)!;
    expect(spare).toMatchObject({ name: 'Spare reel', equipmentKind: 'reel', equipment: null, tested: false });
    expect(spare.sortOrder).toBeGreaterThan(Math.max(...strip.positions.map((p) => p.sortOrder)));
    const expected = stepsForKind('reel', DEFAULT_LIMIT_PROFILE).map((x) => `${x.testKind} ${x.conductors}`);
    expect(expected.length).toBeGreaterThan(0);
    expect(spare.steps.map((x) => `${x.testKind} ${x.conductors}`)).toEqual(expected);
    expect(spare.steps.every((x) => x.removedAt === null)).toBe(true);
    // The other strip is untouched.
    expect(stripOf(after, plan.strips[1].id).positions).toHaveLength(plan.strips[1].positions.length);
    // The technician's strip view asks for the new steps too.
    const view = (await marco.get(`/api/strips/${strip.id}`)).body as { positions: { name: string; steps: unknown[] }[] };
    expect(view.positions.find((p) => p.name === 'Spare reel')?.steps).toHaveLength(expected.length);
    const audit = t.db
      .select()
      .from(s.auditLog)
      .where(and(eq(s.auditLog.action, 'position.added'), eq(s.auditLog.entityId, spare.id)))
      .all();
    expect(audit).toHaveLength(1);
    expect(JSON.parse(audit[0].detailJson)).toMatchObject({
      venueId: plan.venue.id,
      position: 'Spare reel',
      equipmentKind: 'reel',
      assetTag: null,
    });
  });

  test('when the name is already on the strip (other case, spaces), then 409 naming the field, and nothing is added', async () => {
    const { marco, res, plan } = await twoStrips('Duplicate Position Hall');
    const strip = plan.strips[0];
    const dup = await marco
      .post(`/api/strips/${strip.id}/positions`)
      .set('If-Match', tag(res))
      .send({ name: ' left REEL ', equipmentKind: 'reel' });
    expect(dup.status).toBe(409);
    expect(dup.body.code).toBe('duplicate-position-name');
    expect(dup.body.errors[0].path).toBe('name');
    expect(dup.body.detail).toContain('Left reel');
    // The same name on another strip is fine.
    const other = await marco
      .post(`/api/strips/${plan.strips[1].id}/positions`)
      .set('If-Match', tag(res))
      .send({ name: 'Spare reel', equipmentKind: 'reel' });
    expect(other.status).toBe(201);
    const now = (await marco.get(`/api/venues/${plan.venue.id}`)).body as Plan;
    expect(stripOf(now, strip.id).positions).toHaveLength(strip.positions.length);
  });

  test('when the kind is not one we know or the name is empty, then 422 names the fields', async () => {
    const { marco, res, plan } = await twoStrips('Bad Kind Hall');
    const bad = await marco
      .post(`/api/strips/${plan.strips[0].id}/positions`)
      .set('If-Match', tag(res))
      .send({ name: '', equipmentKind: 'lamp' });
    expect(bad.status).toBe(422);
    expect(bad.body.errors.map((e: { path: string }) => e.path)).toEqual(expect.arrayContaining(['name', 'equipmentKind']));
    expect(tag(await marco.get(`/api/venues/${plan.venue.id}`))).toBe(tag(res));
  });

  test('without If-Match it is 428, with an old one 412, and nothing is added', async () => {
    const { marco, res, plan } = await twoStrips('Tag Hall');
    const strip = plan.strips[0];
    const missing = await marco.post(`/api/strips/${strip.id}/positions`).send({ name: 'Spare reel', equipmentKind: 'reel' });
    expect(missing.status).toBe(428);
    const moved = await marco.patch(`/api/strips/${strip.id}`).set('If-Match', tag(res)).send({ zone: 'Gallery' });
    expect(moved.status).toBe(200);
    const stale = await marco
      .post(`/api/strips/${strip.id}/positions`)
      .set('If-Match', tag(res))
      .send({ name: 'Spare reel', equipmentKind: 'reel' });
    expect(stale.status).toBe(412);
    expect(stale.body).toMatchObject({ currentVersion: moved.body.venue.version, yourVersion: plan.venue.version });
    const now = (await marco.get(`/api/venues/${plan.venue.id}`)).body as Plan;
    expect(stripOf(now, strip.id).positions.map((p) => p.name)).not.toContain('Spare reel');
  });

  test('a technician or an organiser gets 403, another organisation’s director 404, an unknown strip 404', async () => {
    const marco = await t.agentFor(DEMO.director);
    const plan = await marco.get(`/api/venues/${hallId}`);
    const strip = (plan.body as Plan).strips[0];
    const body = { name: 'Spare reel', equipmentKind: 'reel' };
    for (const who of [DEMO.technician, DEMO.organiser]) {
      const agent = await t.agentFor(who);
      expect((await agent.post(`/api/strips/${strip.id}/positions`).set('If-Match', tag(plan)).send(body)).status).toBe(403);
    }
    const hilltop = await t.agentFor(OTHER_DIRECTOR, OTHER_PASSWORD);
    expect((await hilltop.post(`/api/strips/${strip.id}/positions`).set('If-Match', tag(plan)).send(body)).status).toBe(404);
    expect((await marco.post(`/api/strips/${other.stripId}/positions`).set('If-Match', '"1"').send(body)).status).toBe(404);
    expect((await marco.post(`/api/strips/${crypto.randomUUID()}/positions`).set('If-Match', tag(plan)).send(body)).status).toBe(404);
    const now = await marco.get(`/api/venues/${hallId}`);
    expect(tag(now)).toBe(tag(plan));
    expect((now.body as Plan).strips[0].positions.map((p) => p.name)).not.toContain('Spare reel');
  });

  test('with an asset tag the item is attached as by PUT …/equipment; a wrong kind is 422, an item on another strip 409, and nothing is added', async () => {
    const { marco, res, plan } = await twoStrips('Tagged Position Hall');
    const strip = plan.strips[0];
    const created = await marco.post('/api/equipment').send({ assetTag: 'RL-900', kind: 'reel', lengthM: 20 });
    expect(created.status).toBe(201);
    const kind = await marco
      .post(`/api/strips/${strip.id}/positions`)
      .set('If-Match', tag(res))
      .send({ name: 'Spare reel', equipmentKind: 'reel', assetTag: 'FC-001' });
    expect(kind.status).toBe(422);
    expect(kind.body.errors[0].path).toBe('assetTag');
    expect(kind.body.detail).toMatch(/FC-001 is a floor cable, but Spare reel takes a reel/);
    // RL-001 sits on Strip 1 of the Sports Hall; the item in use is judged per venue, so use ours.
    await marco
      .put(`/api/positions/${strip.positions.find((p) => p.name === 'Left reel')!.id}/equipment`)
      .set('If-Match', tag(res))
      .send({ assetTag: 'RL-900' })
      .expect(200);
    const afterAttach = await marco.get(`/api/venues/${plan.venue.id}`);
    const busy = await marco
      .post(`/api/strips/${plan.strips[1].id}/positions`)
      .set('If-Match', tag(afterAttach))
      .send({ name: 'Spare reel', equipmentKind: 'reel', assetTag: 'rl-900' });
    expect(busy.status).toBe(409);
    expect(busy.body.code).toBe('item-in-use');
    expect(busy.body.errors[0].path).toBe('assetTag');
    expect(tag(await marco.get(`/api/venues/${plan.venue.id}`))).toBe(tag(afterAttach));
    // Take it off the left reel, then add the spare with it.
    const off = await marco
      .put(`/api/positions/${strip.positions.find((p) => p.name === 'Left reel')!.id}/equipment`)
      .set('If-Match', tag(afterAttach))
      .send({ assetTag: null });
    const added = await marco
      .post(`/api/strips/${plan.strips[1].id}/positions`)
      .set('If-Match', tag(off))
      .send({ name: 'Spare reel', equipmentKind: 'reel', assetTag: 'rl-900' });
    expect(added.status).toBe(201);
    const spare = stripOf(added.body as Plan, plan.strips[1].id).positions.find((p) => p.name === 'Spare reel')!;
    expect(spare.equipment?.assetTag).toBe('RL-900');
    const placement = t.db.select().from(s.positionAssignments).where(eq(s.positionAssignments.positionId, spare.id)).all();
    expect(placement).toEqual([expect.objectContaining({ equipmentId: created.body.id, removedAt: null })]);
    const item = (await marco.get(`/api/equipment/${created.body.id}`)).body;
    expect(item.placements[0]).toMatchObject({ stripLabel: plan.strips[1].label, removedAt: null });
  });

  test('on a withdrawn strip it is 409', async () => {
    const { marco, res, plan } = await twoStrips('Withdrawn Position Hall');
    const strip = plan.strips[0];
    const withdrawn = await marco
      .post(`/api/strips/${strip.id}/withdraw`)
      .set('If-Match', tag(res))
      .send({ reason: 'Not used this event' });
    const refused = await marco
      .post(`/api/strips/${strip.id}/positions`)
      .set('If-Match', tag(withdrawn))
      .send({ name: 'Spare reel', equipmentKind: 'reel' });
    expect(refused.status).toBe(409);
    expect(refused.body.code).toBe('strip-withdrawn');
    expect(tag(await marco.get(`/api/venues/${plan.venue.id}`))).toBe(tag(withdrawn));
  });
});

describe('DELETE /api/positions/:id', () => {
  test('when a position was never tested, then it goes with its steps and its item’s placement, and it is audited', async () => {
    const marco = await t.agentFor(DEMO.director);
    const venue = await newVenue('Removal Hall');
    const res = await marco
      .post(`/api/venues/${venue.venue.id}/strips/bulk`)
      .set('If-Match', `"${venue.venue.version}"`)
      .send({ count: 1 });
    await marco.post('/api/equipment').send({ assetTag: 'RL-901', kind: 'reel', lengthM: 20 }).expect(201);
    const added = await marco
      .post(`/api/strips/${res.body.strips[0].id}/positions`)
      .set('If-Match', tag(res))
      .send({ name: 'Spare reel', equipmentKind: 'reel', assetTag: 'RL-901' });
    expect(added.status).toBe(201);
    const spare = (added.body as Plan).strips[0].positions.find((p) => p.name === 'Spare reel')!;
    expect(t.db.select().from(s.steps).where(eq(s.steps.positionId, spare.id)).all().length).toBeGreaterThan(0);

    const removed = await marco.delete(`/api/positions/${spare.id}`).set('If-Match', tag(added));
    expect(removed.status).toBe(200);
    expect(removed.body.venue.version).toBe(added.body.venue.version + 1);
    expect(tag(removed)).toBe(`"${removed.body.venue.version}"`);
    expect((removed.body as Plan).strips[0].positions.map((p) => p.name)).not.toContain('Spare reel');
    expect(t.db.select().from(s.steps).where(eq(s.steps.positionId, spare.id)).all()).toEqual([]);
    expect(t.db.select().from(s.positions).where(eq(s.positions.id, spare.id)).all()).toEqual([]);
    expect(t.db.select().from(s.positionAssignments).where(eq(s.positionAssignments.positionId, spare.id)).all()).toEqual([]);
    const audit = t.db
      .select()
      .from(s.auditLog)
      .where(and(eq(s.auditLog.action, 'position.removed'), eq(s.auditLog.entityId, spare.id)))
      .all();
    expect(audit).toHaveLength(1);
    expect(JSON.parse(audit[0].detailJson)).toMatchObject({
      position: 'Spare reel',
      assetTag: 'RL-901',
      placements: [expect.objectContaining({ assetTag: 'RL-901' })],
    });
    // The item is free again, and the position is gone for good.
    const again = await marco
      .post(`/api/strips/${res.body.strips[0].id}/positions`)
      .set('If-Match', tag(removed))
      .send({ name: 'Spare reel', equipmentKind: 'reel', assetTag: 'RL-901' });
    expect(again.status).toBe(201);
    expect((await marco.delete(`/api/positions/${spare.id}`).set('If-Match', tag(again))).status).toBe(404);
  });

  test('when a position has readings, then 409 position-has-readings, and nothing changes', async () => {
    const marco = await t.agentFor(DEMO.director);
    const plan = await marco.get(`/api/venues/${hallId}`);
    const position = (plan.body as Plan).strips.find((x) => x.label === 'Strip 4')!.positions.find((p) => p.name === 'Right reel')!;
    expect(position.tested).toBe(true);
    const readingsBefore = t.db
      .select()
      .from(s.readings)
      .innerJoin(s.steps, eq(s.readings.stepId, s.steps.id))
      .where(eq(s.steps.positionId, position.id))
      .all().length;
    expect(readingsBefore).toBeGreaterThan(0);
    const refused = await marco.delete(`/api/positions/${position.id}`).set('If-Match', tag(plan));
    expect(refused.status).toBe(409);
    expect(refused.body.code).toBe('position-has-readings');
    expect(refused.body.detail).toMatch(/kept/);
    expect(refused.body.detail).toMatch(/Take its steps off the checklist/);
    const now = await marco.get(`/api/venues/${hallId}`);
    expect(tag(now)).toBe(tag(plan));
    const still = (now.body as Plan).strips.find((x) => x.label === 'Strip 4')!.positions.find((p) => p.id === position.id)!;
    expect(still.steps).toEqual(position.steps);
    expect(
      t.db.select().from(s.readings).innerJoin(s.steps, eq(s.readings.stepId, s.steps.id)).where(eq(s.steps.positionId, position.id)).all(),
    ).toHaveLength(readingsBefore);
    expect(
      t.db
        .select()
        .from(s.auditLog)
        .where(and(eq(s.auditLog.action, 'position.removed'), eq(s.auditLog.entityId, position.id)))
        .all(),
    ).toEqual([]);
  });

  test('when a fault was recorded against an untested position, then it is refused the same way', async () => {
    const marco = await t.agentFor(DEMO.director);
    const venue = await newVenue('Fault Removal Hall');
    const res = await marco
      .post(`/api/venues/${venue.venue.id}/strips/bulk`)
      .set('If-Match', `"${venue.venue.version}"`)
      .send({ count: 1 });
    const cable = (res.body as Plan).strips[0].positions.find((p) => p.name === 'Left floor cable')!;
    expect(cable.tested).toBe(false);
    await marco.post('/api/faults').send({ positionId: cable.id, kind: 'intermittent', conductors: 'B' }).expect(201);
    const plan = await marco.get(`/api/venues/${venue.venue.id}`);
    expect((plan.body as Plan).strips[0].positions.find((p) => p.id === cable.id)!.tested).toBe(true);
    const refused = await marco.delete(`/api/positions/${cable.id}`).set('If-Match', tag(plan));
    expect(refused.status).toBe(409);
    expect(refused.body.code).toBe('position-has-readings');
    expect(t.db.select().from(s.positions).where(eq(s.positions.id, cable.id)).all()).toHaveLength(1);
  });

  test('without If-Match 428, with an old one 412; a technician 403, another organisation’s director 404', async () => {
    const marco = await t.agentFor(DEMO.director);
    const venue = await newVenue('Guarded Removal Hall');
    const res = await marco
      .post(`/api/venues/${venue.venue.id}/strips/bulk`)
      .set('If-Match', `"${venue.venue.version}"`)
      .send({ count: 1 });
    const reel = (res.body as Plan).strips[0].positions.find((p) => p.name === 'Right reel')!;
    expect((await marco.delete(`/api/positions/${reel.id}`)).status).toBe(428);
    expect((await marco.delete(`/api/positions/${reel.id}`).set('If-Match', `"${venue.venue.version}"`)).status).toBe(412);
    const sam = await t.agentFor(DEMO.technician);
    expect((await sam.delete(`/api/positions/${reel.id}`).set('If-Match', tag(res))).status).toBe(403);
    const hilltop = await t.agentFor(OTHER_DIRECTOR, OTHER_PASSWORD);
    expect((await hilltop.delete(`/api/positions/${reel.id}`).set('If-Match', tag(res))).status).toBe(404);
    expect((await marco.delete(`/api/positions/${other.positionId}`).set('If-Match', '"1"')).status).toBe(404);
    const now = await marco.get(`/api/venues/${venue.venue.id}`);
    expect(tag(now)).toBe(tag(res));
    expect((now.body as Plan).strips[0].positions.map((p) => p.id)).toContain(reel.id);
  });
});

describe('adding a position to a signed-off venue', () => {
  test('re-opens it: the sign-off and its certificates are superseded and the venue is back to testing', async () => {
    const marco = await t.agentFor(DEMO.director);
    const signed = await marco.post(`/api/venues/${annexId}/sign-off`).send({ password: DEMO_PASSWORD });
    expect(signed.status, JSON.stringify(signed.body)).toBe(201);
    const plan = await marco.get(`/api/venues/${annexId}`);
    expect(plan.body.venue.status).toBe('signed-off');
    const strip = (plan.body as Plan).strips[0];
    const res = await marco
      .post(`/api/strips/${strip.id}/positions`)
      .set('If-Match', tag(plan))
      .send({ name: 'Second apparatus', equipmentKind: 'apparatus' });
    expect(res.status).toBe(201);
    expect(res.body.venue.status).toBe('testing');
    expect(
      t.db
        .select()
        .from(s.signOffs)
        .where(eq(s.signOffs.venueId, annexId))
        .all()
        .map((x) => x.status),
    ).toEqual(['superseded']);
    const certs = t.db.select().from(s.certificates).where(eq(s.certificates.venueId, annexId)).all();
    expect(certs.length).toBeGreaterThan(0);
    expect(certs.every((c) => c.status === 'superseded')).toBe(true);
    const reopened = t.db
      .select()
      .from(s.auditLog)
      .where(and(eq(s.auditLog.entityId, annexId), eq(s.auditLog.action, 'venue.reopened')))
      .all();
    expect(JSON.parse(reopened.at(-1)!.detailJson).reason).toContain('Second apparatus');
  });
});
