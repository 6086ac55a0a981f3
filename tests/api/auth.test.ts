import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { SignJWT } from 'jose';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, DEMO_PASSWORD, ORIGIN, type TestApp } from '../setup/test-app';
import { DEFAULT_SCRYPT, hashPassword, parseHashParams } from '../../server/auth/password';
import { capturedMail, users } from '../../server/db/schema';
import { signSessionToken } from '../../server/auth/session-token';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const cookieOf = (res: { headers: Record<string, unknown> }) => {
  const set = res.headers['set-cookie'] as string[] | undefined;
  return set?.find((c) => c.startsWith('sw_session='))?.split(';')[0] ?? '';
};

describe('password storage', () => {
  test('the default KDF meets OWASP ASVS 5.0 Appendix C (scrypt N ≥ 2^17, r = 8, p = 1)', async () => {
    expect(DEFAULT_SCRYPT.N).toBeGreaterThanOrEqual(2 ** 17);
    expect(DEFAULT_SCRYPT.r).toBe(8);
    expect(DEFAULT_SCRYPT.p).toBe(1);
    const stored = await hashPassword('correct horse battery', DEFAULT_SCRYPT);
    expect(parseHashParams(stored)).toEqual({ N: 2 ** 17, r: 8, p: 1 });
  });
});

describe('GET /api/health', () => {
  test('answers ok with the database state and the version', async () => {
    const res = await t.request.get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', db: 'ok', version: '0.0.0-test' });
  });
});

describe('POST /api/auth/sign-in', () => {
  test('when the credentials are right, then it answers the user and sets an HttpOnly SameSite=Lax cookie', async () => {
    const res = await t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: DEMO.director, password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: DEMO.director, name: 'Marco Dal Bello', role: 'director' });
    expect(Object.keys(res.body.user).sort()).toEqual(['email', 'id', 'name', 'role', 'unitSystem']);
    const set = (res.headers['set-cookie'] as unknown as string[]).join(';');
    expect(set).toMatch(/HttpOnly/);
    expect(set).toMatch(/SameSite=Lax/);
  });

  test('when the e-mail is mixed case with spaces, then it is normalised', async () => {
    const res = await t.request
      .post('/api/auth/sign-in')
      .set('Origin', ORIGIN)
      .send({ email: '  Ada@Lakeshore.Example ', password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
  });

  test('when the password is wrong or the e-mail unknown, then both get the same 401 problem', async () => {
    const wrong = await t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: DEMO.director, password: 'nope-nope' });
    const unknown = await t.request
      .post('/api/auth/sign-in')
      .set('Origin', ORIGIN)
      .send({ email: 'nobody@lakeshore.example', password: 'nope-nope' });
    for (const res of [wrong, unknown]) {
      expect(res.status).toBe(401);
      expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    }
    expect(wrong.body.detail).toBe(unknown.body.detail);
  });

  test.each([
    [{ email: DEMO.director }, 'password'],
    [{ email: DEMO.director, password: DEMO_PASSWORD, extra: 1 }, 'Unknown field'],
    [{ email: 'not-an-email', password: 'x' }, 'e-mail'],
  ])('when the body is %j, then 422 names the problem', async (body, needle) => {
    const res = await t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).send(body);
    expect(res.status).toBe(422);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(JSON.stringify(res.body.errors)).toContain(needle);
  });

  test('when the JSON is malformed, then 400 problem+json', async () => {
    const res = await t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).set('Content-Type', 'application/json').send('{"email":');
    expect(res.status).toBe(400);
    expect(res.body.code).toBe('malformed-json');
  });

  test('when the body is over the size limit, then 413', async () => {
    const res = await t.request
      .post('/api/auth/sign-in')
      .set('Origin', ORIGIN)
      .send({ email: DEMO.director, password: 'x'.repeat(200_000) });
    expect(res.status).toBe(413);
  });

  test('when no Origin, Referer or Sec-Fetch-Site is sent, or a foreign one, then 403 (CSRF defence)', async () => {
    const none = await t.request.post('/api/auth/sign-in').send({ email: DEMO.director, password: DEMO_PASSWORD });
    const foreign = await t.request
      .post('/api/auth/sign-in')
      .set('Origin', 'http://evil.example')
      .send({ email: DEMO.director, password: DEMO_PASSWORD });
    const crossSite = await t.request
      .post('/api/auth/sign-in')
      .set('Sec-Fetch-Site', 'cross-site')
      .send({ email: DEMO.director, password: DEMO_PASSWORD });
    const byReferer = await t.request
      .post('/api/auth/sign-in')
      .set('Referer', `${ORIGIN}/sign-in`)
      .send({ email: DEMO.director, password: DEMO_PASSWORD });
    expect([none.status, foreign.status, crossSite.status]).toEqual([403, 403, 403]);
    expect(byReferer.status).toBe(200);
  });

  test('when a tablet opened the app at the hall network’s address, then its writes from that same address are accepted, and a page elsewhere is still refused', async () => {
    // What a browser sends for a page loaded from http://192.168.1.20:3000 (RFC 6454: the Origin is the page's scheme, host and port).
    const hall = 'http://192.168.1.20:3000';
    const sameAddress = await t.request
      .post('/api/auth/sign-in')
      .set('Host', '192.168.1.20:3000')
      .set('Origin', hall)
      .send({ email: DEMO.director, password: DEMO_PASSWORD });
    expect(sameAddress.status).toBe(200);
    const byReferer = await t.request
      .post('/api/auth/sign-in')
      .set('Host', '192.168.1.20:3000')
      .set('Referer', `${hall}/sign-in`)
      .send({ email: DEMO.director, password: DEMO_PASSWORD });
    expect(byReferer.status).toBe(200);
    const otherPage = await t.request
      .post('/api/auth/sign-in')
      .set('Host', '192.168.1.20:3000')
      .set('Origin', 'http://192.168.1.99:8080')
      .send({ email: DEMO.director, password: DEMO_PASSWORD });
    expect(otherPage.status).toBe(403);
  });
});

