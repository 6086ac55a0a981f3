// A trace's bytes read into one buffer as they arrive (server/http/body-bytes.ts): the same bytes
// express.raw would give, in memory of their own (so they move to a worker uncopied), and the same
// refusals for a body too large, of another type, or sent without a length.
import { afterAll, beforeAll, expect, test } from 'vitest';
import express from 'express';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { randomBytes } from 'node:crypto';
import { bodyBytes } from '../../server/http/body-bytes';
import { errorHandler } from '../../server/middleware/error-handler';

const MAX = 4 * 1024 * 1024;
let server: Server;
let base: string;
const seen: { length: number; own: boolean }[] = [];

beforeAll(async () => {
  const app = express();
  app.post('/trace', bodyBytes({ contentTypes: ['text/csv'], maxBytes: MAX }), (req, res) => {
    // The real routes refuse another type from their contract; here it is only told apart.
    if (!Buffer.isBuffer(req.body)) return void res.status(415).end();
    const body = req.body;
    seen.push({ length: body.length, own: body.byteOffset === 0 && body.byteLength === body.buffer.byteLength });
    res.type('application/octet-stream').send(body);
  });
  app.use(errorHandler(() => {}));
  server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(() => new Promise((r) => server.close(r)));

const post = (body: BodyInit, headers: Record<string, string> = { 'Content-Type': 'text/csv' }, init: RequestInit = {}) =>
  fetch(`${base}/trace`, { method: 'POST', body, headers, ...init });

test('a 3 MB body with its length arrives byte for byte, in a buffer that is the whole of its memory', async () => {
  const bytes = randomBytes(3 * 1024 * 1024);
  seen.length = 0;
  const res = await post(bytes);
  expect(res.status).toBe(200);
  expect(Buffer.from(await res.arrayBuffer()).equals(bytes)).toBe(true);
  expect(seen).toEqual([{ length: bytes.length, own: true }]);
});

test('a body sent in chunks without a length still arrives whole (through express.raw)', async () => {
  const parts = [randomBytes(70_000), randomBytes(90_000)];
  const stream = new ReadableStream({
    start(c) {
      for (const p of parts) c.enqueue(p);
      c.close();
    },
  });
  const res = await post(stream, { 'Content-Type': 'text/csv' }, { duplex: 'half' } as RequestInit);
  expect(res.status).toBe(200);
  expect(Buffer.from(await res.arrayBuffer()).equals(Buffer.concat(parts))).toBe(true);
});

test('a body over the limit is refused with 413 problem+json, from its declared length', async () => {
  const res = await post(randomBytes(MAX + 1));
  expect(res.status).toBe(413);
  expect(res.headers.get('content-type')).toMatch(/application\/problem\+json/);
});

test('a body of another type is not read as bytes', async () => {
  seen.length = 0;
  const res = await post('{"a":1}', { 'Content-Type': 'application/json' });
  expect(res.status).toBe(415);
  expect(seen).toEqual([]);
});
