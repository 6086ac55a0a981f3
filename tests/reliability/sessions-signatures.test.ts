// Sessions and signatures under abuse, beyond tests/api/auth.test.ts: a session cookie altered at
// any position, a session expired or idle on the server's side, revoked in the database, or
// naming someone else's session; a certificate JWS altered at any position; a PDF altered by one
// byte. All refused.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { compactVerify, importJWK, SignJWT, type JWK } from 'jose';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, DEMO_PASSWORD, ORIGIN, type TestApp } from '../setup/test-app';
import { venueIds } from '../api/testing-helpers';
import { signSessionToken } from '../../server/auth/session-token';
import { sessions, users } from '../../server/db/schema';

const B64URL = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_';
/** The character at i replaced by another one that is still valid base64url (or 'A' for a dot). */
const alterAt = (s: string, i: number, shift = 1) =>
  s.slice(0, i) + (s[i] === '.' ? 'A' : B64URL[(B64URL.indexOf(s[i]) + shift) % 64]) + s.slice(i + 1);

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t?.close());

async function signInToken(email: string) {
  const res = await t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email, password: DEMO_PASSWORD });
  expect(res.status).toBe(200);
  const cookie = String(res.headers['set-cookie'][0]).split(';')[0];
  return cookie.slice('sw_session='.length);
}
const me = (token: string) => t.request.get('/api/auth/me').set('Cookie', `sw_session=${token}`);
const claims = (token: string) => JSON.parse(Buffer.from(token.split('.')[1], 'base64url').toString()) as { sid: string; sub: string };

describe('session cookies', () => {
  test('a session token altered at any single position is refused with 401 problem+json', async () => {
    const token = await signInToken(DEMO.organiser);
    expect((await me(token)).status).toBe(200);
    const accepted: number[] = [];
    for (let i = 0; i < token.length; i++) {
      const res = await me(alterAt(token, i));
      if (res.status !== 401) accepted.push(i);
      else expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    }
    // The last character of the signature carries unused bits in base64url: two of its variants
    // decode to the same signature, which is the same token, not an alteration of what is signed.
    const last = token.length - 1;
    for (const i of accepted) {
      expect(i, `position ${i} of ${token.length} was accepted`).toBe(last);
      expect(Buffer.from(alterAt(token, i).split('.')[2], 'base64url')).toEqual(Buffer.from(token.split('.')[2], 'base64url'));
    }
  });

  test('alg none, HS512, an empty signature and a signature from another secret are refused', async () => {
    const token = await signInToken(DEMO.organiser);
    const [h, p, sig] = token.split('.');
    const header = (o: object) => Buffer.from(JSON.stringify(o)).toString('base64url');
    const payload = claims(token);
    const variants = [
      `${header({ alg: 'none', typ: 'JWT' })}.${p}.`,
      `${header({ alg: 'none' })}.${p}.${sig}`,
      `${header({ alg: 'NONE', typ: 'JWT' })}.${p}.`,
      `${h}.${p}.`,
      `${h}.${p}`,
      `${header({ alg: 'HS512', typ: 'JWT' })}.${p}.${sig}`,
      await new SignJWT(payload)
        .setProtectedHeader({ alg: 'HS512', typ: 'JWT' })
        .sign(t.deps.sessionSecret.length >= 64 ? t.deps.sessionSecret : new Uint8Array(64)),
      await new SignJWT(payload).setProtectedHeader({ alg: 'HS256', typ: 'JWT' }).sign(new TextEncoder().encode('x'.repeat(40))),
    ];
    for (const v of variants) expect((await me(v)).status, v.slice(0, 60)).toBe(401);
    expect((await me(token)).status).toBe(200);
  });

  test('a live token is refused once its session has expired, gone idle, or been revoked on the server', async () => {
    const at = (ms: number) => new Date(Date.now() + ms).toISOString();
    const expired = await signInToken(DEMO.director);
    t.db
      .update(sessions)
      .set({ expiresAt: at(-1000) })
      .where(eq(sessions.id, claims(expired).sid))
      .run();
    expect((await me(expired)).status).toBe(401);

    const idle = await signInToken(DEMO.director);
    t.db
      .update(sessions)
      .set({ lastSeenAt: at(-(t.deps.env.SESSION_IDLE_MINUTES * 60_000 + 1000)) })
      .where(eq(sessions.id, claims(idle).sid))
      .run();
    expect((await me(idle)).status).toBe(401);

    const revoked = await signInToken(DEMO.director);
    expect((await me(revoked)).status).toBe(200);
    t.db
      .update(sessions)
      .set({ revokedAt: at(0) })
      .where(eq(sessions.id, claims(revoked).sid))
      .run();
    expect((await me(revoked)).status).toBe(401);

    // Revoked by an admin ending all of someone's sessions.
    const sams = [await signInToken(DEMO.technician), await signInToken(DEMO.technician)];
    const ada = await t.agentFor(DEMO.admin);
    const sam = t.db.select().from(users).where(eq(users.email, DEMO.technician)).get()!;
    expect((await ada.post(`/api/users/${sam.id}/end-sessions`)).status).toBe(204);
    for (const s of sams) expect((await me(s)).status).toBe(401);
  });

  test("a correctly signed token naming someone else's session is refused", async () => {
    const nina = await signInToken(DEMO.organiser);
    const ada = t.db.select().from(users).where(eq(users.email, DEMO.admin)).get()!;
    // Our own secret, Nina's live session, but Ada as the subject: a forged claim to her rights.
    const forged = await signSessionToken(t.deps.sessionSecret, claims(nina).sid, ada.id, new Date(Date.now() + 3_600_000));
    expect((await me(forged)).status).toBe(401);
    // And a session id that does not exist.
    const ghost = await signSessionToken(t.deps.sessionSecret, 'no-such-session', ada.id, new Date(Date.now() + 3_600_000));
    expect((await me(ghost)).status).toBe(401);
  });
});

