// Every kind of message the app sends, read back from the local SMTP server with mailparser (the
// same parser a mail client library uses): a text part and an HTML part (multipart/alternative,
// RFC 2046 §5.1.4), the organisation, the sign-in address and a person to ask, and nothing of a
// hostile organisation name run as markup.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { simpleParser } from 'mailparser';
import { createTestApp, DEMO, DEMO_PASSWORD, ORIGIN, type TestApp } from '../setup/test-app';
import { venueIds } from './testing-helpers';
import { capturedMail, organisations, users } from '../../server/db/schema';
import { WITHHELD_LINK } from '../../server/mail/one-time-links';

const HOSTILE = `Lakeshore <script>alert("x")</script> & <img src=http://evil.example/p.png> Co`;

let t: TestApp;
let annexId: string;
beforeAll(async () => {
  t = await createTestApp();
  ({ annex: annexId } = await venueIds(t));
  const ada = t.db.select().from(users).where(eq(users.email, DEMO.admin)).get()!;
  t.db.update(organisations).set({ name: HOSTILE }).where(eq(organisations.id, ada.orgId)).run();
});
afterAll(() => t.close());

const lastMailTo = async (to: string) => {
  // A reset is sent after its answer: wait for the message itself (no fixed delay).
  for (let i = 0; i < 500; i++) {
    const m = t.db
      .select()
      .from(capturedMail)
      .all()
      .filter((x) => x.toAddresses.includes(to))
      .at(-1);
    if (m) return m;
    await new Promise((r) => setTimeout(r, 20));
  }
  throw new Error(`no message to ${to}`);
};

/** The checks every HTML part must pass: escaped, self-contained, its links ours or mailto. */
function expectSafeHtml(html: string) {
  expect(html).not.toMatch(/<script/i);
  expect(html).not.toMatch(/<img/i);
  // No tag loads anything (the escaped name still reads "src=" as text).
  expect(html).not.toMatch(/<[^>]*\ssrc=/i);
  expect(html).not.toMatch(/<link|<style|<iframe|<object|url\(/i);
  expect(html).toContain('Lakeshore &lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; &lt;img src=http://evil.example/p.png&gt; Co');
  // The stored copy has each one-time link replaced by the withheld note, in the href too.
  for (const [, href] of html.matchAll(/href="([^"]*)"/g))
    expect(href.startsWith(`${ORIGIN}/`) || href.startsWith('mailto:') || href === WITHHELD_LINK, href).toBe(true);
}

describe('e-mail as people expect it', () => {
  test('an invitation: both parts, the organisation, the sign-in address, the inviting admin by name and e-mail; the link withheld from both', async () => {
    const ada = await t.agentFor(DEMO.admin);
    const res = await ada.post('/api/users').send({ email: 'new.tech@lakeshore.example', name: 'Robin Ash', role: 'technician' });
    expect(res.status).toBe(201);
    const m = await lastMailTo('new.tech@lakeshore.example');
    // Only the headers are kept of a message that carried a one-time link; they say multipart/alternative.
    expect(m.raw).toMatch(/Content-Type: multipart\/alternative/i);
    expect(m.text).toContain(HOSTILE);
    expect(m.text).toContain(`Sign in: ${ORIGIN}/sign-in`);
    expect(m.text).toContain('Ada');
    expect(m.text).toContain(DEMO.admin);
    expect(m.text).toContain(WITHHELD_LINK);
    expect(m.html).not.toBeNull();
    expectSafeHtml(m.html!);
    expect(m.html).toContain(`href="mailto:${DEMO.admin}"`);
    expect(m.html).toContain(`href="${ORIGIN}/sign-in"`);
    expect(m.html).not.toMatch(/set-password\/[A-Za-z0-9_-]{10}/);
    const { link } = await t.linkSentTo('new.tech@lakeshore.example');
    expect(link.startsWith(`${ORIGIN}/set-password/`)).toBe(true);
  });

  test('a password reset names an administrator to ask', async () => {
    const res = await t.request.post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email: DEMO.technician });
    expect(res.status).toBeLessThan(300);
    const m = await lastMailTo(DEMO.technician);
    expect(m.subject).toBe('Reset your Stripwarden password');
    expect(m.text).toContain(`Sign in: ${ORIGIN}/sign-in`);
    expect(m.text).toContain(DEMO.admin);
    expect(m.text).toContain(HOSTILE);
    expectSafeHtml(m.html!);
  });

  test('the sign-off notice, parsed whole with mailparser: text and HTML with the links, the director to ask, the signing time with its offset', async () => {
    const marco = await t.agentFor(DEMO.director);
    const res = await marco.post(`/api/venues/${annexId}/sign-off`).send({ password: DEMO_PASSWORD });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const m = await lastMailTo(DEMO.organiser);
    const parsed = await simpleParser(m.raw);
    expect(parsed.headers.get('content-type')).toMatchObject({ value: 'multipart/alternative' });
    const text = parsed.text ?? '';
    const html = typeof parsed.html === 'string' ? parsed.html : '';
    expect(text).toContain('Hello Nina');
    expect(text).toContain(`${ORIGIN}/venues/${annexId}/certificates`);
    expect(text).toContain(`Sign in: ${ORIGIN}/sign-in`);
    expect(text).toContain(`Marco Dal Bello (the technical director of the event) at ${DEMO.director}`);
    // The annex keeps the default zone, Europe/London: UTC+00:00 in winter, UTC+01:00 in summer (IANA tz database, Rule EU).
    expect(text).toMatch(/signed off Riverside Annex for Autumn Cup 2026 on \d{1,2} \w{3} \d{4}, \d{2}:\d{2} \(UTC\+0[01]:00\)/);
    expectSafeHtml(html);
    expect(html).toContain(`<a href="${ORIGIN}/venues/${annexId}/certificates">`);
    for (const c of res.body.certificates as { number: string }[]) {
      expect(text).toContain(`${ORIGIN}/verify/${c.number}`);
      expect(html).toContain(`<a href="${ORIGIN}/verify/${c.number}">`);
    }
    expect(html).toContain(`href="mailto:${DEMO.director}"`);
  });
});
