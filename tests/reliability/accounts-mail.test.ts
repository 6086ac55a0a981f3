// Accounts and mail: the outbox hands out no accounts, a reset answers alike for every address,
// password guessing is slowed per address and per account, common passwords are refused, and a
// request naming a host we do not serve is refused (DNS rebinding).
import { afterAll, beforeAll, describe, expect, test, vi } from 'vitest';
import supertest from 'supertest';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, DEMO_PASSWORD, ORIGIN, type TestApp } from '../setup/test-app';
import { addOtherOrg, OTHER_ADMIN, OTHER_PASSWORD } from '../setup/other-org';
import { capturedMail, users } from '../../server/db/schema';
import { WITHHELD_LINK } from '../../server/mail/one-time-links';
import { venueIds } from '../api/testing-helpers';
import { startChildServer, type ChildServer } from './child-server';

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
};

describe('the outbox', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
    await addOtherOrg(t);
  });
  afterAll(() => t.close());

  test("another organisation's admin sees none of our messages: not in the list, and 404 for each", async () => {
    const ada = await t.agentFor(DEMO.admin);
    expect((await ada.post('/api/users').send({ email: 'kim@lakeshore.example', name: 'Kim Ashby', role: 'technician' })).status).toBe(201);
    const ours = (await ada.get('/api/mail')).body as { id: number; toAddresses: string }[];
    const invitation = ours.find((m) => m.toAddresses === 'kim@lakeshore.example');
    expect(invitation).toBeDefined();

    const hilltop = await t.agentFor(OTHER_ADMIN, OTHER_PASSWORD);
    const theirs = (await hilltop.get('/api/mail')).body as { id: number }[];
    expect(theirs.map((m) => m.id)).not.toContain(invitation!.id);
    const peek = await hilltop.get(`/api/mail/${invitation!.id}`);
    expect(peek.status).toBe(404);
    expect(peek.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(JSON.stringify(peek.body)).not.toMatch(/set-password/);
  });

  test("a reset link for the director is withheld from our own admin's outbox (list and message), the rest of the message is there", async () => {
    const ada = await t.agentFor(DEMO.admin);
    const before = t.oneTimeLinks.length;
    expect((await t.request.post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email: DEMO.director })).status).toBe(202);
    const { link, token } = await t.linkSentTo(DEMO.director, { after: before });

    const list = await ada.get('/api/mail');
    expect(JSON.stringify(list.body)).not.toContain(token);
    const reset = (list.body as { id: number; toAddresses: string; subject: string }[]).find(
      (m) => m.toAddresses === DEMO.director && /reset/i.test(m.subject),
    );
    expect(reset).toBeDefined();
    const message = await ada.get(`/api/mail/${reset!.id}`);
    expect(message.status).toBe(200);
    expect(JSON.stringify(message.body)).not.toContain(token);
    expect(message.body.text).not.toMatch(/\/set-password\/[A-Za-z0-9_-]+/);
    expect(message.body.text).toContain(WITHHELD_LINK);
    // Everything else is kept: who it is for, the greeting, how long the link lasts.
    expect(message.body.text).toContain('Hello Marco Dal Bello');
    expect(message.body.text).toMatch(/expires in 2 hours/);

    // Nothing stored holds it either (a database backup hands out no accounts).
    const stored = t.db.select().from(capturedMail).where(eq(capturedMail.id, reset!.id)).get()!;
    expect(`${stored.text}${stored.html ?? ''}${stored.raw}`).not.toContain(token);
    // The link printed on the console is the real one: it works for the person it was sent to.
    expect(link).toBe(`${ORIGIN}/set-password/${token}`);
    expect((await t.request.get(`/api/auth/set-password/${token}`)).body).toMatchObject({ email: DEMO.director, purpose: 'reset' });
  });

  test('a message stored before links were withheld is shown with its link withheld', async () => {
    const orgId = t.db.select().from(users).where(eq(users.email, DEMO.admin)).get()!.orgId;
    const old = t.db
      .insert(capturedMail)
      .values({
        orgId,
        fromAddress: 'x',
        toAddresses: DEMO.organiser,
        subject: 'Reset your Stripwarden password',
        text: `Here: ${ORIGIN}/set-password/abcDEF123_-xyz\n`,
        raw: '',
      })
      .returning()
      .get();
    const ada = await t.agentFor(DEMO.admin);
    const shown = await ada.get(`/api/mail/${old.id}`);
    expect(shown.body.text).toBe(`Here: ${WITHHELD_LINK}\n`);
  });
});

