// Property-based fuzzing (fast-check): every JSON route's body (enumerated from the router) with
// arbitrary JSON, malformed text and near-valid objects, and the parsers of readings, traces and
// register cells. Never a 500, never a crash; an answer that is not 2xx is problem+json.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import fc from 'fast-check';
import supertest from 'supertest';
import { randomUUID } from 'node:crypto';
import { createTestApp, DEMO, ORIGIN, type TestApp } from '../setup/test-app';
import { stripByLabel, venueIds } from '../api/testing-helpers';
import { parseReading, type Quantity } from '../../shared/domain/units';
import { judgeTypedReading, parseLeadNull } from '../../shared/domain/typed-reading';
import { parseTraceCsv, WaveformError } from '../../shared/domain/waveform';
import {
  normaliseHeader,
  parseConductor,
  parseDecimal,
  parseKind,
  parseLength,
  parseStatus,
  parseUnit,
  suggestMapping,
  unguardCell,
  unitFromHeader,
} from '../../shared/domain/register-import';
import { DEFAULT_LIMIT_PROFILE } from '../../shared/domain/limits';
import type { RouteSpec } from '../../server/http/api-router';
import { bodyKindOf } from '../../shared/contracts/contract';

/** The routes createApp() declares (Express's own typing of app.routes would hide their type). */
const routesOf = (app: TestApp): RouteSpec[] => (app.app as unknown as { routes: RouteSpec[] }).routes;

type Agent = ReturnType<typeof supertest.agent>;
const RUNS = 25;

/** Routes whose body is not JSON (files, a trace as text), from their contracts: fuzzed elsewhere or not by body. */
const notJson = (r: RouteSpec) => ['multipart', 'text'].includes(bodyKindOf(r.contract));

let t: TestApp;
let params: Record<string, string>;
const as: Record<string, Agent> = {};

beforeAll(async () => {
  t = await createTestApp();
  as.director = await t.agentFor(DEMO.director);
  as.admin = await t.agentFor(DEMO.admin);
  as.anonymous = supertest.agent(t.app).set('Origin', ORIGIN);
  const { hall } = await venueIds(t);
  const strip = await stripByLabel(t, hall, 'Strip 14');
  const faults = (await as.director.get(`/api/venues/${hall}/faults`)).body as { id: string }[];
  const register = (await as.director.get('/api/equipment')).body as { id: string }[];
  const profiles = (await as.director.get('/api/profiles')).body as { id: string }[];
  const events = (await as.director.get('/api/events')).body as { id: string }[];
  const spare = await as.admin.post('/api/users').send({ email: 'fuzz@lakeshore.example', name: 'Fuzz Target', role: 'technician' });
  params = {
    venues: hall,
    strips: strip.id,
    faults: faults[0].id,
    equipment: register[0].id,
    profiles: profiles[0].id,
    events: events[0].id,
    positions: strip.positions[1].id,
    steps: strip.positions[1].steps[0].id,
    users: spare.body.id,
    certificates: 'SW-2026-0000-0000-V',
    'set-password': 'not-a-real-token',
  };
});
afterAll(() => t?.close());