describe('sessions', () => {
  test('each sign-in makes a new session, and sign-out ends it at once', async () => {
    const a = await t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: DEMO.organiser, password: DEMO_PASSWORD });
    const b = await t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: DEMO.organiser, password: DEMO_PASSWORD });
    expect(cookieOf(a)).not.toBe(cookieOf(b));
    const me = await t.request.get('/api/auth/me').set('Cookie', cookieOf(a));
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe(DEMO.organiser);
    const out = await t.request.post('/api/auth/sign-out').set('Origin', ORIGIN).set('Cookie', cookieOf(a));
    expect(out.status).toBe(204);
    expect((await t.request.get('/api/auth/me').set('Cookie', cookieOf(a))).status).toBe(401);
    expect((await t.request.get('/api/auth/me').set('Cookie', cookieOf(b))).status).toBe(200);
  });

  test('a tampered, foreign-key or alg:none cookie is refused with 401', async () => {
    const ok = await t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: DEMO.organiser, password: DEMO_PASSWORD });
    const token = cookieOf(ok).slice('sw_session='.length);
    const [h, p] = token.split('.');
    const tampered = `${h}.${p.slice(0, -2)}${p.endsWith('A') ? 'B' : 'A'}x.${token.split('.')[2]}`;
    const payload = JSON.parse(Buffer.from(p, 'base64url').toString());
    const none = `${Buffer.from('{"alg":"none","typ":"JWT"}').toString('base64url')}.${p}.`;
    const foreign = await new SignJWT(payload)
      .setProtectedHeader({ alg: 'HS256', typ: 'JWT' })
      .sign(new TextEncoder().encode('another-secret-another-secret-another'));
    for (const bad of [tampered, none, foreign, 'garbage']) {
      const res = await t.request.get('/api/auth/me').set('Cookie', `sw_session=${bad}`);
      expect(res.status).toBe(401);
    }
  });

  test('an expired token is refused', async () => {
    const user = t.db.select().from(users).where(eq(users.email, DEMO.organiser)).get()!;
    const expired = await signSessionToken(t.deps.sessionSecret, 'no-such-session', user.id, new Date(Date.now() - 1000));
    const res = await t.request.get('/api/auth/me').set('Cookie', `sw_session=${expired}`);
    expect(res.status).toBe(401);
  });
});

