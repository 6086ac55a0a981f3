// Names a person types lose bidirectional-override and control characters (Unicode TR #36 §2.4;
// CVE-2021-42574, "Trojan Source"): a strip called "‮6 pirtS" must not read as "Strip 6" on the
// board or the certificate. The rule lives in the shared field schema, so the form and the server
// clean alike.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp } from '../setup/test-app';
import { venueIds } from '../api/testing-helpers';
import * as s from '../../server/db/schema';
import { cleanTypedName, nameField } from '../../shared/schemas/common';
import { bulkStripsSchema } from '../../shared/schemas/plan';

const RLO = '\u202e'; // right-to-left override
const LRI = '\u2066'; // left-to-right isolate
const PDI = '\u2069';
const ZWSP = '\u200b';
// eslint-disable-next-line no-control-regex
const BIDI_OR_CONTROL = /[\u0000-\u001f\u007f-\u009f\u061c\u200b\u200e\u200f\u202a-\u202e\u2060-\u2064\u2066-\u2069\ufeff]/;
const spoofed = (name: string) => `${RLO}${name}${LRI}\u0007${ZWSP}${PDI}\u0000`;

describe('the shared field schema (used by the forms and the routes)', () => {
  test('removes bidi controls, zero-width space and C0/C1 controls; a line break becomes a space', () => {
    expect(cleanTypedName(`${RLO}Strip 6${PDI}`)).toBe('Strip 6');
    expect(cleanTypedName('Main\nhall\tA\u0085B')).toBe('Main hall A B');
    expect(nameField.parse(`  ${spoofed('Riverside')}  `)).toBe('Riverside');
    // Joiners stay: some scripts need them (Persian, Hindi).
    expect(nameField.parse('می\u200cخواهم')).toBe('می\u200cخواهم');
  });

  test('a name of nothing but invisible characters is "required", not an empty name', () => {
    const r = nameField.safeParse(`${RLO}${ZWSP}\u0000 `);
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].message).toBe('A name is required.');
    expect(bulkStripsSchema.safeParse({ labels: [`${RLO}${PDI}`] }).success).toBe(false);
  });
});

describe('every name stored through the API is clean', () => {
  let t: TestApp;
  let hall: string;
  beforeAll(async () => {
    t = await createTestApp();
    ({ hall } = await venueIds(t));
  });
  afterAll(() => t.close());

  test('event, venue, strip (label, prefix, zone), position, item, person and profile names', async () => {
    const marco = await t.agentFor(DEMO.director);
    const ada = await t.agentFor(DEMO.admin);

    const event = await marco.post('/api/events').send({ name: spoofed('Winter Open'), startsOn: '2027-01-09', endsOn: '2027-01-10' });
    expect(event.status).toBe(201);
    const profileId = t.db.select().from(s.venues).where(eq(s.venues.id, hall)).get()!.profileId;
    const venue = await marco.post(`/api/events/${event.body.id}/venues`).send({ name: spoofed('North Gym'), profileId });
    expect(venue.status).toBe(201);
    const strips = await marco
      .post(`/api/venues/${venue.body.venue.id}/strips/bulk`)
      .set('If-Match', venue.headers.etag)
      .send({ labels: [spoofed('Strip 6'), 'Final'], zone: spoofed('Row A') });
    expect(strips.status).toBe(201);
    const counted = await marco
      .post(`/api/venues/${venue.body.venue.id}/strips/bulk`)
      .set('If-Match', strips.headers.etag)
      .send({ count: 1, prefix: spoofed('Piste '), startAt: 7 });
    expect(counted.status).toBe(201);
    const strip = strips.body.strips[0] as { id: string };
    const position = await marco
      .post(`/api/strips/${strip.id}/positions`)
      .set('If-Match', counted.headers.etag)
      .send({ name: spoofed('Spare reel'), equipmentKind: 'reel' });
    expect(position.status).toBe(201);
    const item = await ada
      .post('/api/equipment')
      .send({ assetTag: 'RL-777', kind: 'reel', description: spoofed('Grey reel'), cableType: spoofed('3-core') });
    expect(item.status).toBe(201);
    const person = await ada.post('/api/users').send({ email: 'kai@lakeshore.example', name: spoofed('Kai Moreno'), role: 'technician' });
    expect(person.status).toBe(201);
    const profiles = (await ada.get('/api/profiles')).body as { id: string }[];
    const copy = await ada.post(`/api/profiles/${profiles[0]!.id}/copy`).send({ name: spoofed('Club nights') });
    expect(copy.status).toBe(201);

    const stored = {
      event: t.db.select().from(s.events).where(eq(s.events.id, event.body.id)).get()!.name,
      venue: t.db.select().from(s.venues).where(eq(s.venues.id, venue.body.venue.id)).get()!.name,
      strips: t.db
        .select()
        .from(s.strips)
        .where(eq(s.strips.venueId, venue.body.venue.id))
        .all()
        .map((x) => [x.label, x.zone]),
      position: t.db
        .select()
        .from(s.positions)
        .where(eq(s.positions.stripId, strip.id))
        .all()
        .map((p) => p.name),
      item: t.db.select().from(s.equipment).where(eq(s.equipment.assetTag, 'RL-777')).get()!,
      person: t.db.select().from(s.users).where(eq(s.users.email, 'kai@lakeshore.example')).get()!.name,
      profile: t.db.select().from(s.limitProfiles).where(eq(s.limitProfiles.name, 'Club nights')).all().length,
    };
    expect(stored.event).toBe('Winter Open');
    expect(stored.venue).toBe('North Gym');
    expect(stored.strips).toEqual(
      expect.arrayContaining([
        ['Strip 6', 'Row A'],
        ['Final', 'Row A'],
        ['Piste 7', null],
      ]),
    );
    expect(stored.position).toContain('Spare reel');
    expect([stored.item.description, stored.item.cableType]).toEqual(['Grey reel', '3-core']);
    expect(stored.person).toBe('Kai Moreno');
    expect(stored.profile).toBe(1);
    expect(BIDI_OR_CONTROL.test(JSON.stringify(stored))).toBe(false);
  });

  test('renaming a strip or a person cleans the new name too', async () => {
    const marco = await t.agentFor(DEMO.director);
    const ada = await t.agentFor(DEMO.admin);
    const plan = await marco.get(`/api/venues/${hall}`);
    const strip = (plan.body.strips as { id: string; label: string }[]).find((x) => x.label === 'Strip 24')!;
    const renamed = await marco
      .patch(`/api/strips/${strip.id}`)
      .set('If-Match', plan.headers.etag)
      .send({ label: spoofed('Strip 24b') });
    expect(renamed.status).toBe(200);
    expect(t.db.select().from(s.strips).where(eq(s.strips.id, strip.id)).get()!.label).toBe('Strip 24b');
    const lee = t.db.select().from(s.users).where(eq(s.users.email, DEMO.annexTechnician)).get()!;
    expect((await ada.patch(`/api/users/${lee.id}`).send({ name: spoofed('Lee Park') })).status).toBe(200);
    expect(t.db.select().from(s.users).where(eq(s.users.id, lee.id)).get()!.name).toBe('Lee Park');
  });
});
