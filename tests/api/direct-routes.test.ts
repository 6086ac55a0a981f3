// The reading write served straight from Node's HTTP server (server/http/direct-routes.ts) must
// answer exactly as Express does, and must hand every request it is not sure of to Express.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import { connect, type AddressInfo } from 'node:net';
import { once } from 'node:events';
import supertest, { type Response } from 'supertest';
import { createTestApp, DEMO, DEMO_PASSWORD, ORIGIN, type TestApp } from '../setup/test-app';
import { newReading, stepOf, stripByLabel, venueIds } from './testing-helpers';
import { directRoutes } from '../../server/http/direct-routes';
import { readingsContracts } from '../../shared/contracts/readings';
import { API_BODY_LIMIT_BYTES, directOptions } from '../../server/app';
import { readingsRoutes } from '../../server/routes/readings.routes';
import { authService } from '../../server/services/auth.service';

let t: TestApp;
let stepId: string;
let annexStepId: string;
let samCookie: string;
let nina: string;
/** The URLs the direct path handed on to Express. */
const handedOn: string[] = [];
let direct: (req: IncomingMessage, res: ServerResponse) => void;

async function cookieOf(email: string) {
  const res = await supertest(t.app).post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email, password: DEMO_PASSWORD });
  expect(res.status).toBe(200);
  return String(res.headers['set-cookie']).split(';')[0]!;
}

beforeAll(async () => {
  t = await createTestApp();
  const { hall, annex } = await venueIds(t);
  stepId = stepOf(await stripByLabel(t, hall, 'Strip 21'), 'Left floor cable', 'continuity', 'A').step.id;
  annexStepId = stepOf(await stripByLabel(t, annex, 'Annex 2'), 'Left floor cable', 'continuity', 'A').step.id;
  samCookie = await cookieOf(DEMO.technician);
  nina = await cookieOf(DEMO.organiser);
  direct = directRoutes(directOptionsOfTestApp(), (req, res) => {
    handedOn.push(req.url ?? '');
    t.app.express(req as never, res as never);
  });
});
afterAll(() => t.close());

/** The options server/app.ts gives the direct path, for the test app's deps. */
const directOptionsOfTestApp = () => directOptions(t.deps, authService(t.deps), readingsRoutes(t.deps).hot);

/** What must be the same on both paths: status, headers but the per-request ones, body. */
function comparable(res: Response) {
  const headers: Record<string, unknown> = { ...res.headers };
  for (const h of ['date', 'connection', 'keep-alive', 'location', 'content-length']) delete headers[h];
  // The ids of the two readings differ; all else in the body must not.
  const body = { ...res.body, id: undefined, takenAt: undefined, receivedAt: undefined };
  return { status: res.status, headers, body, location: res.headers.location?.replace(/[0-9a-f-]{36}$/, ':id') };
}

const post = (target: typeof direct | TestApp['app']['express'], cookie = samCookie) =>
  supertest(target).post('/api/readings').set('Origin', ORIGIN).set('Cookie', cookie);

