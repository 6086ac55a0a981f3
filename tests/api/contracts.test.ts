// The API is written once, in shared/contracts: every registered route has its contract and every
// contract its route, with the same access policy; answers are checked against the contract where
// CHECK_RESPONSES is on, and never on the reading write (the hot path), whose answers are checked here.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import express from 'express';
import supertest from 'supertest';
import { z } from 'zod';
import { createTestApp, DEMO, type TestApp } from '../setup/test-app';
import { newReading, stepOf, stripByLabel, venueIds } from './testing-helpers';
import { allContracts } from '../../shared/contracts';
import { contract, file, fullPath, json, type Contract } from '../../shared/contracts/contract';
import { readingsContracts } from '../../shared/contracts/readings';
import { readingDtoSchema } from '../../shared/schemas/readings';
import { ApiRouter, type RouteSpec } from '../../server/http/api-router';
import { errorHandler } from '../../server/middleware/error-handler';
import { loadEnv } from '../../server/config/env';

const routesOf = (app: TestApp): RouteSpec[] => (app.app as unknown as { routes: RouteSpec[] }).routes;
const key = (r: { method: string; path: string }) => `${r.method} ${r.path}`;

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t?.close());

describe('contracts and routes', () => {
  test('each registered route has a contract, and each contract exactly one route, with the contract’s access policy', () => {
    const routes = routesOf(t);
    const contracts = allContracts();
    const declared = new Map(contracts.map((c) => [key({ method: c.method, path: fullPath(c) }), c]));
    expect(declared.size, 'two contracts name the same method and path').toBe(contracts.length);

    const withoutContract = routes.filter((r) => declared.get(key(r)) !== r.contract).map(key);
    expect(withoutContract).toEqual([]);
    const registered = routes.map(key);
    expect(registered.length, 'a route is registered twice').toBe(new Set(registered).size);
    const withoutRoute = [...declared.keys()].filter((k) => !registered.includes(k));
    expect(withoutRoute).toEqual([]);
    for (const r of routes) expect(r.access, key(r)).toEqual(r.contract.access);
  });

  test('every JSON answer has a schema and every file answer a content type; only the reading write is hot', () => {
    for (const c of allContracts()) {
      if (c.answer.kind === 'json') expect(c.answer.schema, key(c)).toBeInstanceOf(z.ZodType);
      if (c.answer.kind === 'file') expect(c.answer.contentTypes.length, key(c)).toBeGreaterThan(0);
    }
    expect(
      allContracts()
        .filter((c) => c.hot)
        .map(key),
    ).toEqual(['POST /readings']);
  });
});

describe('answers checked against the contract', () => {
  const numberAnswer = contract({ method: 'GET', path: '/n', access: 'public', answer: json(z.strictObject({ n: z.number() })) });
  const csvAnswer = contract({ method: 'GET', path: '/f', access: 'public', answer: file('text/csv') });
  const hotAnswer = contract({ ...numberAnswer, path: '/hot', hot: true });

  function appWith(checkAnswers: boolean, answer: unknown, status?: number) {
    const logged: unknown[] = [];
    const api = new ApiRouter({ checkAnswers, log: (_m, err) => logged.push(err) });
    const handler = ({ res }: { res: express.Response }) => {
      if (status) res.status(status);
      return answer as { n: number };
    };
    api.route(numberAnswer as Contract as typeof numberAnswer, handler);
    api.route(hotAnswer as Contract as typeof hotAnswer, handler);
    api.route(csvAnswer, ({ res }) => {
      res.type('application/json').send('{}');
    });
    const app = express();
    app.use(api.router);
    app.use(errorHandler((_msg, err) => logged.push(err)));
    return { request: supertest(app), logged };
  }

  test('when checked, a wrong shape or an undeclared status is a 500 with the route named in the log', async () => {
    const wrongShape = appWith(true, { n: 'seven' });
    expect((await wrongShape.request.get('/n')).status).toBe(500);
    expect(String(wrongShape.logged[0])).toMatch(/GET \/api\/n does not match its contract: n: /);

    const extraField = appWith(true, { n: 7, secret: 'x' });
    expect((await extraField.request.get('/n')).status).toBe(500);

    const undeclared = appWith(true, { n: 7 }, 202);
    expect((await undeclared.request.get('/n')).status).toBe(500);
    expect(String(undeclared.logged[0])).toMatch(/status 202, declared 200/);

    const right = appWith(true, { n: 7 });
    const ok = await right.request.get('/n');
    expect([ok.status, ok.body]).toEqual([200, { n: 7 }]);
    expect(right.logged).toEqual([]);
  });

  test('a file sent with a type the contract does not declare is logged', async () => {
    const app = appWith(true, null);
    await app.request.get('/f');
    expect(String(app.logged[0])).toMatch(/Content-Type application\/json.*declared text\/csv/);
  });

  test('when not checked (CHECK_RESPONSES off) and on a hot route, the answer is sent as the handler gave it', async () => {
    const unchecked = appWith(false, { n: 'seven' });
    expect((await unchecked.request.get('/n')).body).toEqual({ n: 'seven' });
    const hot = appWith(true, { n: 'seven' });
    expect((await hot.request.get('/hot')).body).toEqual({ n: 'seven' });
    expect([...unchecked.logged, ...hot.logged]).toEqual([]);
  });

  test('CHECK_RESPONSES is on in tests, off otherwise unless set', () => {
    expect(loadEnv({ NODE_ENV: 'test' }).CHECK_RESPONSES).toBe('on');
    expect(loadEnv({}).CHECK_RESPONSES).toBe('off');
    expect(loadEnv({ NODE_ENV: 'production' }).CHECK_RESPONSES).toBe('off');
    expect(loadEnv({ CHECK_RESPONSES: 'on' }).CHECK_RESPONSES).toBe('on');
  });
});

describe('POST /api/readings (hot: its answers are checked here, not on the server)', () => {
  test('the first answer (201) and the replay (200) match the reading schema', async () => {
    expect(readingsContracts.record.hot).toBe(true);
    const { hall } = await venueIds(t);
    const strip = await stripByLabel(t, hall, 'Strip 3');
    const sam = await t.agentFor(DEMO.technician);
    const body = newReading(stepOf(strip, 'Left floor cable', 'continuity', 'B').step.id, '0.4');
    const first = await sam.post('/api/readings').send(body);
    const again = await sam.post('/api/readings').send(body);
    expect([first.status, again.status]).toEqual([201, 200]);
    expect(readingDtoSchema.parse(first.body)).toEqual(first.body);
    expect(readingDtoSchema.parse(again.body)).toEqual(again.body);
  });
});