/** A valid body per route, the seed of the near-valid mutations. */
function validBody(route: string): Record<string, unknown> | null {
  const bodies: Record<string, Record<string, unknown>> = {
    'POST /api/auth/sign-in': { email: DEMO.technician, password: 'wrong-password' },
    'PUT /api/auth/preferences': { unitSystem: 'metric' },
    'POST /api/auth/password-reset': { email: 'nobody@lakeshore.example' },
    'POST /api/auth/set-password/:token': { password: 'a long new password 2026' },
    'POST /api/users': { email: 'someone@lakeshore.example', name: 'Someone', role: 'technician' },
    'PATCH /api/users/:id': { name: 'Fuzz Target' },
    'POST /api/readings': { id: randomUUID(), stepId: params.steps, value: '0.5', leadNullId: null },
    'POST /api/readings/batch': { readings: [{ id: randomUUID(), stepId: params.steps, value: '0.5', leadNullId: null }] },
    'POST /api/faults': { positionId: params.positions, kind: 'open', conductors: 'A' },
    'PATCH /api/faults/:id': { notes: 'x' },
    'POST /api/faults/:id/estimates': { method: 'flex', distanceM: 3, uncertaintyM: 0.2, fromEnd: 'near' },
    'POST /api/faults/:id/repairs': { action: 'connector-remade' },
    'POST /api/faults/:id/dismiss': { reason: 'Opened on the wrong cable, nothing was measured.' },
    'POST /api/lead-nulls': { id: randomUUID(), value: '0.12', meter: 'Meter 1' },
    'POST /api/equipment': { assetTag: 'FZ-1', kind: 'floor-cable', lengthM: 12 },
    'PATCH /api/equipment/:id': { notes: 'x' },
    'POST /api/equipment/:id/calibrations': { roundTripNs: 120, lengthM: 12 },
    'POST /api/events': { name: 'Fuzz Cup', startsOn: '2027-01-01', endsOn: '2027-01-02' },
    'POST /api/events/:id/venues': { name: 'Fuzz Hall', profileId: params.profiles },
    'PATCH /api/venues/:id': { name: 'Riverside Sports Hall' },
    'POST /api/venues/:id/strips/bulk': { count: 1 },
    'PUT /api/venues/:id/technicians': { userIds: [] },
    'PUT /api/venues/:id/equipment': { positions: [{ positionId: params.positions, assetTag: null }] },
    'PATCH /api/strips/:id': { zone: 'Row B' },
    'POST /api/strips/:id/withdraw': { reason: 'Fuzz reason' },
    'POST /api/strips/:id/positions': { name: 'Fuzz reel', equipmentKind: 'reel' },
    'PUT /api/positions/:id/equipment': { assetTag: null },
    'POST /api/positions/:id/steps': { testKind: 'loop', conductors: 'A-B' },
    'POST /api/profiles/:id/copy': { name: 'Fuzz rules' },
    'PUT /api/profiles/:id': { rules: DEFAULT_LIMIT_PROFILE.rules },
    'POST /api/fault-location': { method: 'tdr', roundTripNs: 100, velocityFactor: 0.66 },
    'POST /api/venues/:id/sign-off': { password: 'wrong-password' },
    'POST /api/certificates/:number/revoke': { reason: 'Fuzz reason' },
    'POST /api/venues/:id/incidents': { stripId: params.strips, symptom: 'Fuzz symptom', clientId: randomUUID() },
    'POST /api/incidents/:id/swap': { positionId: params.positions, replacementAssetTag: 'FC-001' },
    'PUT /api/venues/:id/spares': { assetTags: [] },
    'POST /api/venues/:id/amendments': { password: 'wrong-password', incidentIds: [randomUUID()] },
  };
  return bodies[route] ?? null;
}

/** One small change to a valid body: a field dropped, retyped, blown up, or an unknown one added. */
const nearValid = (base: Record<string, unknown>) => {
  const keys = Object.keys(base);
  const odd = fc.oneof(
    fc.jsonValue(),
    fc.constantFrom(null, '', ' ', -1, 0, 1e308, -1e308, 'x'.repeat(5000), [], {}, true, '../../etc/passwd', '<script>', '\u0000', 'NaN'),
  );
  return fc.oneof(
    fc.constantFrom(...keys).map((k) => Object.fromEntries(Object.entries(base).filter(([key]) => key !== k))),
    fc.tuple(fc.constantFrom(...keys), odd).map(([k, v]) => ({ ...base, [k]: v })),
    fc.tuple(fc.string({ minLength: 1, maxLength: 12 }), odd).map(([k, v]) => ({ ...base, [k]: v })),
  );
};

function agentFor(access: unknown): Agent {
  if (access === 'public') return as.anonymous;
  if (Array.isArray(access) && !access.includes('director')) return as.admin;
  return as.director;
}

function pathOf(template: string): string {
  return template.replace(/\/([^/]+)\/:(\w+)/g, (_m, segment: string) => `/${segment}/${params[segment] ?? randomUUID()}`);
}

