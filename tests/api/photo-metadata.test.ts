// A photo taken in the hall is stored without where it was taken or which device took it: the
// EXIF GPS block (CIPA DC-008 "Exif 2.32", GPS IFD), the body and lens serial numbers (Exif tags
// 0xA431, 0xA435) and XMP are gone; the orientation (tag 0x0112) and the times it was taken stay;
// the picture is not re-encoded; the SHA-256 reported is that of the file stored. The photos are
// made here (sharp's withExif for a JPEG, ExifTool on the HEIC fixture) and read back with sharp
// and exif-reader.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createHash } from 'node:crypto';
import { copyFileSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import sharp from 'sharp';
import exifReader from 'exif-reader';
import heicConvert from 'heic-convert';
import { ExifTool } from 'exiftool-vendored';
import type { Response } from 'supertest';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp } from '../setup/test-app';
import { venueIds } from './testing-helpers';
import { attachments } from '../../server/db/schema';

let t: TestApp;
let faultId: string;
let tagged: Buffer;
const TAKEN = '2026:11:21 08:15:42';
const XMP = `<x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#"><rdf:Description xmlns:exif="http://ns.adobe.com/exif/1.0/" exif:GPSLatitude="51,30.2N" exif:GPSLongitude="0,7.6W"/></rdf:RDF></x:xmpmeta>`;

const binary = (res: Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');
const exifOf = async (b: Buffer) => {
  const m = await sharp(b).metadata();
  return { meta: m, exif: m.exif ? exifReader(m.exif) : null };
};
const storedFile = (id: string) =>
  readFileSync(join(t.dir, 'attachments', t.db.select().from(attachments).where(eq(attachments.id, id)).get()!.storedName));

beforeAll(async () => {
  t = await createTestApp();
  const { hall } = await venueIds(t);
  const marco = await t.agentFor(DEMO.director);
  faultId = ((await marco.get(`/api/venues/${hall}/faults`)).body as { id: string }[])[0].id;
  // What a tablet's camera writes: where (GPS), which device (make, model, serials, owner), when, and which way up.
  tagged = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#c87828' } })
    .jpeg({ quality: 90 })
    .withExif({
      IFD0: { Make: 'Acme', Model: 'Tab 9', DateTime: TAKEN, Artist: 'Sam' },
      IFD2: {
        DateTimeOriginal: TAKEN,
        DateTimeDigitized: TAKEN,
        BodySerialNumber: 'SN-4471-0098',
        LensSerialNumber: 'LS-0077',
        CameraOwnerName: 'Sam',
      },
      IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 1234/100', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 3900/100' },
    })
    .withMetadata({ orientation: 6 })
    .withXmp(XMP)
    .toBuffer();
});
afterAll(() => t?.close());