describe('people (admin)', () => {
  test('GET /api/users lists the organisation for an admin, and is 403 for a technician and 401 anonymously', async () => {
    const admin = await t.agentFor(DEMO.admin);
    const res = await admin.get('/api/users');
    expect(res.status).toBe(200);
    expect(res.body.map((u: { email: string }) => u.email)).toEqual(expect.arrayContaining(Object.values(DEMO)));
    expect(Object.keys(res.body[0])).toEqual(expect.arrayContaining(['id', 'email', 'name', 'role', 'disabled']));
    const tech = await t.agentFor(DEMO.technician);
    expect((await tech.get('/api/users')).status).toBe(403);
    expect((await t.request.get('/api/users')).status).toBe(401);
  });

  test('an invitation is e-mailed through SMTP, its link sets a password once, and the new person signs in', async () => {
    const admin = await t.agentFor(DEMO.admin);
    const invited = await admin.post('/api/users').send({ email: 'Kim@Lakeshore.example', name: 'Kim Ashby', role: 'technician' });
    expect(invited.status).toBe(201);
    expect(invited.body.email).toBe('kim@lakeshore.example');
    const mail = t.db
      .select()
      .from(capturedMail)
      .all()
      .find((m) => m.toAddresses.includes('kim@lakeshore.example'));
    expect(mail?.subject).toMatch(/invitation/i);
    // The link reaches the server's console (local SMTP fake), never the stored copy.
    const { token } = await t.linkSentTo('kim@lakeshore.example');
    expect(mail!.text).not.toContain(token);
    // Not signed in yet: no password.
    expect(
      (await t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: 'kim@lakeshore.example', password: 'a-new-password' }))
        .status,
    ).toBe(401);
    const info = await t.request.get(`/api/auth/set-password/${token}`);
    expect(info.body).toMatchObject({ email: 'kim@lakeshore.example', purpose: 'invite' });
    const tooShort = await t.request.post(`/api/auth/set-password/${token}`).set('Origin', ORIGIN).send({ password: 'short' });
    expect(tooShort.status).toBe(422);
    const set = await t.request.post(`/api/auth/set-password/${token}`).set('Origin', ORIGIN).send({ password: 'a-new-password' });
    expect(set.status).toBe(200);
    const again = await t.request.post(`/api/auth/set-password/${token}`).set('Origin', ORIGIN).send({ password: 'another-password' });
    expect(again.status).toBe(410);
    expect(again.headers['content-type']).toMatch(/problem\+json/);
    const signIn = await t.request
      .post('/api/auth/sign-in')
      .set('Origin', ORIGIN)
      .send({ email: 'kim@lakeshore.example', password: 'a-new-password' });
    expect(signIn.status).toBe(200);
    expect(signIn.body.user.role).toBe('technician');
  });

  test('inviting an e-mail that exists is 409 and writes nothing', async () => {
    const admin = await t.agentFor(DEMO.admin);
    const before = t.db.select().from(users).all().length;
    const res = await admin.post('/api/users').send({ email: DEMO.technician, name: 'Again', role: 'technician' });
    expect(res.status).toBe(409);
    expect(t.db.select().from(users).all().length).toBe(before);
  });

  test('disabling a person ends their sessions at once and stops sign-in', async () => {
    const admin = await t.agentFor(DEMO.admin);
    const lee = await t.agentFor(DEMO.annexTechnician);
    expect((await lee.get('/api/auth/me')).status).toBe(200);
    const leeId = t.db.select().from(users).where(eq(users.email, DEMO.annexTechnician)).get()!.id;
    expect((await admin.patch(`/api/users/${leeId}`).send({ disabled: true })).status).toBe(200);
    expect((await lee.get('/api/auth/me')).status).toBe(401);
    expect(
      (await t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: DEMO.annexTechnician, password: DEMO_PASSWORD }))
        .status,
    ).toBe(401);
    await admin.patch(`/api/users/${leeId}`).send({ disabled: false });
  });

  test('unknown API routes are 404 problem+json', async () => {
    const res = await t.request.get('/api/nothing-here');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/problem\+json/);
  });
});

describe('password reset', () => {
  test('an existing address gets a one-time link by e-mail; an unknown one gets the same answer and no mail', async () => {
    const before = t.db.select().from(capturedMail).all().length;
    const linksBefore = t.oneTimeLinks.length;
    const unknown = await t.request.post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email: 'nobody@lakeshore.example' });
    const known = await t.request.post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email: DEMO.organiser });
    expect([unknown.status, known.status]).toEqual([202, 202]);
    expect(unknown.body).toEqual(known.body);
    // Mail goes out after the answer: once the organiser's has arrived, the unknown one would have too.
    const { token } = await t.linkSentTo(DEMO.organiser, { after: linksBefore });
    const sent = t.db.select().from(capturedMail).all().slice(before);
    expect(sent.map((m) => m.toAddresses)).toEqual([DEMO.organiser]);
    expect(t.oneTimeLinks.slice(linksBefore).map((l) => l.to)).toEqual([DEMO.organiser]);
    const session = await t.agentFor(DEMO.organiser);
    expect(
      (await t.request.post(`/api/auth/set-password/${token}`).set('Origin', ORIGIN).send({ password: 'nina-new-password' })).status,
    ).toBe(200);
    // A new password ends the old sessions.
    expect((await session.get('/api/auth/me')).status).toBe(401);
    expect(
      (await t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: DEMO.organiser, password: 'nina-new-password' }))
        .status,
    ).toBe(200);
    const back = t.db.select().from(users).where(eq(users.email, DEMO.organiser)).get()!;
    t.db
      .update(users)
      .set({ passwordHash: await hashPassword(DEMO_PASSWORD, t.deps.scrypt) })
      .where(eq(users.id, back.id))
      .run();
  });

  test('an unknown link is 404 problem+json', async () => {
    const res = await t.request.get('/api/auth/set-password/not-a-token');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/problem\+json/);
  });
});

describe('POST /api/users/:id/end-sessions', () => {
  test("an admin ends all of someone's sessions at once", async () => {
    const admin = await t.agentFor(DEMO.admin);
    const one = await t.agentFor(DEMO.director);
    const two = await t.agentFor(DEMO.director);
    const id = t.db.select().from(users).where(eq(users.email, DEMO.director)).get()!.id;
    expect((await admin.post(`/api/users/${id}/end-sessions`)).status).toBe(204);
    expect((await one.get('/api/auth/me')).status).toBe(401);
    expect((await two.get('/api/auth/me')).status).toBe(401);
    expect((await one.post(`/api/users/${id}/end-sessions`)).status).toBe(401);
  });
});
