// What the sync indicator says when the browser's online flag is wrong. Chromium reports
// navigator.onLine === true, with no offline event, on a page its service worker served with no
// network once the worker had been restarted (e2e/offline.spec.ts does exactly that); a hall's
// Wi-Fi with no route to the server looks the same. The tablet is offline when the server does not
// answer, and finds out by itself when it answers again.
import { afterEach, beforeEach, describe, expect, test, vi } from 'vitest';
import { summarize, type SyncState } from '../../src/features/offline/utils/queue';
import type { ReadingDto } from '../../shared/schemas/readings';

type Outbox = typeof import('../../src/features/offline/stores/outbox');

interface FakeServer {
  up: boolean;
  readings: { id: string; stepId: string; value: string }[];
  requests: string[];
}

/** A stored reading as POST /api/readings answers it (shared/contracts/readings.ts). */
function storedReading(body: FakeServer['readings'][number]): ReadingDto {
  return {
    id: body.id,
    stepId: body.stepId,
    equipmentId: null,
    valueText: body.value,
    valueOhm: Number(body.value),
    overRange: false,
    leadOffsetOhm: null,
    leadNullId: null,
    temperatureC: null,
    verdict: 'pass',
    limitOhm: 2.5,
    limitKind: 'max',
    source: 'House rule',
    ruleId: null,
    profileId: 'profile',
    profileVersion: 1,
    explanation: '',
    supersedesId: null,
    correctionReason: null,
    takenAt: new Date().toISOString(),
    receivedAt: new Date().toISOString(),
    takenBy: 'user-sam',
    takenByName: 'Sam',
    faultId: null,
  };
}

/** A browser page (window events, navigator.onLine, fetch) in front of a server that may be away. */
function fakeBrowser(opts: { onLine: boolean }) {
  const win = new EventTarget();
  const nav = { onLine: opts.onLine };
  const server: FakeServer = { up: false, readings: [], requests: [] };
  vi.stubGlobal('window', win);
  vi.stubGlobal('navigator', nav);
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init?: RequestInit) => {
      server.requests.push(`${init?.method ?? 'GET'} ${url}`);
      if (!server.up || !nav.onLine) throw new TypeError('Failed to fetch');
      if (url === '/api/health') return Response.json({ status: 'ok' });
      if (url === '/api/readings' && init?.method === 'POST') {
        const body = JSON.parse(String(init.body)) as FakeServer['readings'][number];
        server.readings.push(body);
        // The answer as the real server gives it: the client checks answers against the contract in tests.
        return Response.json(storedReading(body), { status: 201 });
      }
      return Response.json({ title: 'Not found' }, { status: 404 });
    }),
  );
  return { win, nav, server };
}

async function freshOutbox(): Promise<Outbox> {
  vi.resetModules();
  return import('../../src/features/offline/stores/outbox');
}

/** The indicator's state, worked out as `useSyncSummary` does. */
function indicator(outbox: Outbox): SyncState {
  const s = outbox.outboxStore.getSnapshot();
  return summarize(s.items, { userId: s.userId, online: s.online, syncing: s.syncing }).state;
}

/** Resolves once every request made so far has its answer (or its failure) handled. */
async function answersSettled() {
  await Promise.allSettled(vi.mocked(fetch).mock.results.map((r) => r.value as Promise<Response>));
}

/** Resolves once the outbox reaches the state (the test's own timeout fails it otherwise). */
function until(outbox: Outbox, check: () => boolean): Promise<void> {
  return new Promise((resolve) => {
    if (check()) return resolve();
    const off = outbox.outboxStore.subscribe(() => {
      if (!check()) return;
      off();
      resolve();
    });
  });
}

const SAM = 'user-sam';
const READING_ID = '01900000-0000-7000-8000-000000000001';

function typeReading(outbox: Outbox) {
  return outbox.enqueueReading({
    body: { id: READING_ID, stepId: 'step-1', value: '0.5', takenAt: new Date().toISOString() },
    userId: SAM,
    venueId: 'venue',
    stripId: 'strip',
    where: 'Strip 20 · Left reel · Continuity · Line A',
    preview: { verdict: 'pass', display: '0.5 Ω', explanation: '' },
  });
}

