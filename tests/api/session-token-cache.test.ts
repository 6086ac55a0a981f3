// Verified session tokens are remembered (server/auth/session-token.ts) so the signature is not
// checked again on every request. What is remembered must never outlive the token's own expiry,
// and must not stand in for the session row: revocation still takes effect on the next request.
// Recording a reading answers from the row it inserted, not read back: that answer must be what
// is stored.
import { afterAll, afterEach, beforeAll, describe, expect, test, vi } from 'vitest';
import { createTestApp, DEMO, DEMO_PASSWORD, ORIGIN, type TestApp } from '../setup/test-app';
import { signSessionToken } from '../../server/auth/session-token';
import { newReading, stripByLabel, venueIds } from './testing-helpers';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t?.close());
afterEach(() => vi.useRealTimers());

async function signInToken(email: string) {
  const res = await t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email, password: DEMO_PASSWORD });
  expect(res.status).toBe(200);
  return String(res.headers['set-cookie'][0]).split(';')[0].slice('sw_session='.length);
}
const me = (token: string) => t.request.get('/api/auth/me').set('Cookie', `sw_session=${token}`);
const claims = (token: string) => JSON.parse(Buffer.from(token.split('.')[1], 'base64url').toString()) as { sid: string; sub: string };

describe('GET /api/auth/me with a token verified before', () => {
  test('when the token itself has expired since it was last accepted, then it is refused', async () => {
    const long = await signInToken(DEMO.organiser);
    const { sid, sub } = claims(long);
    // The same live session, in a token of ours that expires in one minute.
    const short = await signSessionToken(t.deps.sessionSecret, sid, sub, new Date(Date.now() + 60_000));
    expect((await me(short)).status).toBe(200);
    expect((await me(short)).status).toBe(200);

    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(Date.now() + 61_000);
    expect((await me(short)).status).toBe(401);
    // The session is still live: only the expired token is refused.
    expect((await me(long)).status).toBe(200);
  });

  test('when the user signs out after the token was accepted, then the same token is refused at once', async () => {
    const token = await signInToken(DEMO.director);
    expect((await me(token)).status).toBe(200);
    const out = await t.request.post('/api/auth/sign-out').set('Origin', ORIGIN).set('Cookie', `sw_session=${token}`);
    expect(out.status).toBeLessThan(300);
    expect((await me(token)).status).toBe(401);
  });
});

describe('POST /api/readings answer', () => {
  test('when readings pass, fail, are over range or correct another, then each answer equals the stored reading', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, (await venueIds(t)).hall, 'Strip 12');
    const all = strip.positions.flatMap((p) => p.steps);
    const continuity = all.filter((s) => s.testKind === 'continuity');
    const insulation = all.find((s) => s.testKind === 'insulation')!;
    const lead = await sam.post('/api/lead-nulls').send({ id: crypto.randomUUID(), value: '0.05' });
    expect(lead.status).toBe(201);
    const made = [
      await sam.post('/api/readings').send(newReading(continuity[0].id, '0.45', { leadNullId: lead.body.id, temperatureC: 21.5 })),
      await sam.post('/api/readings').send(newReading(continuity[1].id, '250')),
      await sam.post('/api/readings').send(newReading(insulation.id, 'OL')),
    ];
    made.push(
      await sam
        .post('/api/readings')
        .send(newReading(continuity[1].id, '0.5', { supersedesId: made[1].body.id, correctionReason: 'Typed 250 for 0.50' })),
    );
    expect(made.map((r) => r.status)).toEqual([201, 201, 201, 201]);
    expect(made.map((r) => r.body.verdict)).toEqual(['pass', 'fail', 'pass', 'pass']);
    expect(made[1].body.faultId).toEqual(expect.any(String));
    for (const r of made) {
      const stored = await sam.get(`/api/readings/${r.body.id}`);
      expect(stored.status).toBe(200);
      expect(r.body).toEqual(stored.body);
    }
  });
});