describe('POST /api/auth/password-reset', () => {
  // The real server in a child process: in-process, the test's own client would wait for the work
  // the server does after answering, and the time measured would not be what a caller sees.
  let server: ChildServer;
  const links: string[] = [];
  beforeAll(async () => {
    server = await startChildServer(4413, undefined, { onLine: (line) => line.includes('One-time link for') && links.push(line) });
  });
  afterAll(() => server?.stop());

  test('an existing address and an unknown one answer in the same time (medians within 20 ms)', { timeout: 120_000 }, async () => {
    const ask = async (email: string) => {
      const t0 = performance.now();
      const res = await fetch(`${server.base}/api/auth/password-reset`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', Origin: server.base },
        body: JSON.stringify({ email }),
      });
      const ms = performance.now() - t0;
      expect(res.status).toBe(202);
      await res.arrayBuffer();
      return ms;
    };
    /** Waits until the server has printed the link of the n-th reset mail: it is idle again. */
    const mailed = async (n: number) => {
      for (let i = 0; i < 500 && links.length < n; i++) await new Promise((r) => setTimeout(r, 20));
      expect(links.length).toBe(n);
    };
    const known: number[] = [];
    const unknown: number[] = [];
    // Alternating pairs, the first few as warm-up; after each existing address the test waits for its
    // mail to go out, so every request starts on an idle server.
    for (let i = 0; i < 40; i++) {
      const k = await ask(DEMO.organiser);
      await mailed(i + 1);
      const u = await ask(`nobody-${i}@lakeshore.example`);
      if (i >= 5) {
        known.push(k);
        unknown.push(u);
      }
    }
    expect(links.every((l) => l.includes(DEMO.organiser))).toBe(true);
    const difference = Math.abs(median(known) - median(unknown));
    expect(difference, `median known ${median(known).toFixed(1)} ms, unknown ${median(unknown).toFixed(1)} ms`).toBeLessThan(20);
  });
});

describe('password guessing', () => {
  let t: TestApp;
  // Three wrong passwords per address in the window (SIGNIN_RATE_LIMIT); the per-account slowing
  // starts after five, whatever the addresses.
  beforeAll(async () => {
    t = await createTestApp({ env: { SIGNIN_RATE_LIMIT: '3' } });
  });
  afterAll(() => {
    vi.useRealTimers();
    return t.close();
  });

  // Requests come through a proxy on loopback ('trust proxy'), so X-Forwarded-For names the address.
  const from = (address: string) => ({
    signIn: (email: string, password: string) =>
      t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).set('X-Forwarded-For', address).send({ email, password }),
  });

  test('one address trying many e-mails is stopped after the limit: 429, Retry-After, problem+json, before any password is checked', async () => {
    const attacker = from('203.0.113.7');
    for (let i = 0; i < 3; i++) expect((await attacker.signIn(`guess-${i}@lakeshore.example`, 'wrong-password')).status).toBe(401);
    const stopped = await attacker.signIn('guess-9@lakeshore.example', 'wrong-password');
    expect(stopped.status).toBe(429);
    expect(Number(stopped.headers['retry-after'])).toBeGreaterThan(0);
    expect(stopped.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(stopped.body.code).toBe('too-many-attempts');
    // The address is stopped, not the accounts: the same person from elsewhere signs in.
    expect((await from('198.51.100.20').signIn(DEMO.technician, DEMO_PASSWORD)).status).toBe(200);
  });

  test('successful sign-ins are not counted: a venue behind one address signs in as often as it needs', async () => {
    const venue = from('198.51.100.30');
    for (let i = 0; i < 8; i++) expect((await venue.signIn(DEMO.annexTechnician, DEMO_PASSWORD)).status).toBe(200);
    expect((await venue.signIn(DEMO.annexTechnician, 'typo-password')).status).toBe(401);
  });

  test('one account tried from many addresses is slowed, not locked: after five failures it must wait, then the right password works', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(Date.now());
    for (let i = 0; i < 5; i++) expect((await from(`192.0.2.${10 + i}`).signIn(DEMO.organiser, 'wrong-password')).status).toBe(401);
    const slowed = await from('192.0.2.50').signIn(DEMO.organiser, DEMO_PASSWORD);
    expect(slowed.status).toBe(429);
    const wait = Number(slowed.headers['retry-after']);
    expect(wait).toBeGreaterThanOrEqual(1);
    expect(wait).toBeLessThanOrEqual(60);
    expect(slowed.headers['content-type']).toMatch(/^application\/problem\+json/);
    vi.setSystemTime(Date.now() + wait * 1000);
    const after = await from('192.0.2.51').signIn(DEMO.organiser, DEMO_PASSWORD);
    expect(after.status, JSON.stringify(after.body)).toBe(200);
    // The success cleared the count: a typo afterwards is an ordinary 401.
    expect((await from('192.0.2.52').signIn(DEMO.organiser, 'typo-password')).status).toBe(401);
    vi.useRealTimers();
  });

  test('the password re-entered at sign-off is limited the same way (per address, 429 with Retry-After)', async () => {
    const { annex } = await venueIds(t);
    const marco = supertest.agent(t.app).set('Origin', ORIGIN).set('X-Forwarded-For', '203.0.113.99');
    expect((await marco.post('/api/auth/sign-in').send({ email: DEMO.director, password: DEMO_PASSWORD })).status).toBe(200);
    for (let i = 0; i < 3; i++)
      expect((await marco.post(`/api/venues/${annex}/sign-off`).send({ password: 'not-my-password' })).status).toBe(401);
    const stopped = await marco.post(`/api/venues/${annex}/sign-off`).send({ password: DEMO_PASSWORD });
    expect(stopped.status).toBe(429);
    expect(Number(stopped.headers['retry-after'])).toBeGreaterThan(0);
    expect(stopped.headers['content-type']).toMatch(/^application\/problem\+json/);
  });

  test('the sign-off password is slowed per account across addresses', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(Date.now() + 16 * 60_000);
    const { annex } = await venueIds(t);
    const marco = supertest.agent(t.app).set('Origin', ORIGIN);
    const as = (address: string) => marco.set('X-Forwarded-For', address);
    expect((await as('192.0.2.100').post('/api/auth/sign-in').send({ email: DEMO.director, password: DEMO_PASSWORD })).status).toBe(200);
    for (let i = 0; i < 5; i++)
      expect(
        (
          await as(`192.0.2.${110 + i}`)
            .post(`/api/venues/${annex}/sign-off`)
            .send({ password: 'not-my-password' })
        ).status,
      ).toBe(401);
    const slowed = await as('192.0.2.120').post(`/api/venues/${annex}/sign-off`).send({ password: 'not-my-password' });
    expect(slowed.status).toBe(429);
    expect(Number(slowed.headers['retry-after'])).toBeGreaterThanOrEqual(1);
    vi.useRealTimers();
  });
});

