// A trace's bytes received as they arrive (server/http/body-bytes.ts, server/workers/parcel.ts):
// the same bytes express.raw would give, none of them kept in the event loop's heap on the way to
// the worker, and the same refusals for a body too large, of another type, or sent without a length.
import { afterAll, beforeAll, expect, test } from 'vitest';
import express from 'express';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { createHash, randomBytes } from 'node:crypto';
import { MessageChannel } from 'node:worker_threads';
import { bodyBytes } from '../../server/http/body-bytes';
import { ReceivedBody, readParcel, receivedBody } from '../../server/workers/parcel';
import { errorHandler } from '../../server/middleware/error-handler';

const MAX = 32 * 1024 * 1024;
let server: Server;
let base: string;
const seen: { length: number; chunks: number; chunkBytesLeft: number }[] = [];

beforeAll(async () => {
  const app = express();
  app.post(
    '/trace',
    (req, _res, next) => {
      // The same chunks bodyBytes is given, looked at again once it has dealt with them.
      const chunks: Buffer[] = [];
      req.on('data', (c: Buffer) => chunks.push(c));
      (req as { chunks?: Buffer[] }).chunks = chunks;
      next();
    },
    bodyBytes({ contentTypes: ['text/csv'], maxBytes: MAX }),
    (req, res) => {
      // The real routes refuse another type from their contract; here it is only told apart.
      if (!(req.body instanceof ReceivedBody)) return void res.status(415).end();
      const chunks = (req as { chunks?: Buffer[] }).chunks!;
      const body = readParcel(receivedBody(req.body).take());
      seen.push({ length: body.length, chunks: chunks.length, chunkBytesLeft: chunks.reduce((n, c) => n + c.byteLength, 0) });
      res.type('application/octet-stream').send(Buffer.from(body.buffer));
    },
  );
  app.use(errorHandler(() => {}));
  server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(() => new Promise((r) => server.close(r)));

const post = (body: BodyInit, headers: Record<string, string> = { 'Content-Type': 'text/csv' }, init: RequestInit = {}) =>
  fetch(`${base}/trace`, { method: 'POST', body, headers, ...init });

// V8 counts the buffers a heap holds against an allowance (64 MiB) and collects the whole heap
// past it; a body joined into one buffer here counted twice its size (server/workers/parcel.ts).
test.each([3, 24])(
  'a %i MiB body with its length arrives byte for byte, each chunk moved out of the receiving heap as it arrives',
  async (mib) => {
    const bytes = randomBytes(mib * 1024 * 1024);
    seen.length = 0;
    const res = await post(bytes);
    expect(res.status).toBe(200);
    expect(Buffer.from(await res.arrayBuffer()).equals(bytes)).toBe(true);
    expect(seen.map((s) => s.length)).toEqual([bytes.length]);
    expect(seen[0]!.chunks).toBeGreaterThan(10);
    // A moved chunk is left empty (a transfer detaches it); one copied would keep its bytes here.
    expect(seen[0]!.chunkBytesLeft).toBe(0);
  },
);

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

test('a parcel gives back its chunks in order, copying those that share memory, and only once', () => {
  const body = new ReceivedBody();
  const big = randomBytes(1000);
  const view = big.subarray(100, 400); // part of a larger buffer: copied, left usable here
  const pooled = Buffer.from('time,volts\n'); // from Node's shared pool: not movable, copied
  const own = new Uint8Array(randomBytes(500)); // a buffer of its own: moved
  const expected = Buffer.concat([view, pooled, Buffer.from(own)]);
  body.add(view);
  body.add(pooled);
  body.add(own);
  expect(view.byteLength).toBe(300);
  expect(pooled.toString()).toBe('time,volts\n');
  expect(own.byteLength).toBe(0); // moved away, as a transfer leaves it
  expect(body.byteLength).toBe(expected.length);
  const parcel = body.take();
  expect(() => body.take()).toThrow(/already/);
  expect(createHash('sha256').update(readParcel(parcel)).digest('hex')).toBe(createHash('sha256').update(expected).digest('hex'));
});

test('a parcel that gives fewer or more bytes than announced is refused', () => {
  const short = new MessageChannel();
  short.port1.postMessage(new Uint8Array(10));
  expect(() => readParcel({ port: short.port2, byteLength: 11 })).toThrow(/10 of its 11 bytes/);
  const long = new MessageChannel();
  long.port1.postMessage(new Uint8Array(10));
  expect(() => readParcel({ port: long.port2, byteLength: 9 })).toThrow(/more bytes than it announced/);
  short.port1.close();
  long.port1.close();
});
