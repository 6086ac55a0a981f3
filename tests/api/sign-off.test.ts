import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { compactVerify, createLocalJWKSet, decodeProtectedHeader } from 'jose';
import type supertest from 'supertest';
import type superagent from 'superagent';
import { createTestApp, DEMO, DEMO_PASSWORD, type TestApp } from '../setup/test-app';
import { pdfText, readPdf } from '../setup/pdf-read';
import { venueIds } from './testing-helpers';
import { capturedMail, certificates, events, readings, signOffs, users, venues } from '../../server/db/schema';
import { hashPassword, TEST_SCRYPT } from '../../server/auth/password';
import { reopenIfSignedOff } from '../../server/services/venue-lifecycle';
import { placeOf, renderCertificatePdf } from '../../server/pdf/certificate-pdf';
import { allocateNumbers } from '../../server/services/sign-off-render';
import type { CertificatePayload } from '../../server/signing/certificate-record';
import { keyIdOf, newPrivateJwk, privateKeyFromText, publicJwkOf, writeKeyFile } from '../../server/signing/signing-keys';

let t: TestApp;
let hallId: string;
let annexId: string;
beforeAll(async () => {
  t = await createTestApp();
  ({ hall: hallId, annex: annexId } = await venueIds(t));
});
afterAll(() => t.close());

type Agent = ReturnType<typeof supertest.agent>;
interface IssuedDto {
  number: string;
  kind: 'venue' | 'strip';
  stripId?: string;
  status: string;
}

const binary = (res: superagent.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};
const download = async (agent: Agent, path: string) => agent.get(path).buffer(true).parse(binary);

/** File names in a ZIP, from its central directory (APPNOTE 4.3.12). */
function zipNames(zip: Buffer): string[] {
  const names: string[] = [];
  for (let i = 0; i + 46 <= zip.length; i++) {
    if (zip.readUInt32LE(i) !== 0x02014b50) continue;
    const nameLen = zip.readUInt16LE(i + 28);
    names.push(zip.subarray(i + 46, i + 46 + nameLen).toString('utf8'));
    i += 45 + nameLen;
  }
  return names;
}

async function signOffAnnex(extra: Record<string, unknown> = {}) {
  const marco = await t.agentFor(DEMO.director);
  const res = await marco.post(`/api/venues/${annexId}/sign-off`).send({ password: DEMO_PASSWORD, ...extra });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.certificates as IssuedDto[];
}

function reopenAnnex(reason = 'A reading was added after sign-off.') {
  const v = t.db.select().from(venues).where(eq(venues.id, annexId)).get()!;
  const ev = t.db.select().from(events).where(eq(events.id, v.eventId)).get()!;
  t.db.transaction((tx) => {
    reopenIfSignedOff(tx, { venueId: annexId, orgId: ev.orgId, actorId: ev.directorId!, reason });
  });
}

describe('GET /api/venues/:id/readiness', () => {
  test('when every required reading of the annex passes, then it is ready, with no issues', async () => {
    const nina = await t.agentFor(DEMO.organiser);
    const res = await nina.get(`/api/venues/${annexId}/readiness`);
    expect(res.status).toBe(200);
    expect(res.body.ready).toBe(true);
    expect(res.body.issues).toEqual([]);
    expect(res.body.strips.map((s: { label: string; state: string }) => [s.label, s.state])).toEqual([
      ['Annex 1', 'ready'],
      ['Annex 2', 'ready'],
      ['Annex 3', 'ready'],
      ['Annex 4', 'ready'],
    ]);
    expect(res.body.canSignOff).toBe(false);
  });

  test('when the hall is part-way, then it lists the failing Strip 6 short, the near-limit Strip 2 reading and the untested strips', async () => {
    const marco = await t.agentFor(DEMO.director);
    const res = await marco.get(`/api/venues/${hallId}/readiness`);
    expect(res.body.ready).toBe(false);
    expect(res.body.canSignOff).toBe(true);
    const strip6 = res.body.strips.find((s: { label: string }) => s.label === 'Strip 6');
    expect(strip6.state).toBe('failing');
    expect(strip6.failing).toEqual([
      expect.objectContaining({
        positionName: 'Left floor cable',
        testKind: 'insulation',
        conductors: 'A-B',
        stepId: expect.any(String),
        readingId: expect.any(String),
      }),
    ]);
    expect(res.body.strips.find((s: { label: string }) => s.label === 'Strip 24').state).toBe('missing');
    // Near limit passes, so Strip 2 is not blocking, but it is not certified here either: the
    // list of near-limit readings covers strips that would be certified.
    expect(res.body.strips.find((s: { label: string }) => s.label === 'Strip 2')).toMatchObject({ state: 'ready' });
    expect(res.body.nearLimit).toContainEqual(
      expect.objectContaining({ stripLabel: 'Strip 2', positionName: 'Left floor cable', conductors: 'A' }),
    );
  });

  test('a technician of another venue gets 403', async () => {
    const lee = await t.agentFor(DEMO.annexTechnician);
    expect((await lee.get(`/api/venues/${hallId}/readiness`)).status).toBe(403);
  });
});

