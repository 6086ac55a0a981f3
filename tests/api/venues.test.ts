import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createTestApp, DEMO, type TestApp } from '../setup/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('GET /api/venues', () => {
  test('a technician sees only the venues they are assigned to', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const lee = await t.agentFor(DEMO.annexTechnician);
    expect((await sam.get('/api/venues')).body.map((v: { name: string }) => v.name)).toEqual(['Riverside Sports Hall']);
    expect((await lee.get('/api/venues')).body.map((v: { name: string }) => v.name)).toEqual(['Riverside Annex']);
  });

  test('the director and the organiser see both venues of the event, with strip counts', async () => {
    for (const who of [DEMO.director, DEMO.organiser]) {
      const agent = await t.agentFor(who);
      const res = await agent.get('/api/venues');
      expect(res.status).toBe(200);
      const byName = Object.fromEntries(res.body.map((v: { name: string }) => [v.name, v]));
      expect(byName['Riverside Sports Hall']).toMatchObject({ eventName: 'Autumn Cup 2026', stripCount: 24 });
      expect(byName['Riverside Annex']).toMatchObject({ eventName: 'Autumn Cup 2026', stripCount: 4 });
    }
  });

  test('anonymous callers get 401', async () => {
    expect((await t.request.get('/api/venues')).status).toBe(401);
  });
});

describe('GET /api/venues/:id/strips', () => {
  test('the demo hall is part-way: some strips clear, some with faults, some not started; the annex is all clear', async () => {
    const marco = await t.agentFor(DEMO.director);
    const venues = (await marco.get('/api/venues')).body as { id: string; name: string }[];
    const hall = venues.find((v) => v.name === 'Riverside Sports Hall')!;
    const annex = venues.find((v) => v.name === 'Riverside Annex')!;
    const hallStrips = (await marco.get(`/api/venues/${hall.id}/strips`)).body as { label: string; status: string }[];
    const status = Object.fromEntries(hallStrips.map((s) => [s.label, s.status]));
    expect(status['Strip 1']).toBe('clear');
    expect(status['Strip 2']).toBe('clear'); // near limit passes
    expect(status['Strip 6']).toBe('fault-open');
    expect(status['Strip 11']).toBe('in-progress');
    expect(status['Strip 24']).toBe('not-started');
    const annexStrips = (await marco.get(`/api/venues/${annex.id}/strips`)).body as { status: string }[];
    expect(annexStrips.map((s) => s.status)).toEqual(['clear', 'clear', 'clear', 'clear']);
  });

  test('a technician not assigned to the venue gets 403; a bad id gets 422', async () => {
    const marco = await t.agentFor(DEMO.director);
    const hall = ((await marco.get('/api/venues')).body as { id: string; name: string }[]).find((v) => v.name === 'Riverside Sports Hall')!;
    const lee = await t.agentFor(DEMO.annexTechnician);
    const res = await lee.get(`/api/venues/${hall.id}/strips`);
    expect(res.status).toBe(403);
    expect(res.headers['content-type']).toMatch(/problem\+json/);
    expect((await lee.get('/api/venues/not-a-uuid/strips')).status).toBe(422);
  });
});

describe('GET /api/venues order', () => {
  test('newest event first, then the venue name as people read it (case-insensitive), the same on every call', async () => {
    const marco = await t.agentFor(DEMO.director);
    const profileId = (await marco.get('/api/profiles')).body[0].id as string;
    const addEvent = async (name: string, startsOn: string) => {
      const res = await marco.post('/api/events').send({ name, startsOn, endsOn: startsOn });
      expect(res.status).toBe(201);
      return res.body.id as string;
    };
    const addVenue = async (eventId: string, name: string) =>
      expect((await marco.post(`/api/events/${eventId}/venues`).send({ name, profileId })).status).toBe(201);
    const later = await addEvent('Spring Open 2027', '2027-04-10');
    const earlier = await addEvent('Winter Trophy 2026', '2026-12-12');
    await addVenue(earlier, 'north gym');
    await addVenue(later, 'beta court');
    await addVenue(later, 'Charlie court');
    await addVenue(earlier, 'Main hall');
    const names = (await marco.get('/api/venues')).body.map((v: { name: string }) => v.name);
    // Autumn Cup 2026 (2026-11-21) is the demo event, the oldest here.
    expect(names).toEqual(['beta court', 'Charlie court', 'Main hall', 'north gym', 'Riverside Annex', 'Riverside Sports Hall']);
    for (let i = 0; i < 3; i++) expect((await marco.get('/api/venues')).body.map((v: { name: string }) => v.name)).toEqual(names);
  });
});