describe('choosing a password', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  async function inviteLink(email: string) {
    const ada = await t.agentFor(DEMO.admin);
    expect((await ada.post('/api/users').send({ email, name: 'Robin Hale', role: 'technician' })).status).toBe(201);
    return (await t.linkSentTo(email)).token;
  }

  test('a password from the list of common passwords is refused with a clear message on the field (OWASP ASVS 5.0 6.2.4)', async () => {
    const token = await inviteLink('robin@lakeshore.example');
    for (const common of ['password', 'Password123!', 'iloveyou', 'qwertyuiop', 'sunshine2026']) {
      const res = await t.request.post(`/api/auth/set-password/${token}`).set('Origin', ORIGIN).send({ password: common });
      expect(res.status, common).toBe(422);
      expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
      expect(res.body.code).toBe('common-password');
      expect(res.body.errors).toEqual([{ path: 'password', message: expect.stringMatching(/commonly used passwords/) }]);
    }
    // The person's own e-mail or name, and the product's name, count as common here (ASVS 6.2.11).
    for (const context of ['robin@lakeshore.example', 'RobinHale', 'stripwarden']) {
      expect(
        (await t.request.post(`/api/auth/set-password/${token}`).set('Origin', ORIGIN).send({ password: context })).status,
        context,
      ).toBe(422);
    }
    // The link still works: nothing was set.
    expect((await t.request.get(`/api/auth/set-password/${token}`)).status).toBe(200);
  });

  test('an uncommon password is accepted, the demo password among them', async () => {
    const token = await inviteLink('jo@lakeshore.example');
    const res = await t.request.post(`/api/auth/set-password/${token}`).set('Origin', ORIGIN).send({ password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    expect(
      (await t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: 'jo@lakeshore.example', password: DEMO_PASSWORD }))
        .status,
    ).toBe(200);
  });
});

describe('the Host header', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ env: { ALLOWED_HOSTS: 'hall.lakeshore.example, tablets.example.org' } });
  });
  afterAll(() => t.close());

  test('a write from a rebinding domain (Origin equal to its own Host) is refused with 421 problem+json, and changes nothing', async () => {
    const before = t.db.select().from(users).all().length;
    const ada = await t.agentFor(DEMO.admin);
    const res = await ada
      .post('/api/users')
      .set('Host', 'rebind.attacker.example:3999')
      .set('Origin', 'http://rebind.attacker.example:3999')
      .send({ email: 'mallory@lakeshore.example', name: 'Mallory', role: 'admin' });
    expect(res.status).toBe(421);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.code).toBe('unknown-host');
    expect(t.db.select().from(users).all().length).toBe(before);
  });

  test('reads and pages under an unknown host are refused as well', async () => {
    for (const host of ['evil.example', 'localhost.evil.example:3999', 'stripwarden.example']) {
      const res = await t.request.get('/api/health').set('Host', host);
      expect(res.status, host).toBe(421);
    }
  });

  test('IP literals, localhost, the host of APP_ORIGIN and ALLOWED_HOSTS are served', async () => {
    for (const host of [
      '192.168.1.20:3000',
      '10.0.0.5',
      '[::1]:3999',
      '[fe80::1]',
      'localhost',
      'LOCALHOST:3999',
      'hall.lakeshore.example',
      'Tablets.Example.org:8080',
    ]) {
      const res = await t.request.get('/api/health').set('Host', host);
      expect(res.status, host).toBe(200);
    }
    // A tablet on the hall's address writes with its page's origin, as before.
    const ada = supertest.agent(t.app).set('Host', '192.168.1.20:3000').set('Origin', 'http://192.168.1.20:3000');
    expect((await ada.post('/api/auth/sign-in').send({ email: DEMO.admin, password: DEMO_PASSWORD })).status).toBe(200);
  });
});
