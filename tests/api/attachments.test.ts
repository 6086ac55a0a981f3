import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createHash, randomUUID } from 'node:crypto';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import sharp from 'sharp';
import type { Response } from 'supertest';
import { createTestApp, DEMO, DEMO_PASSWORD, type TestApp } from '../setup/test-app';
import { venueIds } from './testing-helpers';
import { syntheticTdrTrace, roundTripNsFor } from '../setup/synthetic-trace';
import { attachments, organisations, users } from '../../server/db/schema';
import { hashPassword, TEST_SCRYPT } from '../../server/auth/password';
import { attachmentsService } from '../../server/services/attachments.service';
import { attachmentStore } from '../../server/storage/attachment-store';
import { eq } from 'drizzle-orm';

let t: TestApp;
let faultId: string; // Strip 6, left floor cable, A–B short 7.4 m from the apparatus (demo)
let itemId: string;
let jpeg: Buffer;
let png: Buffer;
const PDF = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n');

const dir = () => join(t.dir, 'attachments');
const filesOnDisk = () => (existsSync(dir()) ? readdirSync(dir()).sort() : []);
const rowCount = () => t.db.select().from(attachments).all().length;

/** Binary bodies collected as a Buffer. */
function binary(res: Response, cb: (err: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
}

beforeAll(async () => {
  t = await createTestApp();
  const { hall } = await venueIds(t);
  const marco = await t.agentFor(DEMO.director);
  const list = (await marco.get(`/api/venues/${hall}/faults`)).body as { id: string; stripLabel: string; positionName: string }[];
  faultId = list.find((f) => f.stripLabel === 'Strip 6' && f.positionName === 'Left floor cable')!.id;
  const register = (await marco.get('/api/equipment')).body as { id: string; kind: string }[];
  itemId = register.find((e) => e.kind === 'floor-cable')!.id;
  jpeg = await sharp({ create: { width: 1600, height: 1200, channels: 3, background: '#884422' } })
    .jpeg()
    .toBuffer();
  png = await sharp({ create: { width: 300, height: 200, channels: 4, background: '#2266aa' } })
    .png()
    .toBuffer();
});
afterAll(() => t.close());

describe('POST /api/faults/:id/attachments', () => {
  test('when Sam (assigned) sends a photo, then 201 with the contract, stored under a generated name, with a preview', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const res = await sam
      .post(`/api/faults/${faultId}/attachments`)
      .attach('file', jpeg, { filename: 'damage at 7 m.jpg', contentType: 'image/jpeg' });
    expect(res.status).toBe(201);
    expect(Object.keys(res.body).sort()).toEqual(['contentType', 'id', 'kind', 'sha256', 'size']);
    expect(res.body).toMatchObject({ kind: 'photo', contentType: 'image/jpeg', size: jpeg.length });
    expect(res.body.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(res.headers.location).toBe(`/api/attachments/${res.body.id}`);

    // OWASP ASVS 5.3.2: the stored name is ours, never the user's.
    const row = t.db.select().from(attachments).where(eq(attachments.id, res.body.id)).get()!;
    expect(row.storedName).toMatch(/^[0-9a-f-]{36}$/);
    expect(row.originalName).toBe('damage at 7 m.jpg');
    expect(filesOnDisk().some((f) => f.includes('damage'))).toBe(false);
    expect(readFileSync(join(dir(), row.storedName)).equals(jpeg)).toBe(true);

    const preview = await sam.get(`/api/attachments/${res.body.id}/preview`).buffer(true).parse(binary);
    expect(preview.status).toBe(200);
    expect(preview.headers['content-type']).toBe('image/jpeg');
    const meta = await sharp(preview.body as Buffer).metadata();
    expect(meta.format).toBe('jpeg');
    expect(Math.max(meta.width!, meta.height!)).toBe(480);
  });

  test('when a tablet sends a HEIC photo, then it is kept as sent and its preview is a JPEG of the same picture', async () => {
    // A 64×48 orange picture encoded by heif-enc (Debian package libheif-examples, libheif 1.15):
    // a real HEVC-coded HEIF file, as iPads save photos.
    const heic = readFileSync(join(import.meta.dirname, '../fixtures/photo-64x48.heic'));
    const sam = await t.agentFor(DEMO.technician);
    const res = await sam
      .post(`/api/faults/${faultId}/attachments`)
      .attach('file', heic, { filename: 'IMG_0042.HEIC', contentType: 'image/heic' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ kind: 'photo', contentType: 'image/heic', size: heic.length });
    const row = t.db.select().from(attachments).where(eq(attachments.id, res.body.id)).get()!;
    expect(readFileSync(join(dir(), row.storedName)).equals(heic)).toBe(true);

    const preview = await sam.get(`/api/attachments/${res.body.id}/preview`).buffer(true).parse(binary);
    expect(preview.status).toBe(200);
    expect(preview.headers['content-type']).toBe('image/jpeg');
    const meta = await sharp(preview.body as Buffer).metadata();
    expect(meta.format).toBe('jpeg');
    expect(meta.width! / meta.height!).toBeCloseTo(64 / 48, 2);
    // The picture itself came through: its middle is still orange (lossy both ways, so roughly).
    const { data } = await sharp(preview.body as Buffer)
      .extract({ left: Math.floor(meta.width! / 2), top: Math.floor(meta.height! / 2), width: 1, height: 1 })
      .raw()
      .toBuffer({ resolveWithObject: true });
    expect(Math.abs(data[0]! - 200)).toBeLessThan(20);
    expect(Math.abs(data[1]! - 120)).toBeLessThan(20);
    expect(Math.abs(data[2]! - 40)).toBeLessThan(25);
  });

  test('when the file is served, then the stored bytes with nosniff, the stored type and a safe Content-Disposition (OWASP ASVS 5.4.1, RFC 6266)', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const up = await sam.post(`/api/faults/${faultId}/attachments`).attach('file', png, { filename: 'Kabel "links" – Übersicht.png' });
    expect(up.status).toBe(201);
    const res = await sam.get(`/api/attachments/${up.body.id}`).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    const row = t.db.select().from(attachments).where(eq(attachments.id, up.body.id)).get()!;
    expect((res.body as Buffer).equals(readFileSync(join(dir(), row.storedName)))).toBe(true);
    expect(
      createHash('sha256')
        .update(res.body as Buffer)
        .digest('hex'),
    ).toBe(up.body.sha256);
    // A photo's metadata may be rewritten (photo-metadata.test.ts), its picture never.
    expect(
      (
        await sharp(res.body as Buffer)
          .raw()
          .toBuffer()
      ).equals(await sharp(png).raw().toBuffer()),
    ).toBe(true);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-type']).toBe('image/png');
    expect(res.headers['content-disposition']).toBe(
      `inline; filename="Kabel _links_ Ubersicht.png"; filename*=UTF-8''Kabel%20%22links%22%20%E2%80%93%20%C3%9Cbersicht.png`,
    );
  });

  test('when a PDF or a trace is served, then it is offered as a download (attachment), not shown inline', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const pdf = await sam.post(`/api/faults/${faultId}/attachments`).attach('file', PDF, { filename: 'report.pdf' });
    expect(pdf.status).toBe(201);
    expect(pdf.body.kind).toBe('pdf');
    const got = await sam.get(`/api/attachments/${pdf.body.id}`).buffer(true).parse(binary);
    expect(got.headers['content-type']).toBe('application/pdf');
    expect(got.headers['content-disposition']).toMatch(/^attachment; filename="report.pdf"/);
    expect((await sam.get(`/api/attachments/${pdf.body.id}/preview`)).status).toBe(404);

    const trace = syntheticTdrTrace({ roundTripNs: 40 });
    const csv = await sam.post(`/api/faults/${faultId}/attachments`).attach('file', Buffer.from(trace.csv), { filename: 'scope.csv' });
    expect(csv.status).toBe(201);
    expect(csv.body).toMatchObject({ kind: 'trace', contentType: 'text/csv' });
    const file = await sam.get(`/api/attachments/${csv.body.id}`);
    expect(file.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(file.headers['content-disposition']).toMatch(/^attachment; filename="scope.csv"/);
    expect(file.headers['x-content-type-options']).toBe('nosniff');
  });

  test('when a photo is over 15 MB, then 413 problem+json and nothing is written', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const before = { files: filesOnDisk(), rows: rowCount() };
    const big = Buffer.concat([jpeg, Buffer.alloc(15 * 1024 * 1024 + 1 - jpeg.length)]);
    const res = await sam.post(`/api/faults/${faultId}/attachments`).attach('file', big, { filename: 'huge.jpg' });
    expect(res.status).toBe(413);
    expect(res.headers['content-type']).toMatch(/problem\+json/);
    expect(res.body.code).toBe('file-too-large');
    expect({ files: filesOnDisk(), rows: rowCount() }).toEqual(before);
  });

  test('when a PDF is over 20 MB but under the trace limit, then 413 too (limits are per kind)', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const big = Buffer.concat([PDF, Buffer.alloc(20 * 1024 * 1024 + 1 - PDF.length)]);
    const res = await sam.post(`/api/faults/${faultId}/attachments`).attach('file', big, { filename: 'big.pdf' });
    expect(res.status).toBe(413);
  });

  test('when the content does not match the extension, then 415 and nothing is written', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const before = { files: filesOnDisk(), rows: rowCount() };
    const cases: [Buffer, string][] = [
      [png, 'photo.jpg'], // PNG bytes named JPEG
      [Buffer.from('just some text, not a photo'), 'photo.jpg'],
      [jpeg, 'trace.csv'], // a photo named as a trace
      [Buffer.from([0x31, 0x2c, 0x32, 0x00, 0x0a, 0x33, 0x2c, 0x34]), 'trace.csv'], // NUL bytes
      [Buffer.from([0xff, 0xfe, 0x31, 0x2c, 0x32, 0x0a]), 'trace.csv'], // not UTF-8
      [PDF, 'notes.png'],
      [jpeg, 'setup.exe'],
      [Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"/>'), 'drawing.svg'],
    ];
    for (const [bytes, filename] of cases) {
      const res = await sam.post(`/api/faults/${faultId}/attachments`).attach('file', bytes, { filename });
      expect(res.status, filename).toBe(415);
      expect(res.headers['content-type']).toMatch(/problem\+json/);
    }
    // A JPEG header with garbage after it passes the magic bytes but does not decode.
    const broken = Buffer.concat([jpeg.subarray(0, 64), Buffer.alloc(2000, 7)]);
    const res = await sam.post(`/api/faults/${faultId}/attachments`).attach('file', broken, { filename: 'broken.jpg' });
    expect(res.status).toBe(415);
    expect(res.body.code).toBe('unreadable-image');
    expect({ files: filesOnDisk(), rows: rowCount() }).toEqual(before);
  });

  test('when the file is empty, or there is no file, then 422', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const empty = await sam.post(`/api/faults/${faultId}/attachments`).attach('file', Buffer.alloc(0), { filename: 'empty.jpg' });
    expect(empty.status).toBe(422);
    expect(empty.body.code).toBe('empty-file');
    const none = await sam.post(`/api/faults/${faultId}/attachments`).field('note', 'x');
    expect(none.status).toBe(422);
    const wrongField = await sam.post(`/api/faults/${faultId}/attachments`).attach('photo', jpeg, { filename: 'a.jpg' });
    expect(wrongField.status).toBe(422);
    const json = await sam.post(`/api/faults/${faultId}/attachments`).send({ file: 'x' });
    expect(json.status).toBe(415);
  });

  test('when the name has path separators or control characters, then it is accepted and cleaned; a name that cleans to nothing is 422', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const photo = await sharp({ create: { width: 20, height: 20, channels: 3, background: '#010203' } })
      .png()
      .toBuffer();
    const res = await sam
      .post(`/api/faults/${faultId}/attachments`)
      .attach('file', photo, { filename: '..\\..\\etc\\bad\tna\u202eme.png' });
    expect(res.status).toBe(201);
    const row = t.db.select().from(attachments).where(eq(attachments.id, res.body.id)).get()!;
    expect(row.originalName).toBe('badname.png');
    expect(row.storedName).not.toContain('bad');
    const list = (await sam.get(`/api/faults/${faultId}/attachments`)).body as { id: string; originalName: string }[];
    expect(list.find((a) => a.id === res.body.id)!.originalName).toBe('badname.png');

    const nothing = await sam.post(`/api/faults/${faultId}/attachments`).attach('file', photo, { filename: '\t\u200b\t' });
    expect(nothing.status).toBe(422);
    expect(nothing.body.code).toBe('bad-file-name');
    // Control characters that a multipart header cannot carry are refused by the parser: 400, nothing written.
    const rows = rowCount();
    const bell = await sam.post(`/api/faults/${faultId}/attachments`).attach('file', photo, { filename: 'ring\u0007.png' });
    expect(bell.status).toBe(400);
    expect(bell.headers['content-type']).toMatch(/problem\+json/);
    expect(rowCount()).toBe(rows);
  });

  test('when a CSV has no numbers, or a million lines of garbage, then 422 and nothing is written', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const before = { files: filesOnDisk(), rows: rowCount() };
    const words = await sam
      .post(`/api/faults/${faultId}/attachments`)
      .attach('file', Buffer.from('name,colour\nfoil,red\nepee,green\n'), { filename: 'words.csv' });
    expect(words.status).toBe(422);
    expect(words.body.code).toBe('trace-unreadable');
    const garbage = Buffer.from('lorem ipsum dolor\n'.repeat(1_000_000));
    const res = await sam.post(`/api/faults/${faultId}/attachments`).attach('file', garbage, { filename: 'garbage.csv' });
    expect(res.status).toBe(422);
    expect(res.body.detail).toMatch(/No numeric rows/);
    // Numbers first, then garbage inside the data.
    const mixed = `${syntheticTdrTrace({ roundTripNs: 30, samples: 100 }).csv}${'x;y;z\n'.repeat(50)}`;
    expect(
      (await sam.post(`/api/faults/${faultId}/attachments`).attach('file', Buffer.from(mixed), { filename: 'mixed.csv' })).status,
    ).toBe(422);
    expect({ files: filesOnDisk(), rows: rowCount() }).toEqual(before);
  });

  test('when the database write fails, then the files already written are removed again', async () => {
    const store = attachmentStore(t.deps.env.DATA_DIR);
    const brokenDb = new Proxy(t.deps.db, {
      get(target, prop, receiver) {
        if (prop === 'transaction') {
          return () => {
            throw new Error('disk full (simulated)');
          };
        }
        return Reflect.get(target, prop, receiver);
      },
    });
    const service = attachmentsService({ ...t.deps, db: brokenDb }, store);
    const sam = t.db.select().from(users).where(eq(users.email, DEMO.technician)).get()!;
    const before = { files: filesOnDisk(), rows: rowCount() };
    const photo = await sharp({ create: { width: 30, height: 30, channels: 3, background: '#0a0b0c' } })
      .jpeg()
      .toBuffer();
    await expect(
      service.upload(
        { ...sam, role: 'technician' },
        'fault',
        faultId,
        { buffer: photo, size: photo.length, originalname: 'x.jpg', mimetype: 'image/jpeg' },
        undefined,
      ),
    ).rejects.toThrow(/disk full/);
    expect({ files: filesOnDisk(), rows: rowCount() }).toEqual(before);
  });
});

