import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, ORIGIN, type TestApp } from '../setup/test-app';
import { auditLog, leadNulls } from '../../server/db/schema';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('POST /api/lead-nulls', () => {
  test('records who, when, the value and the meter; the same id and body again is a replay, another body is refused', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const body = { id: randomUUID(), value: '0,12', meter: 'Meter 1', takenAt: new Date(Date.now() - 60_000).toISOString() };
    const first = await sam.post('/api/lead-nulls').send(body);
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({
      id: body.id,
      valueText: '0,12',
      valueOhm: 0.12,
      meter: 'Meter 1',
      takenAt: body.takenAt,
      takenByName: 'Sam Reyes',
    });
    expect((await sam.post('/api/lead-nulls').send(body)).status).toBe(200);
    const other = await sam.post('/api/lead-nulls').send({ ...body, value: '0.13' });
    expect(other.status).toBe(422);
    expect(other.body.code).toBe('idempotency-mismatch');
    // The same id from someone else is not theirs to replay.
    const marco = await t.agentFor(DEMO.director);
    expect((await marco.post('/api/lead-nulls').send(body)).status).toBe(422);
    expect(t.db.select().from(leadNulls).where(eq(leadNulls.id, body.id)).all()).toHaveLength(1);
    const audit = t.db.select().from(auditLog).where(eq(auditLog.entityId, body.id)).all();
    expect(audit.map((a) => a.action)).toEqual(['lead-null.recorded']);
  });

  test('over range with the tips together, a negative value or invisible characters in the meter name', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const ol = await sam.post('/api/lead-nulls').send({ id: randomUUID(), value: 'OL' });
    expect(ol.status).toBe(422);
    expect(ol.body.errors[0].path).toBe('value');
    expect((await sam.post('/api/lead-nulls').send({ id: randomUUID(), value: '-0.1' })).status).toBe(422);
    // Exactly 1 Ω is the most (common practice); control and bidi characters are taken out of the meter's name.
    const edge = await sam.post('/api/lead-nulls').send({ id: randomUUID(), value: '1', meter: 'Meter\u202e 3\u0007' });
    expect(edge.status).toBe(201);
    expect(edge.body.meter).toBe('Meter 3');
  });

  test('who may record one: technicians and directors, for themselves', async () => {
    for (const who of [DEMO.organiser, DEMO.admin]) {
      const agent = await t.agentFor(who);
      expect((await agent.post('/api/lead-nulls').send({ id: randomUUID(), value: '0.1' })).status).toBe(403);
    }
    expect((await t.request.post('/api/lead-nulls').set('Origin', ORIGIN).send({ id: randomUUID(), value: '0.1' })).status).toBe(401);
  });
});