async function expectProblemOrSuccess(route: string, res: supertest.Response, sent: string) {
  const where = `${route} with ${sent.slice(0, 200)}`;
  expect(res.status, `${where} → ${res.status} ${res.text?.slice(0, 200)}`).toBeLessThan(500);
  if (res.status >= 400) expect(String(res.headers['content-type']), where).toMatch(/^application\/problem\+json/);
}

describe('bad input to every JSON route', () => {
  test('every POST, PUT and PATCH route with a JSON body (by its contract) has a valid body to mutate', () => {
    const writes = routesOf(t).filter(
      (r) => r.method !== 'GET' && r.method !== 'DELETE' && !notJson(r) && bodyKindOf(r.contract) !== 'none',
    );
    const unknown = writes.map((r) => `${r.method} ${r.path}`).filter((r) => validBody(r) === null);
    expect(
      unknown,
      `New write routes with a JSON body: give them a valid body in validBody() (tests/reliability/bad-input.test.ts):\n  ${unknown.join('\n  ')}`,
    ).toEqual([]);
  });

  test(
    'arbitrary JSON, malformed text and near-valid bodies never give a 500, and every refusal is problem+json',
    { timeout: 120_000 },
    async () => {
      const routes = routesOf(t).filter((r) => r.method !== 'GET' && r.method !== 'DELETE' && !notJson(r));
      for (const r of routes) {
        const route = `${r.method} ${r.path}`;
        // Sign-out would end the session the fuzzing uses: it is sent without one.
        const agent = route === 'POST /api/auth/sign-out' ? as.anonymous : agentFor(r.access);
        const send = (body: string) =>
          agent[r.method.toLowerCase() as 'post'](pathOf(r.path)).set('Content-Type', 'application/json').send(body);
        await fc.assert(
          fc.asyncProperty(fc.jsonValue({ maxDepth: 3 }), async (value) => {
            const body = JSON.stringify(value);
            await expectProblemOrSuccess(route, await send(body), body);
          }),
          { numRuns: RUNS },
        );
        await fc.assert(
          fc.asyncProperty(fc.string({ maxLength: 60 }), async (text) => {
            await expectProblemOrSuccess(route, await send(text), text);
          }),
          { numRuns: Math.ceil(RUNS / 2) },
        );
        const base = validBody(route);
        if (base) {
          await fc.assert(
            fc.asyncProperty(nearValid(base), async (value) => {
              const body = JSON.stringify(value);
              await expectProblemOrSuccess(route, await send(body), body);
            }),
            { numRuns: RUNS },
          );
        }
      }
    },
  );
});

describe('bad input inside a batch of readings', () => {
  test(
    'near-valid readings in a batch: each result is a reading or a refusal with its problem, never a 500, and the answer is 200',
    { timeout: 60_000 },
    async () => {
      const reading = { id: randomUUID(), stepId: params.steps, value: '0.5' };
      await fc.assert(
        fc.asyncProperty(
          fc.array(fc.oneof(nearValid(reading), fc.jsonValue({ maxDepth: 2 })), { minLength: 1, maxLength: 8 }),
          async (list) => {
            const body = JSON.stringify({ readings: list });
            const res = await as.director.post('/api/readings/batch').set('Content-Type', 'application/json').send(body);
            expect(res.status, `${body.slice(0, 200)} → ${res.status} ${res.text?.slice(0, 200)}`).toBe(200);
            const results = res.body.results as { status: number; reading?: unknown; problem?: { status: number; detail: string } }[];
            expect(results).toHaveLength(list.length);
            for (const r of results) {
              expect(r.status, `${body.slice(0, 200)} → ${JSON.stringify(r).slice(0, 200)}`).toBeLessThan(500);
              if (r.status >= 400) expect(r.problem?.status).toBe(r.status);
              else expect(r.reading).toBeTruthy();
            }
          },
        ),
        { numRuns: RUNS },
      );
    },
  );
});

