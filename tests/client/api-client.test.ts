// The client's fetchers are built from the contracts: the path and query from the entry, the answer
// parsed with its schema in development and tests. Against the real server, so the client's idea of
// each path and answer is the one the router serves.
import { afterAll, afterEach, beforeAll, describe, expect, test, vi } from 'vitest';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { ZodError } from 'zod';
import { createTestApp, DEMO, DEMO_PASSWORD, ORIGIN, type TestApp } from '../setup/test-app';
import { ApiError, call, pathOf, urlOf } from '../../src/lib/api-client';
import { boardContracts } from '../../shared/contracts/board';
import { certificatesContracts } from '../../shared/contracts/certificates';
import { equipmentContracts } from '../../shared/contracts/equipment';
import { venuesContracts } from '../../shared/contracts/venues';
import { stripsContracts } from '../../shared/contracts/strips';
import { planContracts } from '../../shared/contracts/plan';
import { authContracts } from '../../shared/contracts/auth';

describe('paths from contracts', () => {
  test('params are filled in and encoded, query values that are not set are left out', () => {
    expect(pathOf(boardContracts.get, { id: 'a b/c' })).toBe('/venues/a%20b%2Fc/board');
    expect(pathOf(equipmentContracts.list, undefined, { kind: 'reel', status: undefined, q: '' })).toBe('/equipment?kind=reel');
    expect(pathOf(equipmentContracts.list, undefined, { q: 'FC & reel' })).toBe('/equipment?q=FC+%26+reel');
    expect(urlOf(certificatesContracts.pdf, { number: 'SW-2026-0000-0000-V' })).toBe('/api/certificates/SW-2026-0000-0000-V/pdf');
    expect(urlOf(certificatesContracts.jwks)).toBe('/.well-known/jwks.json');
  });

  test('a missing path parameter is a programming error, not a request to a wrong address', () => {
    expect(() => pathOf(boardContracts.get, {} as { id: string })).toThrow(/needs the path parameter id/);
  });
});

describe('fetchers against the server', () => {
  let t: TestApp;
  let server: Server;
  let base: string;
  let cookie = '';
  const realFetch = globalThis.fetch;

  beforeAll(async () => {
    t = await createTestApp();
    server = t.app.listen(0);
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    // The browser's fetch: same origin, the session cookie kept.
    vi.stubGlobal('fetch', async (url: string, init: RequestInit = {}) => {
      const res = await realFetch(`${base}${url}`, {
        ...init,
        headers: { ...(init.headers as Record<string, string>), Origin: ORIGIN, Cookie: cookie },
      });
      const set = res.headers.get('set-cookie');
      if (set) cookie = set.split(';')[0]!;
      return res;
    });
  });
  afterAll(async () => {
    vi.unstubAllGlobals();
    await new Promise((r) => server?.close(r));
    await t?.close();
  });
  afterEach(() => vi.restoreAllMocks());

  test('signed in through the contract, the venues, a board, a strip and a plan come back as their schemas say', async () => {
    const me = await call(authContracts.signIn, { body: { email: DEMO.director, password: DEMO_PASSWORD } });
    expect(me.user.role).toBe('director');
    const venues = await call(venuesContracts.list);
    const hall = venues.find((v) => v.name === 'Riverside Sports Hall')!;
    const board = await call(boardContracts.get, { params: { id: hall.id } });
    expect(board.venue.id).toBe(hall.id);
    const strip = await call(stripsContracts.get, { params: { id: board.strips[0]!.id } });
    expect(strip.venueId).toBe(hall.id);
    const plan = await call(planContracts.getPlan, { params: { id: hall.id } });
    expect(plan.strips.length).toBe(board.strips.length);
    const reels = await call(equipmentContracts.list, { query: { kind: 'reel' } });
    expect(reels.length).toBeGreaterThan(0);
    expect(reels.every((r) => r.kind === 'reel')).toBe(true);
  });

  test('a refusal is an ApiError with the problem’s code and field errors', async () => {
    const err = await call(boardContracts.get, { params: { id: 'not-an-id' } }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect(err).toMatchObject({ status: 422, code: 'invalid-input', errors: [{ path: 'id' }] });
  });

  test('in tests an answer that does not match the contract is refused by the client too', async () => {
    vi.stubGlobal('fetch', async () => new Response(JSON.stringify([{ id: 'x' }]), { headers: { 'Content-Type': 'application/json' } }));
    await expect(call(venuesContracts.list)).rejects.toBeInstanceOf(ZodError);
    vi.stubGlobal('fetch', async (url: string, init: RequestInit = {}) =>
      realFetch(`${base}${url}`, { ...init, headers: { ...(init.headers as Record<string, string>), Origin: ORIGIN, Cookie: cookie } }),
    );
  });
});