describe('retrying an upload', () => {
  test('when the same Idempotency-Key comes with the same file, then the stored answer; with another file, 422', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const photo = await sharp({ create: { width: 40, height: 40, channels: 3, background: '#123456' } })
      .jpeg()
      .toBuffer();
    const key = randomUUID();
    const first = await sam
      .post(`/api/faults/${faultId}/attachments`)
      .set('Idempotency-Key', key)
      .attach('file', photo, { filename: 'retry.jpg' });
    expect(first.status).toBe(201);
    const rows = rowCount();
    const files = filesOnDisk();
    const again = await sam
      .post(`/api/faults/${faultId}/attachments`)
      .set('Idempotency-Key', key)
      .attach('file', photo, { filename: 'retry.jpg' });
    expect(again.status).toBe(201);
    expect(again.body).toEqual(first.body);
    expect(rowCount()).toBe(rows);
    expect(filesOnDisk()).toEqual(files);

    const other = await sharp({ create: { width: 41, height: 40, channels: 3, background: '#123456' } })
      .jpeg()
      .toBuffer();
    const reused = await sam
      .post(`/api/faults/${faultId}/attachments`)
      .set('Idempotency-Key', key)
      .attach('file', other, { filename: 'retry.jpg' });
    expect(reused.status).toBe(422);
    expect(reused.body.code).toBe('idempotency-key-reused');
    expect(rowCount()).toBe(rows);

    const notUuid = await sam
      .post(`/api/faults/${faultId}/attachments`)
      .set('Idempotency-Key', 'abc')
      .attach('file', other, { filename: 'x.jpg' });
    expect(notUuid.status).toBe(422);
  });

  test('when the same bytes are sent to the same fault again without a key, then 200 with the existing attachment', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const photo = await sharp({ create: { width: 50, height: 40, channels: 3, background: '#654321' } })
      .jpeg()
      .toBuffer();
    const first = await sam.post(`/api/faults/${faultId}/attachments`).attach('file', photo, { filename: 'one.jpg' });
    expect(first.status).toBe(201);
    const rows = rowCount();
    const second = await sam.post(`/api/faults/${faultId}/attachments`).attach('file', photo, { filename: 'one-again.jpg' });
    expect(second.status).toBe(200);
    expect(second.body).toEqual(first.body);
    expect(rowCount()).toBe(rows);
  });
});