describe('bad input to the parsers', () => {
  const text = fc.oneof(
    fc.string(),
    fc.string({ unit: 'grapheme' }),
    fc.constantFrom('OL', '1e400', '-0', '0,5 kΩ', '∞', '1.2.3', 'NaN', '١٢', '  ', 'Ω'),
  );

  test('parseReading answers ok or a message for any text, and never throws', () => {
    fc.assert(
      fc.property(
        text,
        fc.constantFrom<Quantity>('resistance', 'capacitance', 'time'),
        fc.option(fc.double(), { nil: undefined }),
        (s, q, lead) => {
          const r = parseReading(s, q, lead === undefined ? undefined : { leadOffsetOhm: lead });
          if (r.ok) expect(Number.isFinite(r.value) || r.overRange).toBe(true);
          else expect(typeof r.message).toBe('string');
        },
      ),
      { numRuns: 2000 },
    );
  });

  test('judgeTypedReading and parseLeadNull answer a verdict or a refusal for any text and any null, and never throw', () => {
    const ctx = fc.record({
      equipmentKind: fc.constantFrom('floor-cable', 'reel', 'piste', 'body-wire', 'apparatus', 'other' as const),
      testKind: fc.constantFrom('continuity', 'insulation', 'loop', 'piste-end-to-end', 'piste-earth' as const),
      conductors: fc.oneof(fc.constantFrom('A', 'B-C', 'piste'), fc.string({ maxLength: 4 })),
      lengthM: fc.option(fc.double(), { nil: null }),
      temperatureC: fc.option(fc.double(), { nil: null }),
    });
    fc.assert(
      fc.property(text, ctx, fc.option(fc.double(), { nil: null }), (s, c, lead) => {
        const r = judgeTypedReading(s, { profile: DEFAULT_LIMIT_PROFILE, ...c }, lead);
        if (r.ok) expect(['pass', 'near-limit', 'fail']).toContain(r.verdict.verdict);
        else expect(typeof r.message).toBe('string');
        const n = parseLeadNull(s);
        if (n.ok) expect(n.valueOhm >= 0 && n.valueOhm <= 1).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  test('parseTraceCsv returns a trace or refuses with a WaveformError, nothing else', () => {
    const line = fc.tuple(
      fc.oneof(fc.double().map(String), fc.string({ maxLength: 8 })),
      fc.constantFrom(',', ';', '\t', ' ', ''),
      fc.oneof(fc.double().map(String), fc.string({ maxLength: 8 })),
    );
    const csv = fc.oneof(
      fc.string({ maxLength: 400 }),
      fc.array(line, { maxLength: 60 }).map((ls) => ls.map(([a, d, b]) => a + d + b).join('\n')),
      fc
        .array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 10, maxLength: 80 })
        .map((vs) => vs.map((v, i) => `${i * 1e-9},${v}`).join('\r\n')),
    );
    fc.assert(
      fc.property(csv, fc.option(fc.integer({ min: -5, max: 100 }), { nil: undefined }), (s, max) => {
        try {
          const trace = parseTraceCsv(s, max === undefined ? undefined : { maxSamples: max });
          expect(trace.timeS.length).toBe(trace.volts.length);
        } catch (err) {
          expect(err).toBeInstanceOf(WaveformError);
        }
      }),
      { numRuns: 2000 },
    );
  });

  test('the register import cell parsers answer for any text and never throw', () => {
    fc.assert(
      fc.property(text, text, fc.array(text, { maxLength: 10 }), (a, b, headers) => {
        normaliseHeader(a);
        unitFromHeader(a);
        parseUnit(a);
        expect(typeof parseDecimal(a)).toBe('number');
        const len = parseLength(a, b, unitFromHeader(b));
        if (len.ok) expect(len.value).toBeGreaterThan(0);
        parseConductor(a, 'mm2');
        parseConductor(a, 'awg');
        parseKind(a);
        parseStatus(a);
        expect(typeof unguardCell(a)).toBe('string');
        suggestMapping(headers);
      }),
      { numRuns: 2000 },
    );
  });
});
