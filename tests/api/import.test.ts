import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import ExcelJS from 'exceljs';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp } from '../setup/test-app';
import { auditLog, equipment } from '../../server/db/schema';
import type { ImportPreview, ImportReport } from '../../shared/schemas/equipment-import';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const registerSize = () => t.db.select().from(equipment).all().length;
const byTag = (tag: string) => t.db.select().from(equipment).where(eq(equipment.assetTag, tag)).get();

// A register as a club keeps it: its own header words, feet in one column, AWG in another.
const CLUB_CSV = [
  'Tag,Type,Description,Length (ft),Gauge,VF,Status,Comments',
  'fc-101,Floor cable,Spare floor cable,39.37,18 AWG,0.62,OK,bought 2025', // row 2: new, feet → 12 m
  'FC-001,floor cable,"12 m floor cable, 3 × 0.75 mm²",39.37,,0.61,in service,', // row 3: in the register → update VF
  'RL-950,Spool,Spring reel,65.6,20,,,', // row 4: new reel
  'XX-1,Trampoline,Not ours,10,,,,', // row 5: unknown kind
  'FC-102,Floor cable,Bad length,twelve,,,,', // row 6: bad length
  'FC-103,Floor cable,Twice,12,,,,', // row 7: duplicate in file
  'FC-103,Floor cable,Twice again,12,,,,', // row 8: duplicate in file
  'PST-001,Piste,"Conductive metal piste, 14 m",45.932,,,,', // row 9: in the register, same values (45.932 ft = 14.000 m)
  '=HYPERLINK("x"),Floor cable,Formula tag,12,,,,', // row 10: not a valid tag
].join('\n');

async function preview(body: string | Buffer, filename = 'register.csv', fields: Record<string, string> = {}) {
  const ada = await t.agentFor(DEMO.admin);
  let req = ada.post('/api/equipment/import/preview');
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return req.attach('file', Buffer.isBuffer(body) ? body : Buffer.from(body), { filename });
}