describe('who may attach and see files', () => {
  let photoId: string;
  beforeAll(async () => {
    const marco = await t.agentFor(DEMO.director);
    const photo = await sharp({ create: { width: 60, height: 40, channels: 3, background: '#777777' } })
      .webp()
      .toBuffer();
    const res = await marco.post(`/api/faults/${faultId}/attachments`).attach('file', photo, { filename: 'by-marco.webp' });
    expect(res.status).toBe(201);
    expect(res.body.contentType).toBe('image/webp');
    photoId = res.body.id;
  });

  test('the director and the assigned technician upload; the organiser and the admin read but may not upload (403)', async () => {
    for (const who of [DEMO.technician, DEMO.director, DEMO.organiser, DEMO.admin]) {
      const agent = await t.agentFor(who);
      expect((await agent.get(`/api/attachments/${photoId}`)).status, who).toBe(200);
      expect((await agent.get(`/api/faults/${faultId}/attachments`)).status, who).toBe(200);
    }
    const photo = await sharp({ create: { width: 10, height: 10, channels: 3, background: '#abcdef' } })
      .png()
      .toBuffer();
    for (const who of [DEMO.organiser, DEMO.admin]) {
      const agent = await t.agentFor(who);
      expect((await agent.post(`/api/faults/${faultId}/attachments`).attach('file', photo, { filename: 'x.png' })).status, who).toBe(403);
    }
  });

  test('a technician not assigned to the venue gets 403; another organisation 404; anonymous 401', async () => {
    const lee = await t.agentFor(DEMO.annexTechnician);
    expect((await lee.get(`/api/attachments/${photoId}`)).status).toBe(403);
    expect((await lee.get(`/api/attachments/${photoId}/preview`)).status).toBe(403);
    expect((await lee.get(`/api/faults/${faultId}/attachments`)).status).toBe(403);
    expect((await lee.post(`/api/faults/${faultId}/attachments`).attach('file', png, { filename: 'x.png' })).status).toBe(403);

    const orgId = randomUUID();
    t.db.insert(organisations).values({ id: orgId, name: 'Another League' }).run();
    t.db
      .insert(users)
      .values({
        id: randomUUID(),
        orgId,
        email: 'td@other-league.example',
        name: 'Other Director',
        role: 'director',
        passwordHash: await hashPassword(DEMO_PASSWORD, TEST_SCRYPT),
      })
      .run();
    const other = await t.agentFor('td@other-league.example');
    expect((await other.get(`/api/attachments/${photoId}`)).status).toBe(404);
    expect((await other.get(`/api/faults/${faultId}/attachments`)).status).toBe(404);
    expect((await other.post(`/api/faults/${faultId}/attachments`).attach('file', png, { filename: 'x.png' })).status).toBe(404);
    expect((await other.post(`/api/equipment/${itemId}/attachments`).attach('file', png, { filename: 'x.png' })).status).toBe(404);

    expect((await t.request.get(`/api/attachments/${photoId}`)).status).toBe(401);
    expect(
      (
        await t.request
          .post(`/api/faults/${faultId}/attachments`)
          .set('Origin', 'http://localhost:3999')
          .attach('file', png, { filename: 'x.png' })
      ).status,
    ).toBe(401);
    expect((await lee.get(`/api/attachments/${randomUUID()}`)).status).toBe(404);
    expect((await lee.get('/api/attachments/not-an-id')).status).toBe(422);
  });

  test('register items: admin and director attach, a technician reads but gets 403 on upload', async () => {
    const ada = await t.agentFor(DEMO.admin);
    const res = await ada.post(`/api/equipment/${itemId}/attachments`).attach('file', PDF, { filename: 'datasheet.pdf' });
    expect(res.status).toBe(201);
    const sam = await t.agentFor(DEMO.technician);
    expect((await sam.get(`/api/equipment/${itemId}/attachments`)).body.map((a: { id: string }) => a.id)).toContain(res.body.id);
    expect((await sam.get(`/api/attachments/${res.body.id}`)).status).toBe(200);
    const photo = await sharp({ create: { width: 12, height: 10, channels: 3, background: '#abcdef' } })
      .png()
      .toBuffer();
    expect((await sam.post(`/api/equipment/${itemId}/attachments`).attach('file', photo, { filename: 'x.png' })).status).toBe(403);
  });

  test("repairs: files hang on the repair and follow the fault's venue access", async () => {
    const marco = await t.agentFor(DEMO.director);
    const repair = await marco.post(`/api/faults/${faultId}/repairs`).send({ action: 'connector-remade', notes: 'Resoldered the A pin' });
    expect(repair.status).toBe(201);
    const repairId = repair.body.repair.id as string;
    const sam = await t.agentFor(DEMO.technician);
    const photo = await sharp({ create: { width: 14, height: 10, channels: 3, background: '#fedcba' } })
      .png()
      .toBuffer();
    const up = await sam.post(`/api/repairs/${repairId}/attachments`).attach('file', photo, { filename: 'after.png' });
    expect(up.status).toBe(201);
    expect((await sam.get(`/api/repairs/${repairId}/attachments`)).body).toHaveLength(1);
    const lee = await t.agentFor(DEMO.annexTechnician);
    expect((await lee.get(`/api/attachments/${up.body.id}`)).status).toBe(403);
  });
});

