// Label sheets read back as a scanner would: every QR code in the PDF decoded (jsQR, see
// tests/setup/pdf-qr.ts) and matched to the words printed beside it.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createTestApp, DEMO, ORIGIN, type TestApp } from '../setup/test-app';
import { addOtherOrg, OTHER_DIRECTOR, OTHER_PASSWORD } from '../setup/other-org';
import { readPdfQrCodes, type PdfQr, type PdfTextItem } from '../setup/pdf-qr';
import { venueIds } from './testing-helpers';
import { parseScannedCode } from '../../shared/domain/label-codes';

let t: TestApp;
let hall: string;
let annex: string;
beforeAll(async () => {
  t = await createTestApp();
  ({ hall, annex } = await venueIds(t));
  await addOtherOrg(t);
});
afterAll(() => t.close());

const MM = 72 / 25.4;
// The common 24-up A4 sheet: 3 × 8 labels of 70 × 37 mm, no gaps (common practice).
const LABEL_W = 70 * MM;
const LABEL_H = 37 * MM;
// The register's words for the kinds (the product's own vocabulary, PRODUCT.md "Words").
const KIND_WORDS: Record<string, string> = { 'floor-cable': 'Floor cable', reel: 'Reel', apparatus: 'Scoring apparatus', piste: 'Piste' };

interface Plan {
  venue: { name: string };
  strips: { id: string; label: string; zone: string | null; positions: { equipment: { assetTag: string; kind: string } | null }[] }[];
}

const binary = (res: { on: (e: string, f: (c?: Buffer) => void) => void }, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c) => chunks.push(c!));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

/** The words printed in the label whose code is `code`: the text inside its 70 × 37 mm cell. */
function wordsBeside(code: PdfQr, text: PdfTextItem[]) {
  const pad = (LABEL_H - code.box.height) / 2;
  const left = code.box.x - pad;
  const bottom = code.box.y - pad;
  return text
    .filter((i) => i.page === code.page && i.x >= left && i.x < left + LABEL_W && i.y >= bottom && i.y < bottom + LABEL_H)
    .sort((a, b) => b.y - a.y || a.x - b.x)
    .map((i) => i.text)
    .join(' ');
}

async function sheetOf(agent: Awaited<ReturnType<TestApp['agentFor']>>, path: string) {
  const res = await agent.get(path).buffer(true).parse(binary);
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toBe('application/pdf');
  return { res, ...(await readPdfQrCodes(res.body as Buffer)) };
}

describe('GET /api/venues/:id/labels.pdf', () => {
  test('every strip and every item of the hall has one label whose code opens it, with its name in words', async () => {
    const marco = await t.agentFor(DEMO.director);
    const plan = (await marco.get(`/api/venues/${hall}`)).body as Plan;
    const { res, codes, text, pages } = await sheetOf(marco, `/api/venues/${hall}/labels.pdf`);
    expect(res.headers['content-disposition']).toBe('inline; filename="labels-riverside-sports-hall.pdf"');

    const items = new Map(
      plan.strips.flatMap((s) => s.positions.flatMap((p) => (p.equipment ? [[p.equipment.assetTag, p.equipment.kind] as const] : []))),
    );
    expect(items.size).toBeGreaterThan(24 * 4);
    expect(codes).toHaveLength(plan.strips.length + items.size);
    expect(pages).toBe(Math.ceil(codes.length / 24));
    expect(codes.every((c) => c.text !== null)).toBe(true);

    const byUrl = new Map(codes.map((c) => [c.text!, c]));
    expect(byUrl.size).toBe(codes.length); // each once
    for (const strip of plan.strips) {
      const code = byUrl.get(`${ORIGIN}/s/${strip.id}`);
      expect(code, strip.label).toBeDefined();
      const words = wordsBeside(code!, text);
      expect(words).toContain(strip.label);
      expect(words).toContain('Riverside Sports Hall');
      if (strip.zone) expect(words).toContain(strip.zone);
      expect(parseScannedCode(code!.text!)).toEqual({ kind: 'strip', stripId: strip.id });
    }
    for (const [tag, kind] of items) {
      const code = byUrl.get(`${ORIGIN}/t/${encodeURIComponent(tag)}`);
      expect(code, tag).toBeDefined();
      const words = wordsBeside(code!, text);
      expect(words).toContain(tag);
      expect(words).toContain(KIND_WORDS[kind]);
      expect(parseScannedCode(code!.text!)).toEqual({ kind: 'tag', assetTag: tag });
    }
  });

  test('the labels sit on a 3 × 8 grid of 70 × 37 mm centred on A4, the code inside each label', async () => {
    const marco = await t.agentFor(DEMO.director);
    const { codes } = await sheetOf(marco, `/api/venues/${hall}/labels.pdf`);
    const first = codes.filter((c) => c.page === 1);
    expect(first).toHaveLength(24);
    const pad = (LABEL_H - first[0]!.box.height) / 2;
    // A4 is 595.28 × 841.89 pt (ISO 216); the grid is 210 × 296 mm.
    const lefts = [...new Set(first.map((c) => (c.box.x - pad).toFixed(1)))].map(Number).sort((a, b) => a - b);
    const bottoms = [...new Set(first.map((c) => (c.box.y - pad).toFixed(1)))].map(Number).sort((a, b) => a - b);
    expect(lefts).toHaveLength(3);
    expect(bottoms).toHaveLength(8);
    lefts.forEach((x, i) => expect(x).toBeCloseTo((595.28 - 3 * LABEL_W) / 2 + i * LABEL_W, 0));
    bottoms.forEach((y, i) => expect(y).toBeCloseTo((841.89 - 8 * LABEL_H) / 2 + i * LABEL_H, 0));
    // At least 3 mm of the label round the code, so a sheet fed askew keeps the code whole.
    expect(pad).toBeGreaterThanOrEqual(3 * MM);
  });

  test('the assigned technician and the admin may print; the organiser, another technician and another organisation may not', async () => {
    for (const who of [DEMO.technician, DEMO.admin]) {
      expect((await (await t.agentFor(who)).get(`/api/venues/${hall}/labels.pdf`)).status).toBe(200);
    }
    expect((await (await t.agentFor(DEMO.annexTechnician)).get(`/api/venues/${annex}/labels.pdf`)).status).toBe(200);
    expect((await (await t.agentFor(DEMO.annexTechnician)).get(`/api/venues/${hall}/labels.pdf`)).status).toBe(403);
    expect((await (await t.agentFor(DEMO.organiser)).get(`/api/venues/${hall}/labels.pdf`)).status).toBe(403);
    expect((await (await t.agentFor(OTHER_DIRECTOR, OTHER_PASSWORD)).get(`/api/venues/${hall}/labels.pdf`)).status).toBe(404);
    expect((await t.request.get(`/api/venues/${hall}/labels.pdf`)).status).toBe(401);
    const bad = await (await t.agentFor(DEMO.director)).get('/api/venues/not-an-id/labels.pdf');
    expect(bad.status).toBe(422);
    expect(bad.headers['content-type']).toMatch(/^application\/problem\+json/);
  });
});

