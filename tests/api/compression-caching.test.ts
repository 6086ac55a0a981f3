// What the hall's slow Wi-Fi gets: the built client's precompressed copies with the encoding the
// browser asked for (RFC 9110 §8.4 Content-Encoding, §12.5.5 Vary), hashed files cached for a year
// (RFC 9111 §5.2.2.1 max-age, RFC 8246 immutable), the files that name them revalidated, and JSON
// answers compressed from 1 KB. The client folder is made here, its copies with node:zlib.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { request as httpRequest, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { brotliCompressSync, brotliDecompressSync, gunzipSync, gzipSync } from 'node:zlib';
import { createTestApp, DEMO, DEMO_PASSWORD, ORIGIN, type TestApp } from '../setup/test-app';
import { newReading, stripByLabel, venueIds } from './testing-helpers';

let t: TestApp;
let dist: string;
const SCRIPT = 'index-C4fe9Ab1.js';
// A script of some size, like the built ones: repetitive enough to compress well.
const script = Array.from({ length: 400 }, (_, i) => `export const step${i} = () => "reading ${i}";`).join('\n');
const sw = `self.addEventListener('install', () => self.skipWaiting());\n${'// precache list\n'.repeat(200)}`;

let server: Server;

interface Raw {
  status: number;
  headers: Record<string, string | undefined>;
  body: Buffer;
}

/** The bytes as they travel (supertest would decode them), over a real socket. */
function raw(method: 'GET' | 'POST', path: string, headers: Record<string, string>, body?: unknown): Promise<Raw> {
  const { port } = server.address() as AddressInfo;
  const data = body === undefined ? undefined : JSON.stringify(body);
  return new Promise((resolve, reject) => {
    const req = httpRequest(
      {
        host: '127.0.0.1',
        port,
        method,
        path,
        headers: { Origin: ORIGIN, ...(data ? { 'Content-Type': 'application/json' } : {}), ...headers },
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () =>
          resolve({ status: res.statusCode!, headers: res.headers as Record<string, string | undefined>, body: Buffer.concat(chunks) }),
        );
        res.on('error', reject);
      },
    );
    req.on('error', reject);
    req.end(data);
  });
}

async function cookieOf(email: string): Promise<string> {
  const res = await t.request.post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email, password: DEMO_PASSWORD }).expect(200);
  return (res.headers['set-cookie'] as unknown as string[])[0].split(';')[0];
}