describe('GET /api/attachments/:id/analysis', () => {
  test("a synthetic trace with a known round trip: Δt within one sample, a short, the distance with the cable's VF 0.6 from the register", async () => {
    // The demo short sits 7.4 m from the apparatus on a 12 m cable of VF 0.6 (invented demo data).
    const roundTripNs = roundTripNsFor(7.4, 0.6);
    const trace = syntheticTdrTrace({ roundTripNs, sampleIntervalS: 0.2e-9, samples: 3000 });
    const sam = await t.agentFor(DEMO.technician);
    const up = await sam
      .post(`/api/faults/${faultId}/attachments`)
      .attach('file', Buffer.from(trace.csv), { filename: 'strip6-left-AB.csv' });
    expect(up.status).toBe(201);
    const res = await sam.get(`/api/attachments/${up.body.id}/analysis`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ sampleCount: 3000, velocityFactor: 0.6, lengthM: 12, problem: null });
    const a = res.body.analysis;
    expect(Math.abs(a.roundTripNs - roundTripNs)).toBeLessThan(trace.sampleIntervalS * 1e9);
    expect(Math.abs(a.incidentTimeS - trace.incidentS)).toBeLessThan(trace.sampleIntervalS);
    expect(Math.abs(a.reflectionTimeS - trace.reflectionS)).toBeLessThan(trace.sampleIntervalS);
    expect(a.polarity).toBe('short');
    // TDR distance d = VF · c · Δt / 2 (formula: Ulaby, Fundamentals of Applied Electromagnetics, TDR section; the trace is ours).
    expect(a.distanceM).toBeCloseTo(7.4, 1);
    expect(res.body.points.timeS.length).toBe(res.body.points.volts.length);
    expect(res.body.points.timeS.length).toBeLessThanOrEqual(4000);
  });

  test('a trace the engine cannot read an edge from is still kept, and the analysis says why', async () => {
    const flat = Array.from({ length: 200 }, (_, i) => `${(i * 1e-9).toExponential(4)},${(0.001 * Math.sin(i)).toFixed(5)}`).join('\n');
    const sam = await t.agentFor(DEMO.technician);
    const up = await sam.post(`/api/faults/${faultId}/attachments`).attach('file', Buffer.from(flat), { filename: 'flat.csv' });
    expect(up.status).toBe(201);
    const res = await sam.get(`/api/attachments/${up.body.id}/analysis`);
    expect(res.status).toBe(200);
    expect(res.body.analysis).toBeNull();
    expect(res.body.problem).toMatch(/No incident edge/);
  });

  test('a photo has no analysis (422); Lee may not read it (403)', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const list = (await sam.get(`/api/faults/${faultId}/attachments`)).body as { id: string; kind: string }[];
    const photo = list.find((a) => a.kind === 'photo')!;
    expect((await sam.get(`/api/attachments/${photo.id}/analysis`)).status).toBe(422);
    const trace = list.find((a) => a.kind === 'trace')!;
    const lee = await t.agentFor(DEMO.annexTechnician);
    expect((await lee.get(`/api/attachments/${trace.id}/analysis`)).status).toBe(403);
  });
});
