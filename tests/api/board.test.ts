import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createTestApp, DEMO, type TestApp } from '../setup/test-app';
import { GOOD_VALUE, newReading, stripByLabel, venueIds } from './testing-helpers';

let t: TestApp;
let hall: string;
let annex: string;
beforeAll(async () => {
  t = await createTestApp();
  ({ hall, annex } = await venueIds(t));
});
afterAll(() => t.close());

interface Board {
  venue: { name: string; status: string; eventName: string };
  counts: Record<string, number>;
  progress: { stepsDone: number; stepsTotal: number; percent: number };
  strips: { id: string; label: string; status: string; zone: string; done: number; total: number }[];
  openFaults: { stripLabel: string; kind: string; status: string }[];
}

describe('GET /api/venues/:id/board', () => {
  test('the demo hall: every strip with its status and zone, counts by status, progress and the open faults', async () => {
    const marco = await t.agentFor(DEMO.director);
    const res = await marco.get(`/api/venues/${hall}/board`);
    expect(res.status).toBe(200);
    const board = res.body as Board;
    expect(board.venue).toMatchObject({ name: 'Riverside Sports Hall', eventName: 'Autumn Cup 2026', status: 'testing' });
    expect(board.strips).toHaveLength(24);
    expect(board.strips[0]).toMatchObject({ label: 'Strip 1', zone: 'Row A', status: 'clear' });
    expect(board.counts).toEqual({ 'not-started': 13, 'in-progress': 1, clear: 6, 'fault-open': 4, withdrawn: 0, 'out-of-service': 0 });
    expect(board.progress.stepsTotal).toBe(8 * 30 + 16 * 28);
    expect(board.progress.stepsDone).toBeGreaterThan(0);
    expect(board.progress.percent).toBe(Math.round((board.progress.stepsDone / board.progress.stepsTotal) * 100));
    expect(board.openFaults.map((f) => f.stripLabel).sort()).toEqual(['Strip 3', 'Strip 5', 'Strip 6', 'Strip 9']);
  });

  test('follows new readings: a strip moves from not started to in progress and the step count grows', async () => {
    const marco = await t.agentFor(DEMO.director);
    const before = (await marco.get(`/api/venues/${hall}/board`)).body as Board;
    const sam = await t.agentFor(DEMO.technician);
    const strip = await stripByLabel(t, hall, 'Strip 24');
    const step = strip.positions[1]!.steps[0]!;
    await sam.post('/api/readings').send(newReading(step.id, GOOD_VALUE.continuity!));
    const after = (await marco.get(`/api/venues/${hall}/board`)).body as Board;
    expect(after.progress.stepsDone).toBe(before.progress.stepsDone + 1);
    expect(after.strips.find((s) => s.label === 'Strip 24')!.status).toBe('in-progress');
    expect(after.counts['not-started']).toBe(before.counts['not-started']! - 1);
  });

  test('the annex is all clear with no open faults', async () => {
    const lee = await t.agentFor(DEMO.annexTechnician);
    const board = (await lee.get(`/api/venues/${annex}/board`)).body as Board;
    expect(board.counts.clear).toBe(4);
    expect(board.progress.percent).toBe(100);
    expect(board.openFaults).toEqual([]);
  });

  test('the organiser and the assigned technician may read it; Lee may not read the hall; anonymous 401', async () => {
    for (const who of [DEMO.organiser, DEMO.technician, DEMO.admin]) {
      expect((await (await t.agentFor(who)).get(`/api/venues/${hall}/board`)).status).toBe(200);
    }
    expect((await (await t.agentFor(DEMO.annexTechnician)).get(`/api/venues/${hall}/board`)).status).toBe(403);
    expect((await t.request.get(`/api/venues/${hall}/board`)).status).toBe(401);
  });

  test('the board is read-only: there is no write route on it', async () => {
    const nina = await t.agentFor(DEMO.organiser);
    expect((await nina.post(`/api/venues/${hall}/board`).send({})).status).toBe(404);
  });
});