describe('GET /api/equipment/labels.pdf', () => {
  test('the reels of the register, each once, with tag and kind; the filters are the list’s', async () => {
    const ada = await t.agentFor(DEMO.admin);
    const reels = ((await ada.get('/api/equipment?kind=reel')).body as { assetTag: string; status: string }[]).filter(
      (i) => i.status !== 'retired',
    );
    expect(reels.length).toBeGreaterThan(0);
    const { codes, text } = await sheetOf(ada, '/api/equipment/labels.pdf?kind=reel');
    expect(codes.map((c) => c.text).sort()).toEqual(reels.map((r) => `${ORIGIN}/t/${encodeURIComponent(r.assetTag)}`).sort());
    for (const c of codes) expect(wordsBeside(c, text)).toContain('Reel');
  });

  test('a tag of the longest kind the register takes (40 characters) is printed whole, and its code reads back', async () => {
    const ada = await t.agentFor(DEMO.admin);
    const tag = 'LONG-TAG/0123456789-0123456789-012345678';
    expect(tag).toHaveLength(40);
    expect((await ada.post('/api/equipment').send({ assetTag: tag, kind: 'reel', lengthM: 20 })).status).toBe(201);
    const { codes, text } = await sheetOf(ada, `/api/equipment/labels.pdf?q=${encodeURIComponent('LONG-TAG/')}`);
    expect(codes.map((c) => c.text)).toEqual([`${ORIGIN}/t/LONG-TAG%2F0123456789-0123456789-012345678`]);
    // Wrapped over lines, but every character there in order.
    expect(wordsBeside(codes[0]!, text).replace(/\s+/g, '')).toContain(tag);
  });

  test('nothing matching is a 422 that says so; technicians and organisers may not print the register', async () => {
    const ada = await t.agentFor(DEMO.admin);
    const none = await ada.get('/api/equipment/labels.pdf?q=NO-SUCH-TAG-ANYWHERE');
    expect(none.status).toBe(422);
    expect(none.body.detail).toMatch(/nothing to print/);
    expect((await ada.get('/api/equipment/labels.pdf?kind=kettle')).status).toBe(422);
    for (const who of [DEMO.technician, DEMO.organiser]) {
      expect((await (await t.agentFor(who)).get('/api/equipment/labels.pdf')).status).toBe(403);
    }
  });
});

describe('GET /api/tags/:tag', () => {
  test('a hall item: its strip for the technician of the hall, none for the technician of the annex', async () => {
    const marco = await t.agentFor(DEMO.director);
    const plan = (await marco.get(`/api/venues/${hall}`)).body as Plan;
    const strip = plan.strips[2]!;
    const tag = strip.positions.find((p) => p.equipment)!.equipment!.assetTag;
    const sam = (await (await t.agentFor(DEMO.technician)).get(`/api/tags/${encodeURIComponent(tag.toLowerCase())}`)).body;
    expect(sam.assetTag).toBe(tag);
    expect(sam.placements).toEqual([
      expect.objectContaining({ stripId: strip.id, stripLabel: strip.label, venueId: hall, venueName: 'Riverside Sports Hall' }),
    ]);
    const lee = await (await t.agentFor(DEMO.annexTechnician)).get(`/api/tags/${encodeURIComponent(tag)}`);
    expect(lee.status).toBe(200);
    expect(lee.body.placements).toEqual([]);
  });

  test('an unknown tag and another organisation’s tag are not found; a malformed tag is a 422', async () => {
    const sam = await t.agentFor(DEMO.technician);
    expect((await sam.get('/api/tags/ZZ-404')).status).toBe(404);
    expect((await sam.get('/api/tags/HB-001')).status).toBe(404);
    const bad = await sam.get(`/api/tags/${encodeURIComponent('two words')}`);
    expect(bad.status).toBe(422);
    expect((await (await t.agentFor(OTHER_DIRECTOR, OTHER_PASSWORD)).get('/api/tags/HB-001')).body.placements).toHaveLength(1);
  });
});