beforeEach(() => {
  vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'setInterval', 'clearInterval'] });
});
afterEach(() => {
  vi.clearAllTimers();
  vi.useRealTimers();
  vi.unstubAllGlobals();
});

describe('the sync indicator when the browser says online but the server cannot be reached', () => {
  test('when a page opens with nothing waiting, then it says offline, not "all sent"', async () => {
    const { server } = fakeBrowser({ onLine: true });
    const outbox = await freshOutbox();
    outbox.startOutbox();
    outbox.setOutboxUser(SAM);
    await answersSettled();
    expect(indicator(outbox)).toBe('offline');
    expect(server.requests).toContain('GET /api/health');
  });

  test('when a reading is typed and its send gets no answer, then it is offline with the reading waiting, not "waiting to send"', async () => {
    fakeBrowser({ onLine: true });
    const outbox = await freshOutbox();
    outbox.startOutbox();
    outbox.setOutboxUser(SAM);
    await typeReading(outbox);
    await outbox.flush();
    await until(outbox, () => !outbox.outboxStore.getSnapshot().syncing);
    expect(indicator(outbox)).toBe('offline');
    expect(outbox.outboxStore.getSnapshot().items.map((i) => i.status)).toEqual(['waiting']);
  });

  test('when the server answers again without any online event, then the waiting reading is sent once and it says all sent', async () => {
    const { server } = fakeBrowser({ onLine: true });
    const outbox = await freshOutbox();
    outbox.startOutbox();
    outbox.setOutboxUser(SAM);
    await typeReading(outbox);
    await outbox.flush();
    await until(outbox, () => !outbox.outboxStore.getSnapshot().syncing);
    expect(indicator(outbox)).toBe('offline');

    server.up = true;
    // The tablet asks the server again by itself (at most 5 s apart while offline).
    await vi.advanceTimersByTimeAsync(5_000);
    await until(outbox, () => indicator(outbox) === 'up-to-date');
    expect(server.readings.map((r) => r.id)).toEqual([READING_ID]);
    expect(outbox.outboxStore.getSnapshot().items).toEqual([]);
  });
});

describe("the browser's own network events", () => {
  test('when the browser says offline, then it is offline at once and nothing is sent', async () => {
    const { win, nav, server } = fakeBrowser({ onLine: true });
    server.up = true;
    const outbox = await freshOutbox();
    outbox.startOutbox();
    outbox.setOutboxUser(SAM);
    await until(outbox, () => indicator(outbox) === 'up-to-date');

    nav.onLine = false;
    win.dispatchEvent(new Event('offline'));
    expect(indicator(outbox)).toBe('offline');
    await typeReading(outbox);
    expect(server.requests).not.toContain('POST /api/readings');
    expect(indicator(outbox)).toBe('offline');
  });

  test('when the browser says online again but the server still does not answer, then it stays offline', async () => {
    const { win, nav, server } = fakeBrowser({ onLine: false });
    const outbox = await freshOutbox();
    outbox.startOutbox();
    outbox.setOutboxUser(SAM);
    await typeReading(outbox);
    expect(indicator(outbox)).toBe('offline');

    // The browser's word is enough to try sending, not to say online.
    const seen = new Set<SyncState>();
    outbox.outboxStore.subscribe(() => seen.add(indicator(outbox)));
    nav.onLine = true;
    win.dispatchEvent(new Event('online'));
    expect(indicator(outbox)).toBe('offline');
    await until(outbox, () => server.requests.includes('POST /api/readings') && !outbox.outboxStore.getSnapshot().syncing);
    await answersSettled();
    expect(indicator(outbox)).toBe('offline');
    expect([...seen].filter((s) => s !== 'offline' && s !== 'syncing')).toEqual([]);
    expect(server.requests).toContain('GET /api/health');
    expect(outbox.outboxStore.getSnapshot().items.map((i) => i.status)).toEqual(['waiting']);

    server.up = true;
    win.dispatchEvent(new Event('online'));
    await until(outbox, () => indicator(outbox) === 'up-to-date');
    expect(server.readings.map((r) => r.id)).toEqual([READING_ID]);
  });
});