describe('the direct reading write', () => {
  test('a new reading and its replay get the same status, headers and body as through Express', async () => {
    const viaDirect = newReading(stepId, '0.4');
    const viaExpress = newReading(stepId, '0.4');
    handedOn.length = 0;
    const first = [await post(direct).send(viaDirect), await post(t.app.express).send(viaExpress)];
    expect(handedOn).toEqual([]);
    expect(first[0]!.status).toBe(201);
    expect(comparable(first[0]!)).toEqual(comparable(first[1]!));
    expect(first[0]!.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(first[0]!.headers['cache-control']).toBe('no-store');
    expect(first[0]!.headers.location).toBe(`/api/readings/${viaDirect.id}`);
    // The same reading sent again (a tablet's retry) is the stored one, 200, on either path.
    const again = [await post(direct).send(viaExpress), await post(t.app.express).send(viaDirect)];
    expect(again.map((r) => r.status)).toEqual([200, 200]);
    expect(again[0]!.body).toEqual(first[1]!.body);
    expect(again[1]!.body).toEqual(first[0]!.body);
  });

  test.each([
    ['a field missing', JSON.stringify({ id: crypto.randomUUID(), value: '0.4' })],
    ['an unknown field', JSON.stringify({ ...newReading('x', '0.4'), stepId: undefined, extra: 1 })],
    ['a value that is not a number', JSON.stringify({ id: crypto.randomUUID(), stepId: 'x', value: 'lots' })],
    ['malformed JSON', '{"id": '],
    ['an empty body', ''],
    ['a bare JSON value', '5'],
    ['a step that does not exist', JSON.stringify(newReading(crypto.randomUUID(), '0.4'))],
  ])('%s: the same refusal as through Express, and nothing handed on', async (_what, text) => {
    handedOn.length = 0;
    const send = (target: Parameters<typeof post>[0]) => post(target).set('Content-Type', 'application/json').send(text);
    const [a, b] = [await send(direct), await send(t.app.express)];
    expect(handedOn).toEqual([]);
    expect(a.status).toBeGreaterThanOrEqual(400);
    expect(a.status).toBeLessThan(500);
    expect(a.headers['content-type']).toBe('application/problem+json; charset=utf-8');
    expect(comparable(a)).toEqual(comparable(b));
  });

  test('a technician writing to another venue is refused the same way on both paths', async () => {
    handedOn.length = 0;
    const [a, b] = [
      await post(direct).send(newReading(annexStepId, '0.4')),
      await post(t.app.express).send(newReading(annexStepId, '0.4')),
    ];
    expect(handedOn).toEqual([]);
    expect([403, 404]).toContain(a.status);
    expect(comparable(a)).toEqual(comparable(b));
  });

  test.each<[string, (r: supertest.Test) => supertest.Test]>([
    ['no session cookie', (r) => r.set('Cookie', '')],
    ['a session that does not exist', (r) => r.set('Cookie', 'sw_session=not-a-token')],
    ['an organiser (no reading rights)', (r) => r.set('Cookie', nina)],
    ['another site', (r) => r.set('Origin', 'http://elsewhere.example')],
    ['an unknown host', (r) => r.set('Host', 'rebound.example')],
    ['a forwarded host we do not answer for', (r) => r.set('X-Forwarded-Host', 'rebound.example')],
    ['text/plain', (r) => r.set('Content-Type', 'text/plain')],
    ['a Latin-1 charset', (r) => r.set('Content-Type', 'application/json; charset=latin1')],
    ['a gzip body', (r) => r.set('Content-Encoding', 'gzip')],
  ])('%s: handed to Express, which answers it as before', async (_what, change) => {
    const body = JSON.stringify(newReading(stepId, '0.4'));
    handedOn.length = 0;
    const a = await change(post(direct).set('Content-Type', 'application/json')).send(body);
    expect(handedOn).toEqual(['/api/readings']);
    const b = await change(post(t.app.express).set('Content-Type', 'application/json')).send(body);
    expect(a.status).toBeGreaterThanOrEqual(400);
    expect(comparable(a)).toEqual(comparable(b));
  });

  test('a body over the limit is handed to Express and refused 413 without being read here', async () => {
    handedOn.length = 0;
    const big = JSON.stringify({ ...newReading(stepId, '0.4'), note: 'x'.repeat(API_BODY_LIMIT_BYTES) });
    const res = await post(direct).set('Content-Type', 'application/json').send(big);
    expect(handedOn).toEqual(['/api/readings']);
    expect(res.status).toBe(413);
  });

  test('a client that hangs up halfway through its body leaves nothing stored and the server answering', async () => {
    const server = createServer(direct).listen(0, '127.0.0.1');
    await once(server, 'listening');
    const port = (server.address() as AddressInfo).port;
    try {
      const reading = newReading(stepId, '0.4');
      const body = JSON.stringify(reading);
      const arrived = once(server, 'request');
      const socket = connect(port, '127.0.0.1');
      await once(socket, 'connect');
      socket.write(
        `POST /api/readings HTTP/1.1\r\nHost: localhost\r\nOrigin: ${ORIGIN}\r\nCookie: ${samCookie}\r\n` +
          `Content-Type: application/json\r\nContent-Length: ${body.length}\r\n\r\n${body.slice(0, 20)}`,
      );
      // The server has the request's headers and part of its body when the tablet goes away.
      await arrived;
      socket.destroy();
      await once(socket, 'close');
      const after = await supertest(server).get(`/api/readings/${reading.id}`).set('Cookie', samCookie);
      expect(after.status).toBe(404);
      expect((await post(direct).send(newReading(stepId, '0.4'))).status).toBe(201);
    } finally {
      server.close();
    }
  });

  test('a handler that throws (a bug) is answered 500 problem+json and logged, and the next write is served', async () => {
    const logged: string[] = [];
    const buggy = directRoutes(
      {
        ...directOptionsOfTestApp(),
        routes: [
          {
            contract: readingsContracts.record,
            handler: (() => {
              throw new Error('a bug in the handler');
            }) as never,
          },
        ],
        log: (msg) => logged.push(msg),
      },
      (req, res) => t.app.express(req as never, res as never),
    );
    const res = await post(buggy).send(newReading(stepId, '0.4'));
    expect(res.status).toBe(500);
    expect(res.headers['content-type']).toBe('application/problem+json; charset=utf-8');
    expect(res.body).toMatchObject({ status: 500, code: 'server-error' });
    expect(logged).toEqual(['unhandled error']);
    expect((await post(direct).send(newReading(stepId, '0.4'))).status).toBe(201);
  });

  test('the application itself serves a reading write on the direct path', async () => {
    // createApp's listener: the same answer as Express, through the wiring of server/app.ts.
    const res = await post(t.app).send(newReading(stepId, '0.4'));
    expect(res.status).toBe(201);
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});