describe('POST /api/venues/:id/sign-off — who may sign', () => {
  test('the organiser, a technician and an admin get 403', async () => {
    for (const who of [DEMO.organiser, DEMO.annexTechnician, DEMO.admin]) {
      const agent = await t.agentFor(who);
      const res = await agent.post(`/api/venues/${annexId}/sign-off`).send({ password: DEMO_PASSWORD });
      expect(res.status, who).toBe(403);
    }
  });

  test('another director of the same organisation, who is not this event’s director, gets 403', async () => {
    const marco = t.db.select().from(users).where(eq(users.email, DEMO.director)).get()!;
    t.db
      .insert(users)
      .values({
        id: randomUUID(),
        orgId: marco.orgId,
        email: 'second.director@lakeshore.example',
        name: 'Second Director',
        role: 'director',
        passwordHash: await hashPassword(DEMO_PASSWORD, TEST_SCRYPT),
      })
      .run();
    const other = await t.agentFor('second.director@lakeshore.example');
    const res = await other.post(`/api/venues/${annexId}/sign-off`).send({ password: DEMO_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.detail).toMatch(/technical director of this event/);
  });

  test('when the password is wrong, then 401 and nothing is written', async () => {
    const marco = await t.agentFor(DEMO.director);
    const res = await marco.post(`/api/venues/${annexId}/sign-off`).send({ password: 'not-the-password' });
    expect(res.status).toBe(401);
    expect(res.body.code).toBe('wrong-password');
    expect(t.db.select().from(signOffs).all()).toHaveLength(0);
    expect(t.db.select().from(certificates).all()).toHaveLength(0);
    expect(existsSync(join(t.dir, 'certificates')) ? readdirSync(join(t.dir, 'certificates')) : []).toEqual([]);
    // The director is still signed in: a wrong re-entered password does not end the session.
    expect((await marco.get('/api/auth/me')).status).toBe(200);
  });

  test('when the hall is not ready, then 409 problem+json lists what is missing or failing, Strip 6 among them', async () => {
    const marco = await t.agentFor(DEMO.director);
    const res = await marco.post(`/api/venues/${hallId}/sign-off`).send({ password: DEMO_PASSWORD });
    expect(res.status).toBe(409);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(res.body.code).toBe('not-ready');
    const strip6 = res.body.issues.filter((i: { stripLabel: string }) => i.stripLabel === 'Strip 6');
    expect(strip6.map((i: { kind: string }) => i.kind)).toEqual(expect.arrayContaining(['failing', 'open-fault']));
    expect(res.body.strips.map((s: { label: string }) => s.label)).toEqual(expect.arrayContaining(['Strip 6', 'Strip 11', 'Strip 24']));
    expect(t.db.select().from(signOffs).all()).toHaveLength(0);
  });

  test('an exception naming a strip of another venue is refused with 422', async () => {
    const marco = await t.agentFor(DEMO.director);
    const hallStrips = (await marco.get(`/api/venues/${hallId}/strips`)).body as { id: string }[];
    const res = await marco
      .post(`/api/venues/${annexId}/sign-off`)
      .send({ password: DEMO_PASSWORD, exceptions: [{ stripId: hallStrips[0].id, reason: 'Not used this year' }] });
    expect(res.status).toBe(422);
  });
});

describe('POST /api/venues/:id/sign-off — while the certificates are made', () => {
  test('when a reading of the venue arrives while its certificates are rendered, then 409 changed-meanwhile and nothing is written', async () => {
    const marco = await t.agentFor(DEMO.director);
    const annexStrips = (await marco.get(`/api/venues/${annexId}/strips`)).body as { id: string }[];
    const strip = (await marco.get(`/api/strips/${annexStrips[0].id}`)).body as {
      positions: { steps: { id: string; testKind: string }[] }[];
    };
    // An insulation step: over range passes, so the annex stays ready for the tests after this one.
    const step = strip.positions.flatMap((p) => p.steps).find((st) => st.testKind === 'insulation')!;
    const workers = t.deps.workers;
    const run = workers.run;
    let recorded = 0;
    workers.run = (async (...args: Parameters<typeof run>) => {
      if (args[0] === 'renderCertificatePdf' && recorded === 0) {
        // The step measured again, stamped as its last reading was (so the certificates' testing
        // period, and page 1, stay as the tests after this one expect).
        const last = t.db.select().from(readings).where(eq(readings.stepId, step.id)).all().at(-1)!;
        t.db
          .insert(readings)
          .values({ ...last, id: randomUUID(), requestHash: randomUUID() })
          .run();
        recorded = 1;
      }
      return run(...args);
    }) as typeof run;
    try {
      const res = await marco.post(`/api/venues/${annexId}/sign-off`).send({ password: DEMO_PASSWORD });
      expect(recorded).toBe(1);
      expect(res.status, JSON.stringify(res.body)).toBe(409);
      expect(res.body.code).toBe('changed-meanwhile');
    } finally {
      workers.run = run;
    }
    expect(t.db.select().from(signOffs).all()).toHaveLength(0);
    expect(t.db.select().from(certificates).all()).toHaveLength(0);
    expect(existsSync(join(t.dir, 'certificates')) ? readdirSync(join(t.dir, 'certificates')) : []).toEqual([]);
    expect(t.db.select().from(venues).where(eq(venues.id, annexId)).get()!.status).not.toBe('signed-off');
  });
});

describe('POST /api/venues/:id/sign-off — the certificates', () => {
  let issued: IssuedDto[];
  beforeAll(async () => {
    issued = await signOffAnnex({ statement: 'All four annex strips checked with the venue kit.' });
  });

  test('the director signs the annex off: one venue certificate and one per strip, the venue is frozen', async () => {
    expect(issued.filter((c) => c.kind === 'venue')).toHaveLength(1);
    expect(issued.filter((c) => c.kind === 'strip')).toHaveLength(4);
    for (const c of issued) {
      expect(c.number).toMatch(/^SW-\d{4}-[0-9A-Z]{4}-[0-9A-Z]{4}-[VS]$/);
      expect(c.status).toBe('valid');
    }
    expect(new Set(issued.map((c) => c.number)).size).toBe(5);
    expect(t.db.select().from(venues).where(eq(venues.id, annexId)).get()!.status).toBe('signed-off');
    const again = await (await t.agentFor(DEMO.director)).post(`/api/venues/${annexId}/sign-off`).send({ password: DEMO_PASSWORD });
    expect(again.status).toBe(409);
    expect(again.body.code).toBe('already-signed-off');
  });

  test('a number already given out, or drawn twice in one sign-off, is drawn again', () => {
    const given = issued[0]!.number;
    const draws = [given, 'SW-2026-AAAA-AAAA-S', 'SW-2026-AAAA-AAAA-S', 'SW-2026-BBBB-BBBB-V', 'SW-2026-CCCC-CCCC-S'];
    const asked: string[] = [];
    const strips = [
      { stripId: 's1', label: 'Strip 1', state: 'ready' as const },
      { stripId: 's2', label: 'Strip 2', state: 'ready' as const },
      { stripId: 's3', label: 'Strip 3', state: 'withdrawn' as const },
    ];
    const out = allocateNumbers(t.db, 2026, { strips }, (kind) => {
      asked.push(kind);
      return draws.shift()!;
    });
    // The venue's number was taken by the first sign-off; the second strip drew the first one's.
    expect(out.venueNumber).toBe('SW-2026-BBBB-BBBB-V');
    expect(out.stripNumbers).toEqual([
      { stripId: 's1', label: 'Strip 1', number: 'SW-2026-AAAA-AAAA-S' },
      { stripId: 's2', label: 'Strip 2', number: 'SW-2026-CCCC-CCCC-S' },
    ]);
    expect(asked).toEqual(['venue', 'strip', 'strip', 'venue', 'strip']);
  });

  test('each stored file matches its recorded SHA-256 and is kept with owner-only key permissions', async () => {
    const rows = t.db.select().from(certificates).all();
    for (const row of rows) expect(row.pdfSha256).toMatch(/^[0-9a-f]{64}$/);
    const keyFile = join(t.dir, 'signing-key.jwk');
    expect(statSync(keyFile).mode & 0o777).toBe(0o600);
  });

  test("a certificate's JWS verifies with the published JWK Set, as an outside verifier would (jose createLocalJWKSet + compactVerify)", async () => {
    const jwksRes = await t.request.get('/.well-known/jwks.json');
    expect(jwksRes.status).toBe(200);
    const jwks = JSON.parse(jwksRes.text);
    expect(jwks.keys[0]).toMatchObject({ kty: 'OKP', crv: 'Ed25519', alg: 'EdDSA', use: 'sig', kid: expect.any(String) });
    expect(jwks.keys[0].d).toBeUndefined();
    const v = await t.request.get(`/api/verify/${issued[0].number}`);
    const { payload, protectedHeader } = await compactVerify(v.body.jws, createLocalJWKSet(jwks), { algorithms: ['EdDSA'] });
    expect(protectedHeader).toMatchObject({ alg: 'EdDSA', typ: 'stripwarden-cert+jws', kid: jwks.keys[0].kid });
    const record = JSON.parse(new TextDecoder().decode(payload)) as CertificatePayload;
    expect(record).toMatchObject({
      number: issued[0].number,
      kind: 'venue',
      venue: { name: 'Riverside Annex' },
      event: { name: 'Autumn Cup 2026' },
    });
    expect(record.strips.map((s) => s.label)).toEqual(['Annex 1', 'Annex 2', 'Annex 3', 'Annex 4']);
    expect(record.readings.digest).toMatch(/^[0-9a-f]{64}$/);
    expect(record.items.length).toBeGreaterThan(0);
    expect(record.signer.name).toBe('Marco Dal Bello');
  });

  test('a tampered payload does not verify', async () => {
    const jwks = JSON.parse((await t.request.get('/.well-known/jwks.json')).text);
    const v = await t.request.get(`/api/verify/${issued[0].number}`);
    const [h, p, s] = (v.body.jws as string).split('.');
    const record = JSON.parse(Buffer.from(p, 'base64url').toString('utf8'));
    record.venue.name = 'Somewhere else';
    const forged = `${h}.${Buffer.from(JSON.stringify(record)).toString('base64url')}.${s}`;
    await expect(compactVerify(forged, createLocalJWKSet(jwks))).rejects.toThrow();
    expect(decodeProtectedHeader(forged).alg).toBe('EdDSA');
  });

  test('the venue PDF names its number, the venue and every strip; each strip PDF its own strip (read back with PDF.js)', async () => {
    const nina = await t.agentFor(DEMO.organiser);
    const venue = issued.find((c) => c.kind === 'venue')!;
    const res = await download(nina, `/api/certificates/${venue.number}/pdf`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toBe(`attachment; filename="${venue.number}.pdf"`);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    const { pages, fonts } = await readPdf(res.body);
    const text = pages.join('\n');
    expect(text).toContain(venue.number);
    expect(text).toContain('Riverside Annex');
    for (const label of ['Annex 1', 'Annex 2', 'Annex 3', 'Annex 4']) expect(text).toContain(label);
    expect(text).toContain("not the building's electrical installation");
    expect(text).toMatch(/Page 1 of \d+/);
    // The fonts ship with the app and travel inside the file: nothing is left to the reader's machine.
    expect(fonts.length).toBeGreaterThan(0);
    for (const f of fonts) expect(f, f.name).toEqual({ name: expect.stringMatching(/^[A-Z]{6}\+IBMPlexSans-/), embedded: true });
    // The profile's temperature choice: the demo profile judges readings as measured.
    expect(text).toContain('Judged as measured (no correction)');
    for (const strip of issued.filter((c) => c.kind === 'strip')) {
      const s = await pdfText((await download(nina, `/api/certificates/${strip.number}/pdf`)).body);
      expect(s).toContain(strip.number);
      expect(s).toContain('Riverside Annex');
      expect(s).toContain(venue.number);
      expect(s).toContain('Judged as measured');
      // The annex strips' zone is "Annex": said once, not "Riverside Annex, Annex".
      expect(s).not.toMatch(/Riverside Annex[\s,]+Annex\b/);
    }
  });

  test('page 1 says who signed in plain words; the algorithm, key id and links are in the last annex (PDF.js)', async () => {
    const nina = await t.agentFor(DEMO.organiser);
    for (const c of issued) {
      const res = await download(nina, `/api/certificates/${c.number}/pdf`);
      const { pages } = await readPdf(res.body, { fonts: false });
      const row = t.db.select().from(certificates).where(eq(certificates.number, c.number)).get()!;
      const first = pages[0].replace(/\s+/g, ' ');
      expect(first).toContain('signed this certificate with its own digital key');
      expect(first).toMatch(/scan the code or open/);
      for (const technical of ['Ed25519', 'JWS', 'Key id', row.keyId, '/.well-known/jwks.json'])
        expect(first, c.number).not.toContain(technical);
      const last = pages.at(-1)!.replace(/\s+/g, ' ');
      expect(last).toContain('Signature details');
      expect(last).toContain('Ed25519');
      expect(last).toContain(row.keyId);
      expect(last).toContain('/.well-known/jwks.json');
    }
  });

  test('each strip lists its scoring apparatus with its floor cables, reels and piste by asset tag, on the strip and the venue certificates (PDF.js)', async () => {
    // The outside source is the venue plan as the planning screen loads it: what sits in each position.
    const nina = await t.agentFor(DEMO.organiser);
    const plan = (await nina.get(`/api/venues/${annexId}`)).body as {
      strips: { id: string; label: string; positions: { name: string; equipmentKind: string; equipment: { assetTag: string } | null }[] }[];
    };
    const flat = (text: string) => text.replace(/\s+/g, ' ');
    const bare = (text: string) => text.replace(/\s+/g, '').toUpperCase();
    const venuePdf = (await download(nina, `/api/certificates/${issued.find((c) => c.kind === 'venue')!.number}/pdf`)).body;
    const venueText = flat(await pdfText(venuePdf));
    expect(bare(venueText)).toContain(bare('SCORING APPARATUS · FLOOR CABLES · REELS · PISTE'));
    for (const strip of plan.strips) {
      const tagOf = (kind: string) => strip.positions.filter((p) => p.equipmentKind === kind).map((p) => p.equipment!.assetTag);
      const [apparatus] = tagOf('apparatus');
      expect(apparatus, `${strip.label} has a scoring apparatus in the plan`).toBeTruthy();
      const number = issued.find((c) => c.kind === 'strip' && c.stripId === strip.id)!.number;
      const stripPdf = (await download(nina, `/api/certificates/${number}/pdf`)).body;
      const first = flat((await readPdf(stripPdf, { fonts: false })).pages[0]);
      // Labels are drawn in spaced capitals: compare without spaces. The apparatus has no readings of
      // its own (common practice: its electronics are never metered), and the certificate says so.
      expect(bare(first)).toContain(bare(`SCORING APPARATUS ${apparatus}, not measured`));
      for (const tag of [...tagOf('floor-cable'), ...tagOf('reel'), ...tagOf('piste')]) expect(first).toContain(tag);
      expect(bare(first)).toContain(
        bare(
          `FLOOR CABLES ${tagOf('floor-cable')
            .map((tag, i) => `${tag} (${i === 0 ? 'Left' : 'Right'} floor cable)`)
            .join(', ')}`,
        ),
      );
      // On the venue certificate, the strip's row gives its apparatus, then its floor cables and reels, as the header says.
      expect(venueText).toContain(`${strip.label} Annex ${apparatus} · ${tagOf('floor-cable').join(', ')} · ${tagOf('reel').join(', ')}`);
    }
  });

  test('the place of a strip names its zone once', () => {
    expect(placeOf('Riverside Annex', 'Annex')).toBe('Riverside Annex');
    expect(placeOf('Riverside Sports Hall', 'Row A')).toBe('Riverside Sports Hall, Row A');
    expect(placeOf('Riverside Sports Hall', 'sports hall')).toBe('Riverside Sports Hall');
    expect(placeOf('Annexe Hall', 'Annex')).toBe('Annexe Hall, Annex');
    expect(placeOf('Riverside Annex', null)).toBe('Riverside Annex');
  });

  test('rendering the same record twice gives the same bytes', async () => {
    const row = t.db.select().from(certificates).where(eq(certificates.number, issued[1].number)).get()!;
    const doc = { payload: JSON.parse(row.payloadJson) as CertificatePayload, jws: row.jws, keyId: row.keyId, readings: [] };
    const [a, b] = [await renderCertificatePdf(doc), await renderCertificatePdf(doc)];
    expect(a.equals(b)).toBe(true);
  });

  test('the PDF writes its times in the venue zone with the offset (IANA tz database: Paris on CET, New York on EST in November)', async () => {
    const row = t.db.select().from(certificates).where(eq(certificates.number, issued[0].number)).get()!;
    const payload = { ...(JSON.parse(row.payloadJson) as CertificatePayload), signedAt: '2026-11-21T09:30:00.000Z' };
    const doc = { payload, jws: row.jws, keyId: row.keyId, readings: [] };
    const text = async (timeZone: string) =>
      (await readPdf(await renderCertificatePdf({ ...doc, timeZone }), { fonts: false })).pages.join(' ').replace(/\s+/g, ' ');
    // 09:30 UTC is 10:30 in Paris (UTC+01:00) and 04:30 in New York (UTC−05:00).
    const paris = await text('Europe/Paris');
    expect(paris).toContain('21 Nov 2026, 10:30 (UTC+01:00)');
    const ny = await text('America/New_York');
    expect(ny).toContain('21 Nov 2026, 04:30 (UTC-05:00)');
    expect(ny).not.toContain('UTC+01:00');
  });

  test('the organiser and the director got the e-mail with the verification and certificates links (fake SMTP)', async () => {
    const mail = t.db
      .select()
      .from(capturedMail)
      .all()
      .filter((m) => m.subject.startsWith('Signed off: Riverside Annex'));
    expect(mail.map((m) => m.toAddresses).sort()).toEqual([DEMO.director, DEMO.organiser]);
    const nina = mail.find((m) => m.toAddresses === DEMO.organiser)!;
    expect(nina.text).toContain(`/venues/${annexId}/certificates`);
    for (const c of issued) expect(nina.text).toContain(`/verify/${c.number}`);
  });

  test('the ZIP holds one venue PDF and one PDF per strip', async () => {
    const nina = await t.agentFor(DEMO.organiser);
    const res = await download(nina, `/api/venues/${annexId}/certificates.zip`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/zip');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="certificates-riverside-annex-\d{4}-\d{2}-\d{2}\.zip"$/);
    const names = zipNames(res.body);
    expect(names).toHaveLength(5);
    expect(names.filter((n) => n.startsWith('venue-'))).toEqual([`venue-${issued.find((c) => c.kind === 'venue')!.number}.pdf`]);
    for (const c of issued.filter((x) => x.kind === 'strip')) expect(names.some((n) => n.endsWith(`${c.number}.pdf`))).toBe(true);
  });

  test('the certificates list shows them to the organiser; a technician of another venue gets 403', async () => {
    const nina = await t.agentFor(DEMO.organiser);
    const res = await nina.get(`/api/venues/${annexId}/certificates`);
    expect(res.status).toBe(200);
    expect(res.body.certificates[0].kind).toBe('venue');
    expect(res.body.certificates).toHaveLength(5);
    expect(res.body.canRevoke).toBe(false);
    const sam = await t.agentFor(DEMO.technician);
    expect((await sam.get(`/api/venues/${annexId}/certificates`)).status).toBe(403);
    expect((await download(sam, `/api/certificates/${issued[0].number}/pdf`)).status).toBe(403);
  });
});

describe('public verification', () => {
  let issued: IssuedDto[];
  beforeAll(async () => {
    if (t.db.select().from(venues).where(eq(venues.id, annexId)).get()!.status === 'signed-off') reopenAnnex();
    issued = await signOffAnnex();
  });

  test('GET /api/verify/:number needs no sign-in and answers the status and details; typed in lower case it is still found', async () => {
    const res = await t.request.get(`/api/verify/${issued[0].number.toLowerCase()}`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      status: 'valid',
      number: issued[0].number,
      kind: 'venue',
      event: 'Autumn Cup 2026',
      venue: 'Riverside Annex',
      signedBy: 'Marco Dal Bello',
      issuedAt: expect.any(String),
      jws: expect.stringMatching(/^[\w-]+\.[\w-]+\.[\w-]+$/),
      pdfSha256: expect.stringMatching(/^[0-9a-f]{64}$/),
    });
  });

  test('an unknown or malformed number gets 404 and says nothing more', async () => {
    const unknown = await t.request.get('/api/verify/SW-2026-0000-0000-V');
    expect(unknown.status).toBe(404);
    expect(JSON.stringify(unknown.body)).not.toMatch(/Riverside|Annex|SW-2026-(?!0000)/);
    expect((await t.request.get('/api/verify/not-a-number')).status).toBe(404);
  });

  test('POST /api/verify/file recognises an issued PDF byte for byte, and not once one byte is changed', async () => {
    const marco = await t.agentFor(DEMO.director);
    const strip = issued.find((c) => c.kind === 'strip')!;
    const pdf = (await download(marco, `/api/certificates/${strip.number}/pdf`)).body as Buffer;
    const ok = await t.request.post('/api/verify/file').set('Origin', 'http://localhost:3999').attach('file', pdf, 'cert.pdf');
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ match: true, certificate: { number: strip.number, status: 'valid', kind: 'strip' } });
    const changed = Buffer.from(pdf);
    changed[Math.floor(changed.length / 2)] ^= 0x01;
    const bad = await t.request.post('/api/verify/file').set('Origin', 'http://localhost:3999').attach('file', changed, 'cert.pdf');
    expect(bad.status).toBe(200);
    expect(bad.body.match).toBe(false);
    expect(bad.body.certificate).toBeUndefined();
  });

  test('when an outside tool checks a PDF without an Origin header, then it gets its answer; other writes without one are still refused', async () => {
    const marco = await t.agentFor(DEMO.director);
    const strip = issued.find((c) => c.kind === 'strip')!;
    const pdf = (await download(marco, `/api/certificates/${strip.number}/pdf`)).body as Buffer;
    const plain = await t.request.post('/api/verify/file').attach('file', pdf, 'cert.pdf');
    expect(plain.status).toBe(200);
    expect(plain.body).toMatchObject({ match: true, certificate: { number: strip.number } });
    const signIn = await t.request.post('/api/auth/sign-in').send({ email: 'marco@lakeshore.example', password: 'demo-strip-2026' });
    expect(signIn.status).toBe(403);
  });

  test('POST /api/verify/file refuses a file that is not a PDF with 415, and a missing file with 422', async () => {
    const res = await t.request
      .post('/api/verify/file')
      .set('Origin', 'http://localhost:3999')
      .attach('file', Buffer.from('GIF89a not a pdf'), 'x.pdf');
    expect(res.status).toBe(415);
    const none = await t.request.post('/api/verify/file').set('Origin', 'http://localhost:3999').field('x', '1');
    expect([400, 422]).toContain(none.status);
  });

  test('when the venue is re-opened, its certificates say superseded; a new sign-off issues new numbers', async () => {
    reopenAnnex('A floor cable was swapped after sign-off.');
    const old = await t.request.get(`/api/verify/${issued[0].number}`);
    expect(old.body.status).toBe('superseded');
    expect(old.body.supersededAt).toEqual(expect.any(String));
    const fresh = await signOffAnnex();
    expect(fresh.map((c) => c.number)).not.toEqual(expect.arrayContaining([issued[0].number]));
    expect((await t.request.get(`/api/verify/${fresh[0].number}`)).body.status).toBe('valid');
    expect((await t.request.get(`/api/verify/${issued[0].number}`)).body.status).toBe('superseded');
    issued = fresh;
  });

  test('the director revokes a certificate with a reason; the organiser may not; the public check says revoked', async () => {
    const nina = await t.agentFor(DEMO.organiser);
    expect((await nina.post(`/api/certificates/${issued[1].number}/revoke`).send({ reason: 'Wrong strip' })).status).toBe(403);
    const marco = await t.agentFor(DEMO.director);
    expect((await marco.post(`/api/certificates/${issued[1].number}/revoke`).send({})).status).toBe(422);
    const res = await marco
      .post(`/api/certificates/${issued[1].number}/revoke`)
      .send({ reason: 'The reel was found damaged after the event.' });
    expect(res.status).toBe(200);
    const pub = await t.request.get(`/api/verify/${issued[1].number}`);
    expect(pub.body).toMatchObject({ status: 'revoked', revokedReason: 'The reel was found damaged after the event.' });
    expect((await marco.post(`/api/certificates/${issued[1].number}/revoke`).send({ reason: 'again' })).status).toBe(409);
    // The others of the same sign-off stay valid.
    expect((await t.request.get(`/api/verify/${issued[0].number}`)).body.status).toBe('valid');
  });

  test('after a key rotation, new certificates carry the new key id and the old ones still verify from the JWK Set', async () => {
    const oldJws = (await t.request.get(`/api/verify/${issued[0].number}`)).body.jws as string;
    const text = newPrivateJwk();
    writeKeyFile(join(t.dir, 'signing-key.jwk'), text, { replace: true });
    const newKid = await keyIdOf(publicJwkOf(privateKeyFromText(text)));
    reopenAnnex('Rotation check.');
    const fresh = await signOffAnnex();
    const jwks = JSON.parse((await t.request.get('/.well-known/jwks.json')).text);
    expect(jwks.keys.map((k: { kid: string }) => k.kid)).toEqual(expect.arrayContaining([newKid, decodeProtectedHeader(oldJws).kid]));
    const newJws = (await t.request.get(`/api/verify/${fresh[0].number}`)).body.jws as string;
    expect(decodeProtectedHeader(newJws).kid).toBe(newKid);
    await expect(compactVerify(oldJws, createLocalJWKSet(jwks))).resolves.toBeTruthy();
    await expect(compactVerify(newJws, createLocalJWKSet(jwks))).resolves.toBeTruthy();
  });

  test('an admin may revoke too', async () => {
    const ada = await t.agentFor(DEMO.admin);
    const res = await ada.post(`/api/certificates/${issued[2].number}/revoke`).send({ reason: 'Issued by mistake.' });
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('revoked');
  });
});