beforeAll(async () => {
  const base = await createTestApp({ seed: false });
  dist = join(base.dir, 'dist');
  await base.close();
  mkdirSync(join(dist, 'assets'), { recursive: true });
  writeFileSync(
    join(dist, 'index.html'),
    '<!doctype html><title>Stripwarden</title><script type="module" src="/assets/index-C4fe9Ab1.js"></script>',
  );
  writeFileSync(join(dist, 'sw.js'), sw);
  writeFileSync(join(dist, 'workbox-9c191d2f.js'), sw);
  writeFileSync(join(dist, 'manifest.webmanifest'), '{"name":"Stripwarden"}');
  writeFileSync(join(dist, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
  writeFileSync(join(dist, 'assets', SCRIPT), script);
  // The build writes these copies beside the original (vite-plugin-compression2 in vite.config.ts).
  writeFileSync(join(dist, 'assets', `${SCRIPT}.br`), brotliCompressSync(script));
  writeFileSync(join(dist, 'assets', `${SCRIPT}.gz`), gzipSync(script, { level: 9 }));
  t = await createTestApp({ distDir: dist });
  server = t.app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
});
afterAll(async () => {
  await new Promise((r) => server?.close(r));
  await t?.close();
});

describe('the built client', () => {
  test('when the browser takes brotli, then a hashed script comes as its brotli copy, varying by Accept-Encoding, cached for a year', async () => {
    const res = await raw('GET', `/assets/${SCRIPT}`, { 'Accept-Encoding': 'gzip, deflate, br' });
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['content-type']).toMatch(/^(text|application)\/javascript/);
    expect(res.headers.vary).toMatch(/Accept-Encoding/i);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(brotliDecompressSync(res.body).toString()).toBe(script);
    expect(Number(res.headers['content-length'])).toBeLessThan(script.length / 4);
  });

  test('when the browser takes only gzip, then it gets the gzip copy', async () => {
    const res = await raw('GET', `/assets/${SCRIPT}`, { 'Accept-Encoding': 'gzip' });
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(gunzipSync(res.body).toString()).toBe(script);
  });

  test('when the browser takes no encoding, then it gets the file as built, with the same caching and Vary', async () => {
    const res = await raw('GET', `/assets/${SCRIPT}`, { 'Accept-Encoding': 'identity' });
    expect(res.headers['content-encoding']).toBeUndefined();
    expect(res.headers.vary).toMatch(/Accept-Encoding/i);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.body.toString()).toBe(script);
  });

  test('when the page, the service worker or the manifest is asked for, then it must be revalidated each time (no-cache)', async () => {
    for (const path of ['/index.html', '/sw.js', '/manifest.webmanifest', '/strips/some-strip/test']) {
      const res = await raw('GET', path, { 'Accept-Encoding': 'br, gzip' });
      expect(res.status, path).toBe(200);
      expect(res.headers['cache-control'], path).toBe('no-cache');
    }
  });

  test('when a file has no copy from the build (the service worker), then it is compressed as it is sent', async () => {
    const res = await raw('GET', '/sw.js', { 'Accept-Encoding': 'gzip' });
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(gunzipSync(res.body).toString()).toBe(sw);
    expect(res.headers['cache-control']).toBe('no-cache');
  });

  test("when Workbox's hashed runtime is asked for, then it is cached for a year; a file without a hash for an hour", async () => {
    expect((await t.request.get('/workbox-9c191d2f.js')).headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect((await t.request.get('/favicon.svg')).headers['cache-control']).toBe('public, max-age=3600');
  });
});

describe('JSON answers', () => {
  test('when an answer is over 1 KB and the browser takes gzip, then it is compressed and still not stored by caches', async () => {
    const { hall } = await venueIds(t);
    const res = await raw('GET', `/api/venues/${hall}/strips`, { 'Accept-Encoding': 'gzip', Cookie: await cookieOf(DEMO.director) });
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.headers['cache-control']).toBe('no-store');
    const body = gunzipSync(res.body);
    expect(body.length).toBeGreaterThan(1024);
    expect((JSON.parse(body.toString()) as unknown[]).length).toBe(24);
  });

  test('when the browser takes brotli too, then the answer is brotli', async () => {
    const { hall } = await venueIds(t);
    const res = await raw('GET', `/api/venues/${hall}/strips`, { 'Accept-Encoding': 'gzip, br', Cookie: await cookieOf(DEMO.director) });
    expect(res.headers['content-encoding']).toBe('br');
    expect((JSON.parse(brotliDecompressSync(res.body).toString()) as unknown[]).length).toBe(24);
  });

  test('when an answer is under 1 KB, then it goes uncompressed', async () => {
    const res = await raw('GET', '/api/auth/me', { 'Accept-Encoding': 'gzip, br', Cookie: await cookieOf(DEMO.technician) });
    expect(res.status).toBe(200);
    expect(res.body.length).toBeLessThan(1024);
    expect(res.headers['content-encoding']).toBeUndefined();
  });

  test('when a single reading is recorded, then its answer is never compressed (the write is the hot path)', async () => {
    const sam = await t.agentFor(DEMO.technician);
    const { hall } = await venueIds(t);
    const strip = await stripByLabel(t, hall, 'Strip 20');
    // A long correction reason puts the answer above the threshold: it still goes as it is.
    const first = await sam.post('/api/readings').send(newReading(strip.positions[1].steps[0].id, '0.5')).expect(201);
    const res = await raw(
      'POST',
      '/api/readings',
      { 'Accept-Encoding': 'gzip, br', Cookie: await cookieOf(DEMO.technician) },
      newReading(strip.positions[1].steps[0].id, '0.6', {
        supersedesId: first.body.id,
        correctionReason: 'Probe slipped off the pin. '.repeat(18),
      }),
    );
    expect(res.status).toBe(201);
    expect(res.body.length).toBeGreaterThan(1024);
    expect(res.headers['content-encoding']).toBeUndefined();
  });
});
