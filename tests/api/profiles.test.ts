import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp } from '../setup/test-app';
import { addOtherOrg } from '../setup/other-org';
import * as s from '../../server/db/schema';
import type { LimitRule } from '../../shared/domain/limits';

let t: TestApp;
let other: Awaited<ReturnType<typeof addOtherOrg>>;
let defaultId: string;
let eventId: string;
beforeAll(async () => {
  t = await createTestApp();
  other = await addOtherOrg(t);
  const venue = t.db.select().from(s.venues).all()[0];
  defaultId = venue.profileId;
  eventId = venue.eventId;
});
afterAll(() => t.close());

type Profile = {
  id: string;
  lineageId: string;
  name: string;
  version: number;
  rules: LimitRule[];
  versions: { id: string; version: number }[];
};

describe('GET /api/profiles', () => {
  test('everyone signed in reads the library: the latest version of each profile with its sources and house-rule marks', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const res = await sam.get('/api/profiles');
    expect(res.status).toBe(200);
    const [p] = res.body as (Profile & { houseRuleCount: number })[];
    expect(p).toMatchObject({ name: 'Competition default', version: 1, versions: [{ id: defaultId, version: 1 }] });
    expect(p.houseRuleCount).toBeGreaterThan(0);
    expect(p.rules.find((r) => r.id === 'floor-cable.continuity')).toMatchObject({
      source: 'FIE Material Rules, art. m.55.5',
      houseRule: false,
    });
    expect((await t.request.get('/api/profiles')).status).toBe(401);
  });

  test('another organisation’s profile is 404', async () => {
    const marco = await t.agentFor(DEMO.director);
    expect((await marco.get(`/api/profiles/${other.profileId}`)).status).toBe(404);
    expect(((await marco.get('/api/profiles')).body as Profile[]).some((p) => p.name === 'Hilltop rules')).toBe(false);
  });
});

describe('POST /api/profiles/:id/copy', () => {
  test('a copy starts a new lineage at version 1 with the same rules', async () => {
    const ada = await t.agentFor(DEMO.admin);
    const res = await ada.post(`/api/profiles/${defaultId}/copy`).send({ name: 'Lakeshore club nights' });
    expect(res.status).toBe(201);
    const source = (await ada.get(`/api/profiles/${defaultId}`)).body as Profile;
    expect(res.body).toMatchObject({ name: 'Lakeshore club nights', version: 1 });
    expect(res.body.lineageId).not.toBe(source.lineageId);
    expect(res.body.rules).toEqual(source.rules);
    expect(res.headers.etag).toBe('"1"');
  });

  test('technicians and organisers cannot copy (403); a blank name is 422', async () => {
    for (const who of [DEMO.technician, DEMO.organiser]) {
      const agent = await t.agentFor(who);
      expect((await agent.post(`/api/profiles/${defaultId}/copy`).send({ name: 'Mine' })).status).toBe(403);
    }
    const marco = await t.agentFor(DEMO.director);
    const res = await marco.post(`/api/profiles/${defaultId}/copy`).send({ name: '  ' });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].path).toBe('name');
  });
});