describe('a photo is stored without location and device serial', () => {
  test('the JPEG as made carries GPS, serials and XMP (so the checks below can fail)', async () => {
    const { meta, exif } = await exifOf(tagged);
    expect(exif!.GPSInfo).toMatchObject({ GPSLatitudeRef: 'N', GPSLatitude: [51, 30, 12.34] });
    expect(exif!.Photo).toMatchObject({ BodySerialNumber: 'SN-4471-0098', LensSerialNumber: 'LS-0077' });
    expect(meta.xmp).toBeDefined();
    expect(meta.orientation).toBe(6);
  });

  test('when a JPEG with GPS and serial numbers is uploaded, then the stored file has neither, keeps orientation and time, the same picture, and the SHA-256 of what is stored', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const res = await sam
      .post(`/api/faults/${faultId}/attachments`)
      .attach('file', tagged, { filename: 'IMG_2041.jpg', contentType: 'image/jpeg' });
    expect(res.status).toBe(201);
    const stored = storedFile(res.body.id);
    const { meta, exif } = await exifOf(stored);
    expect(exif!.GPSInfo).toBeUndefined();
    expect(exif!.Photo?.BodySerialNumber).toBeUndefined();
    expect(exif!.Photo?.LensSerialNumber).toBeUndefined();
    expect(exif!.Photo?.CameraOwnerName).toBeUndefined();
    expect(exif!.Image?.Artist).toBeUndefined();
    expect(meta.xmp).toBeUndefined();
    expect(stored.includes(Buffer.from('SN-4471'))).toBe(false);
    // Kept: which way up, and when it was taken (exif-reader reads the EXIF time as UTC).
    expect(meta.orientation).toBe(6);
    expect(exif!.Photo?.DateTimeOriginal).toEqual(new Date('2026-11-21T08:15:42Z'));
    // Not re-encoded: the decoded pixels are the ones sent.
    expect((await sharp(stored).raw().toBuffer()).equals(await sharp(tagged).raw().toBuffer())).toBe(true);
    expect(res.body.sha256).toBe(sha256(stored));
    expect(res.body.sha256).not.toBe(sha256(tagged));
    expect(res.body.size).toBe(stored.length);
    const served = await sam.get(`/api/attachments/${res.body.id}`).buffer(true).parse(binary);
    expect(sha256(served.body as Buffer)).toBe(res.body.sha256);
    // Sent again without a key: recognised as the same photo, not stored twice.
    const again = await sam
      .post(`/api/faults/${faultId}/attachments`)
      .attach('file', tagged, { filename: 'IMG_2041.jpg', contentType: 'image/jpeg' });
    expect(again.status).toBe(200);
    expect(again.body.id).toBe(res.body.id);
    // Nothing of the rewriting is left in the folder: the photo and its preview only.
    expect(readdirSync(join(t.dir, 'attachments')).filter((f) => f.startsWith('.'))).toEqual([]);
  });

  test('when a HEIC photo carries GPS and a serial number, then it is stored as HEIC without them, orientation and time kept, the picture untouched', async () => {
    // The fixture (an HEVC-coded 64×48 HEIF made by heif-enc) with a camera's tags written into it
    // (ExifTool's SerialNumber is Exif's BodySerialNumber, 0xA431).
    const source = join(t.dir, 'tagged.heic');
    copyFileSync(join(import.meta.dirname, '../fixtures/photo-64x48.heic'), source);
    const et = new ExifTool({ maxProcs: 1 });
    try {
      await et.write(
        source,
        {
          GPSLatitude: 51.5034,
          GPSLatitudeRef: 'N',
          GPSLongitude: 0.1276,
          GPSLongitudeRef: 'W',
          SerialNumber: 'SN-4471-0098',
          DateTimeOriginal: TAKEN,
          'Orientation#': 6,
        },
        { writeArgs: ['-overwrite_original'] },
      );
    } finally {
      await et.end();
    }
    const heic = readFileSync(source);
    const before = await exifOf(heic);
    expect(before.exif!.GPSInfo?.GPSLatitude).toBeDefined();
    expect(before.exif!.Photo?.BodySerialNumber).toBe('SN-4471-0098');

    const sam = await t.agentFor(DEMO.technician);
    const res = await sam
      .post(`/api/faults/${faultId}/attachments`)
      .attach('file', heic, { filename: 'IMG_0043.HEIC', contentType: 'image/heic' });
    expect(res.status).toBe(201);
    expect(res.body.contentType).toBe('image/heic');
    const stored = storedFile(res.body.id);
    const after = await exifOf(stored);
    expect(after.meta.format).toBe('heif');
    expect(after.exif!.GPSInfo).toBeUndefined();
    expect(after.exif!.Photo?.BodySerialNumber).toBeUndefined();
    expect(after.exif!.Image?.Orientation).toBe(6);
    expect(after.exif!.Photo?.DateTimeOriginal).toEqual(new Date('2026-11-21T08:15:42Z'));
    const pixels = async (b: Buffer) =>
      sharp(Buffer.from(new Uint8Array(await heicConvert({ buffer: b, format: 'PNG' }))))
        .raw()
        .toBuffer();
    expect((await pixels(stored)).equals(await pixels(heic))).toBe(true);
    expect(res.body.sha256).toBe(sha256(stored));
  });
});