describe('POST /api/equipment/import/preview', () => {
  test('when a club register is sent, then columns, a suggested mapping and per-row results, and nothing is written', async () => {
    const before = registerSize();
    const res = await preview(CLUB_CSV);
    expect(res.status).toBe(200);
    const body = res.body as ImportPreview;
    expect(body.columns.map((c) => c.header)).toEqual(['Tag', 'Type', 'Description', 'Length (ft)', 'Gauge', 'VF', 'Status', 'Comments']);
    expect(body.suggestedMapping).toEqual({
      assetTag: 0,
      kind: 1,
      description: 2,
      length: 3,
      awg: 4,
      velocityFactor: 5,
      status: 6,
      notes: 7,
    });
    const row = (n: number) => body.rows.find((r) => r.row === n)!;
    expect(row(2)).toMatchObject({
      assetTag: 'FC-101',
      action: 'create',
      values: { kind: 'floor-cable', lengthM: 12, awg: 18, velocityFactor: 0.62, status: 'in-service' },
    });
    expect(row(3)).toMatchObject({ assetTag: 'FC-001', action: 'update', changes: { velocityFactor: { from: 0.6, to: 0.61 } } });
    expect(row(4)).toMatchObject({ assetTag: 'RL-950', action: 'create', values: { kind: 'reel', lengthM: 19.995, awg: 20 } });
    expect(row(5).action).toBe('error');
    expect(row(5).errors).toEqual([
      expect.objectContaining({ field: 'kind', message: expect.stringMatching(/Unknown kind “Trampoline”/) }),
    ]);
    expect(row(6).errors).toEqual([expect.objectContaining({ field: 'length' })]);
    expect(row(7).errors[0]).toMatchObject({ field: 'assetTag', message: 'Duplicate in file: FC-103 is also on row 8.' });
    expect(row(8).errors[0]).toMatchObject({ field: 'assetTag', message: 'Duplicate in file: FC-103 is also on row 7.' });
    expect(row(9).action).toBe('unchanged');
    expect(row(10).action).toBe('error');
    expect(body.summary).toEqual({ create: 2, update: 1, unchanged: 1, skip: 0, error: 5 });
    expect(registerSize()).toBe(before);
  });

  test('when the mode is add-only, then an item already in the register is skipped instead of updated', async () => {
    const res = await preview(CLUB_CSV, 'register.csv', { mode: 'create-only' });
    expect(res.status).toBe(200);
    expect(res.body.rows.find((r: { row: number }) => r.row === 3)).toMatchObject({ action: 'skip' });
  });

  test('when a mapping is sent, then it is used instead of the suggestion (here: length in a unit column)', async () => {
    const csv = 'Asset,Kind,Len,Unit\nFC-200,Floor cable,40,ft\nFC-201,Floor cable,12,m\nFC-202,Floor cable,12,yards\n';
    const res = await preview(csv, 'r.csv', { mapping: JSON.stringify({ assetTag: 0, kind: 1, length: 2, lengthUnit: 3 }) });
    expect(res.status).toBe(200);
    expect(res.body.rows.map((r: { values: { lengthM?: number } }) => r.values.lengthM ?? null)).toEqual([12.192, 12, null]);
    expect(res.body.rows[2].errors[0]).toMatchObject({ field: 'length', message: 'The unit “yards” is not m or ft.' });
  });

  test('an XLSX workbook is read like a CSV', async () => {
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet('Register');
    ws.addRow(['Asset tag', 'Kind', 'Length (m)', 'Conductor (mm²)']);
    ws.addRow(['FC-300', 'Floor cable', 12, 0.75]);
    ws.addRow(['RL-301', 'Reel', 20, '0,5 mm²']);
    const bytes = Buffer.from(await wb.xlsx.writeBuffer());
    const res = await preview(bytes, 'register.xlsx');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.format).toBe('xlsx');
    expect(res.body.rows.map((r: { action: string; values: unknown }) => [r.action, r.values])).toEqual([
      ['create', { assetTag: 'FC-300', kind: 'floor-cable', lengthM: 12, conductorMm2: 0.75 }],
      ['create', { assetTag: 'RL-301', kind: 'reel', lengthM: 20, conductorMm2: 0.5 }],
    ]);
  });

  test('when a CSV has a huge number of columns, then 422 without reading the cells', async () => {
    const wide = `${Array.from({ length: 65 }, (_, i) => `c${i}`).join(',')}\n1,2\n`;
    const res = await preview(wide);
    expect(res.status).toBe(422);
    expect(res.body.code).toBe('too-many-columns');
    // A whole 5 MB line of commas: still a quick 422.
    const commas = `Tag,Kind\n${','.repeat(5 * 1024 * 1024 - 20)}\n`;
    const big = await preview(commas);
    expect(big.status).toBe(422);
    expect(big.body.code).toBe('too-many-columns');
  });

  test('when a file is over 5 MB, then 413; over 10 000 rows, 422; empty or header only, 422; not a spreadsheet, 415', async () => {
    const huge = `Tag,Kind\n${'FC-1,floor cable,'.padEnd(100, ' ')}\n`.repeat(1);
    expect((await preview(Buffer.concat([Buffer.from(huge), Buffer.alloc(5 * 1024 * 1024, 0x20)]))).status).toBe(413);
    const many = `Tag,Kind\n${Array.from({ length: 10_001 }, (_, i) => `T-${i},reel`).join('\n')}\n`;
    const rows = await preview(many);
    expect(rows.status).toBe(422);
    expect(rows.body.code).toBe('too-many-rows');
    expect((await preview('')).status).toBe(422);
    expect((await preview('Tag,Kind\n')).body.code).toBe('no-rows');
    expect((await preview('\n\n\n')).status).toBe(422);
    expect((await preview(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0]), 'register.csv')).status).toBe(415);
    expect((await preview('Tag,Kind\nA,reel\n', 'register.xlsx')).status).toBe(415);
    expect((await preview('Tag,Kind\nA,reel\n', 'register.json')).status).toBe(415);
  });

  test('a technician or an organiser may not import (403); anonymous 401', async () => {
    for (const who of [DEMO.technician, DEMO.organiser]) {
      const agent = await t.agentFor(who);
      expect((await agent.post('/api/equipment/import/preview').attach('file', Buffer.from(CLUB_CSV), { filename: 'r.csv' })).status).toBe(
        403,
      );
    }
    expect(
      (
        await t.request
          .post('/api/equipment/import/preview')
          .set('Origin', 'http://localhost:3999')
          .attach('file', Buffer.from(CLUB_CSV), { filename: 'r.csv' })
      ).status,
    ).toBe(401);
  });
});