describe('certificate signatures', () => {
  let jws = '';
  let jwks: { keys: (JWK & { kid: string })[] } = { keys: [] };
  let number = '';
  let pdf: Buffer = Buffer.alloc(0);

  beforeAll(async () => {
    const { annex } = await venueIds(t);
    const marco = await t.agentFor(DEMO.director);
    const signed = await marco.post(`/api/venues/${annex}/sign-off`).send({ password: DEMO_PASSWORD });
    expect(signed.status).toBe(201);
    number = (signed.body.certificates as { number: string; kind: string }[]).find((c) => c.kind === 'strip')!.number;
    jws = (await t.request.get(`/api/verify/${number}`)).body.jws;
    jwks = (await t.request.get('/.well-known/jwks.json')).body;
    const res = await marco
      .get(`/api/certificates/${number}/pdf`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    pdf = res.body as Buffer;
  });

  async function verifies(candidate: string) {
    const kid = JSON.parse(Buffer.from(jws.split('.')[0], 'base64url').toString()).kid as string;
    const key = await importJWK(
      jwks.keys.find((k) => k.kid === kid)!,
      'EdDSA',
    );
    try {
      await compactVerify(candidate, key, { algorithms: ['EdDSA'] });
      return true;
    } catch {
      return false;
    }
  }

  test('the issued JWS verifies with the published key (/.well-known/jwks.json)', async () => {
    expect(await verifies(jws)).toBe(true);
  });

  test(
    'the JWS altered at any position of its header and signature, and at a sample of its payload, fails verification',
    { timeout: 60_000 },
    async () => {
      const [h, p] = jws.split('.');
      const positions = new Set<number>();
      for (let i = 0; i <= h.length; i++) positions.add(i); // header and the first dot
      for (let i = h.length + 1 + p.length; i < jws.length; i++) positions.add(i); // second dot and signature
      for (let k = 0; k < 400; k++) positions.add(h.length + 1 + Math.floor((k * p.length) / 400)); // payload, evenly
      const signature = Buffer.from(jws.split('.')[2], 'base64url');
      const accepted: number[] = [];
      for (const i of positions) for (const shift of [1, 7]) if (await verifies(alterAt(jws, i, shift))) accepted.push(i);
      // As with the session token: only the final character's unused bits can change, and then the
      // signature bytes are the same ones; nothing that was signed can be altered.
      for (const i of accepted) {
        expect(i, `position ${i} of ${jws.length} was accepted`).toBe(jws.length - 1);
        expect(Buffer.from(alterAt(jws, i).split('.')[2], 'base64url')).toEqual(signature);
      }
    },
  );

  test('a PDF altered by one byte anywhere is not recognised by POST /api/verify/file', { timeout: 60_000 }, async () => {
    const check = (file: Buffer) => t.request.post('/api/verify/file').set('Origin', ORIGIN).attach('file', file, 'certificate.pdf');
    const ok = await check(pdf);
    expect(ok.body).toMatchObject({ match: true, certificate: { number } });
    for (let k = 0; k < 40; k++) {
      const i = Math.floor((k * (pdf.length - 1)) / 39);
      const changed = Buffer.from(pdf);
      changed[i] ^= 0x01;
      const res = await check(changed);
      // The first bytes are the PDF signature: changing them makes it "not a PDF" (415).
      if (i < 5) expect(res.status).toBe(415);
      else expect(res.body, `byte ${i}`).toMatchObject({ match: false });
    }
  });
});