describe('PUT /api/profiles/:id', () => {
  test('an edit creates version 2 in the same lineage; version 1 stays as it was', async () => {
    const marco = await t.agentFor(DEMO.director);
    const copy = (await marco.post(`/api/profiles/${defaultId}/copy`).send({ name: 'Strict reels' })).body as Profile;
    const rules = copy.rules.map((r) =>
      r.id === 'reel.continuity' ? { ...r, maxOhm: 2.5, source: 'House rule: strict reels', houseRule: true } : r,
    );
    const res = await marco.put(`/api/profiles/${copy.id}`).set('If-Match', '"1"').send({ rules, notes: 'Reels to 2.5 Ω' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ lineageId: copy.lineageId, version: 2, name: 'Strict reels', notes: 'Reels to 2.5 Ω' });
    expect(res.body.id).not.toBe(copy.id);
    expect(res.body.versions.map((v: { version: number }) => v.version)).toEqual([2, 1]);
    const v1 = (await marco.get(`/api/profiles/${copy.id}`)).body as Profile;
    expect(v1.rules.find((r) => r.id === 'reel.continuity')!.maxOhm).toBe(3);
    const list = (await marco.get('/api/profiles')).body as Profile[];
    expect(list.find((p) => p.lineageId === copy.lineageId)).toMatchObject({ version: 2 });
  });

  test('a stale If-Match is 412 and adds no version; a missing one is 428', async () => {
    const marco = await t.agentFor(DEMO.director);
    const copy = (await marco.post(`/api/profiles/${defaultId}/copy`).send({ name: 'Race' })).body as Profile;
    expect((await marco.put(`/api/profiles/${copy.id}`).set('If-Match', '"1"').send({ rules: copy.rules, name: 'Race A' })).status).toBe(
      201,
    );
    const stale = await marco.put(`/api/profiles/${copy.id}`).set('If-Match', '"1"').send({ rules: copy.rules, name: 'Race B' });
    expect(stale.status).toBe(412);
    expect(stale.body.detail).toMatch(/meanwhile/);
    expect(stale.body.currentVersion).toBe(2);
    expect((await marco.put(`/api/profiles/${copy.id}`).send({ rules: copy.rules })).status).toBe(428);
    const rows = t.db.select().from(s.limitProfiles).where(eq(s.limitProfiles.lineageId, copy.lineageId)).all();
    expect(rows.map((r) => r.name).sort()).toEqual(['Race', 'Race A']);
  });

  test('rules that do not make sense are 422 with the field, never 500', async () => {
    const marco = await t.agentFor(DEMO.director);
    const bad = [{ id: 'x', equipmentKind: 'reel', testKind: 'insulation', maxOhm: 5, source: '', houseRule: 'yes' }];
    const res = await marco.put(`/api/profiles/${defaultId}`).set('If-Match', '"1"').send({ rules: bad });
    expect(res.status).toBe(422);
    const paths = res.body.errors.map((e: { path: string }) => e.path);
    expect(paths).toEqual(expect.arrayContaining(['rules.0.source', 'rules.0.houseRule']));
    expect((await marco.put(`/api/profiles/${defaultId}`).set('If-Match', '"1"').send({ rules: [] })).status).toBe(422);
    const sam = await t.agentFor(DEMO.technician);
    expect((await sam.put(`/api/profiles/${defaultId}`).set('If-Match', '"1"').send({ rules: bad })).status).toBe(403);
    expect(
      (
        await marco
          .put(`/api/profiles/${other.profileId}`)
          .set('If-Match', '"1"')
          .send({ name: 'x', rules: (await marco.get(`/api/profiles/${defaultId}`)).body.rules })
      ).status,
    ).toBe(404);
  });
});