describe('POST /api/equipment/import', () => {
  test('when the good rows are imported, then they are written in one go and the report lists created, updated and skipped', async () => {
    const marco = await t.agentFor(DEMO.director);
    const mapping = (await preview(CLUB_CSV)).body.suggestedMapping;
    const before = registerSize();
    const res = await marco
      .post('/api/equipment/import')
      .field('mapping', JSON.stringify(mapping))
      .field('mode', 'create-and-update')
      .attach('file', Buffer.from(CLUB_CSV), { filename: 'register.csv' });
    expect(res.status).toBe(200);
    const report = res.body as ImportReport;
    expect(report.created.map((c) => c.assetTag)).toEqual(['FC-101', 'RL-950']);
    expect(report.updated.map((u) => [u.assetTag, u.changes])).toEqual([['FC-001', { velocityFactor: { from: 0.6, to: 0.61 } }]]);
    expect(report.skipped.map((s) => s.row)).toEqual([5, 6, 7, 8, 9, 10]);
    expect(report.skipped.find((s) => s.row === 5)!.reason).toMatch(/Unknown kind/);
    expect(registerSize()).toBe(before + 2);
    expect(byTag('FC-101')).toMatchObject({ kind: 'floor-cable', lengthM: 12, awg: 18, notes: 'bought 2025' });
    expect(byTag('FC-001')).toMatchObject({ velocityFactor: 0.61, version: 2 });
    const audit = t.db.select().from(auditLog).where(eq(auditLog.action, 'equipment.imported')).all();
    expect(audit).toHaveLength(1);

    // The same file again: nothing new, nothing changed.
    const again = await marco
      .post('/api/equipment/import')
      .field('mapping', JSON.stringify(mapping))
      .attach('file', Buffer.from(CLUB_CSV), { filename: 'register.csv' });
    expect(again.status).toBe(200);
    expect(again.body.created).toEqual([]);
    expect(again.body.updated).toEqual([]);
    expect(registerSize()).toBe(before + 2);
  });

  test('when a write fails part-way, then nothing of the import remains (one transaction)', async () => {
    const marco = await t.agentFor(DEMO.director);
    const before = registerSize();
    // A trigger that refuses the second new item stands in for a failure at import time.
    t.sqlite.exec(
      `CREATE TRIGGER refuse_fc_402 BEFORE INSERT ON equipment WHEN NEW.asset_tag = 'FC-402' BEGIN SELECT RAISE(ABORT, 'refused by test'); END;`,
    );
    try {
      const csv = 'Tag,Kind\nFC-401,floor cable\nFC-402,floor cable\n';
      const res = await marco
        .post('/api/equipment/import')
        .field('mapping', JSON.stringify({ assetTag: 0, kind: 1 }))
        .attach('file', Buffer.from(csv), { filename: 'r.csv' });
      expect(res.status).toBe(409);
      expect(res.body.code).toBe('import-failed');
    } finally {
      t.sqlite.exec('DROP TRIGGER refuse_fc_402');
    }
    expect(byTag('FC-401')).toBeUndefined();
    expect(registerSize()).toBe(before);
  });

  test('when no row can be imported, then 422 with the report; without a mapping, 422', async () => {
    const marco = await t.agentFor(DEMO.director);
    const csv = 'Tag,Kind\nZZ-1,trampoline\nZZ-2,\n';
    const res = await marco
      .post('/api/equipment/import')
      .field('mapping', JSON.stringify({ assetTag: 0, kind: 1 }))
      .attach('file', Buffer.from(csv), { filename: 'r.csv' });
    expect(res.status).toBe(422);
    expect(res.body.code).toBe('nothing-to-import');
    expect(res.body.report.skipped).toHaveLength(2);
    const none = await marco.post('/api/equipment/import').attach('file', Buffer.from(csv), { filename: 'r.csv' });
    expect(none.status).toBe(422);
    const bad = await marco
      .post('/api/equipment/import')
      .field('mapping', '{not json')
      .attach('file', Buffer.from(csv), { filename: 'r.csv' });
    expect(bad.status).toBe(422);
  });
});

describe('GET /api/equipment.csv', () => {
  test('the register as CSV for any staff member, with formula-looking cells guarded', async () => {
    const ada = await t.agentFor(DEMO.admin);
    const item = await ada.post('/api/equipment').send({ assetTag: 'OT-900', kind: 'other', description: '=1+2 spare', notes: '@cmd' });
    expect(item.status).toBe(201);
    const sam = await t.agentFor(DEMO.technician);
    const res = await sam.get('/api/equipment.csv');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe('attachment; filename="equipment-register.csv"');
    const lines = res.text
      .replace(/^\ufeff/, '')
      .trim()
      .split('\r\n');
    expect(lines[0]).toBe('Asset tag,Kind,Description,Length (m),Conductor (mm²),AWG,Cable type,Velocity factor,Status,Notes');
    // OWASP "CSV Injection": a leading = + - @ gets an apostrophe.
    expect(lines.find((l) => l.startsWith('OT-900'))).toBe("OT-900,other,'=1+2 spare,,,,,,in-service,'@cmd");
    expect(lines.find((l) => l.startsWith('FC-001,'))).toMatch(/^FC-001,floor-cable,/);
    expect((await t.request.get('/api/equipment.csv')).status).toBe(401);

    // The export reads back as an import with nothing to change (apostrophes taken off again).
    const back = await preview(Buffer.from(res.text), 'equipment-register.csv');
    expect(back.status).toBe(200);
    expect(back.body.summary.error).toBe(0);
    expect(back.body.summary.update).toBe(0);
    expect(back.body.rows.find((r: { assetTag: string }) => r.assetTag === 'OT-900').values.description).toBe('=1+2 spare');
  });
});