describe('the cable-temperature setting of a profile', () => {
  test('judged as measured by default; a new version that corrects to 20 °C (a house rule) passes the warm cable the first one failed', async () => {
    const marco = await t.agentFor(DEMO.director);
    const copy = (await marco.post(`/api/profiles/${defaultId}/copy`).send({ name: 'Warm hall' })).body as Profile & {
      temperatureReferenceC: number | null;
    };
    expect(copy.temperatureReferenceC).toBeNull();
    let plan = await marco.post(`/api/events/${eventId}/venues`).send({ name: 'Warm Hall', profileId: copy.id });
    plan = await marco.post(`/api/venues/${plan.body.venue.id}/strips/bulk`).set('If-Match', plan.headers.etag).send({ count: 1 });
    const venueId = plan.body.venue.id as string;
    const cable = plan.body.strips[0].positions.find((p: { equipmentKind: string }) => p.equipmentKind === 'floor-cable');
    const [stepA, stepB] = cable.steps as { id: string }[];

    // FIE Material Rules, art. m.55.5: ≤ 2.5 Ω per wire. 2.55 Ω at 35 °C, as measured, is over it.
    const asMeasured = await marco
      .post('/api/readings')
      .send({ id: crypto.randomUUID(), stepId: stepA.id, value: '2.55', temperatureC: 35 });
    expect(asMeasured.body).toMatchObject({ verdict: 'fail', profileVersion: 1 });
    expect(asMeasured.body.explanation).toMatch(/judged as measured/);

    const v2 = await marco.put(`/api/profiles/${copy.id}`).set('If-Match', '"1"').send({ rules: copy.rules, temperatureReferenceC: 20 });
    expect(v2.status).toBe(201);
    expect(v2.body).toMatchObject({ version: 2, temperatureReferenceC: 20 });
    expect((await marco.patch(`/api/venues/${venueId}`).set('If-Match', plan.headers.etag).send({ profileId: v2.body.id })).status).toBe(
      200,
    );
    // IEC 60228 Annex B: 2.55 Ω × 254.5 / 269.5 = 2.408 Ω at 20 °C, within the limit but above 90 % of it.
    const corrected = await marco
      .post('/api/readings')
      .send({ id: crypto.randomUUID(), stepId: stepB.id, value: '2.55', temperatureC: 35 });
    expect(corrected.body).toMatchObject({ verdict: 'near-limit', profileVersion: 2 });
    expect(corrected.body.explanation).toMatch(/2\.408 Ω corrected to 20 °C \(house rule/);

    // A rule edit keeps the setting; null turns it off again; nonsense is 422.
    const v3 = await marco.put(`/api/profiles/${copy.id}`).set('If-Match', '"2"').send({ rules: copy.rules });
    expect(v3.body).toMatchObject({ version: 3, temperatureReferenceC: 20 });
    const v4 = await marco.put(`/api/profiles/${copy.id}`).set('If-Match', '"3"').send({ rules: copy.rules, temperatureReferenceC: null });
    expect(v4.body).toMatchObject({ version: 4, temperatureReferenceC: null });
    const bad = await marco.put(`/api/profiles/${copy.id}`).set('If-Match', '"4"').send({ rules: copy.rules, temperatureReferenceC: 300 });
    expect(bad.status).toBe(422);
    expect(bad.body.errors[0].path).toBe('temperatureReferenceC');
  });
});

describe('readings keep the version they were checked with', () => {
  test('a reading taken under version 1 still shows version 1 after the profile is edited and the venue moves to version 2', async () => {
    const marco = await t.agentFor(DEMO.director);
    const copy = (await marco.post(`/api/profiles/${defaultId}/copy`).send({ name: 'Versioned' })).body as Profile;
    let plan = await marco.post(`/api/events/${eventId}/venues`).send({ name: 'Versioned Hall', profileId: copy.id });
    plan = await marco.post(`/api/venues/${plan.body.venue.id}/strips/bulk`).set('If-Match', plan.headers.etag).send({ count: 1 });
    const venueId = plan.body.venue.id as string;
    const reel = plan.body.strips[0].positions.find((p: { equipmentKind: string }) => p.equipmentKind === 'reel');
    const [stepA, stepB] = reel.steps as { id: string }[];

    const first = await marco.post('/api/readings').send({ id: crypto.randomUUID(), stepId: stepA.id, value: '2.8' });
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({ verdict: 'near-limit', profileVersion: 1 });

    const rules = copy.rules.map((r) => (r.id === 'reel.continuity' ? { ...r, maxOhm: 2.5 } : r));
    const v2 = await marco.put(`/api/profiles/${copy.id}`).set('If-Match', '"1"').send({ rules });
    plan = await marco.patch(`/api/venues/${venueId}`).set('If-Match', plan.headers.etag).send({ profileId: v2.body.id });
    expect(plan.status).toBe(200);
    const second = await marco.post('/api/readings').send({ id: crypto.randomUUID(), stepId: stepB.id, value: '2.8' });
    expect(second.body).toMatchObject({ verdict: 'fail', profileVersion: 2 });

    const table = (await marco.get(`/api/venues/${venueId}/readings`)).body as {
      id: string;
      profileName: string;
      profileVersion: number;
      verdict: string;
      limitOhm: number;
    }[];
    expect(table.find((r) => r.id === first.body.id)).toMatchObject({
      profileName: 'Versioned',
      profileVersion: 1,
      verdict: 'near-limit',
      limitOhm: 3,
    });
    expect(table.find((r) => r.id === second.body.id)).toMatchObject({ profileVersion: 2, verdict: 'fail', limitOhm: 2.5 });
  });
});
