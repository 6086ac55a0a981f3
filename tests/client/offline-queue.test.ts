import { describe, expect, test } from 'vitest';
import {
  addToQueue,
  answersFromBatch,
  applyOutcome,
  classifyAnswer,
  inBatches,
  makeSeq,
  nextDueAt,
  planIncidentSend,
  incidentRequest,
  planSend,
  retryDelayMs,
  summarize,
  upgradeLegacyItems,
  type QueuedIncident,
  type QueuedReading,
} from '../../src/features/offline/utils/queue';
import { shouldPersistQuery, shouldPersistQueryKey } from '../../src/features/offline/utils/persist-filter';

const SAM = 'user-sam';
let n = 0;
function item(over: Partial<QueuedReading> & { step?: string } = {}): QueuedReading {
  n += 1;
  const id = over.id ?? `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;
  return {
    id,
    kind: 'reading',
    body: { id, stepId: over.step ?? `step-${n}`, value: '0.5' },
    userId: SAM,
    venueId: 'venue',
    stripId: 'strip',
    where: 'Strip 20 · Left reel · Continuity · Line A',
    preview: { verdict: 'pass', display: '0.5 Ω', explanation: '' },
    createdAt: '2026-11-21T08:00:00.000Z',
    seq: n,
    status: 'waiting',
    attempts: 0,
    nextAttemptAt: 0,
    ...over,
  };
}

describe('classifyAnswer', () => {
  test('when the server answers 2xx, then the reading is done, and says whether it put its strip of a signed-off venue out of service', () => {
    expect(classifyAnswer({ kind: 'http', status: 201 })).toEqual({ kind: 'done', stripSuspended: false });
    expect(classifyAnswer({ kind: 'http', status: 200 })).toEqual({ kind: 'done', stripSuspended: false });
    expect(classifyAnswer({ kind: 'http', status: 201, stripSuspended: true })).toEqual({ kind: 'done', stripSuspended: true });
  });

  test('when there is no answer, a 5xx, a 429 or a lapsed session, then it is sent again later', () => {
    expect(classifyAnswer({ kind: 'network' })).toEqual({ kind: 'retry', reason: 'network' });
    expect(classifyAnswer({ kind: 'http', status: 500 })).toEqual({ kind: 'retry', reason: 'server' });
    expect(classifyAnswer({ kind: 'http', status: 502 })).toEqual({ kind: 'retry', reason: 'server' });
    expect(classifyAnswer({ kind: 'http', status: 429, retryAfterS: 30 })).toEqual({ kind: 'retry', reason: 'busy', retryAfterMs: 30_000 });
    expect(classifyAnswer({ kind: 'http', status: 401 })).toEqual({ kind: 'retry', reason: 'signed-out' });
  });

  test('when the server refuses it, then it is a problem for the technician, by kind', () => {
    const kind = (status: number, code?: string) => {
      const o = classifyAnswer({ kind: 'http', status, code, message: 'm' });
      return o.kind === 'problem' ? o.problem.kind : o.kind;
    };
    expect(kind(409, 'step-removed')).toBe('step-removed');
    expect(kind(403, 'forbidden')).toBe('not-assigned');
    expect(kind(404, 'not-found')).toBe('not-found');
    expect(kind(422, 'idempotency-mismatch')).toBe('refused');
    expect(kind(422, 'invalid-reading')).toBe('refused');
    expect(kind(409, 'no-limit-profile')).toBe('refused');
  });
});

describe('applyOutcome', () => {
  test('when done with nothing to tell, then the item leaves the queue', () => {
    expect(applyOutcome(item(), { kind: 'done', stripSuspended: false }, 0)).toBeNull();
  });

  test('when done on a venue signed off meanwhile, then the item stays as a notice: its strip is out of service', () => {
    const next = applyOutcome(item(), { kind: 'done', stripSuspended: true }, 0)!;
    expect(next.status).toBe('notice');
    expect(next.problem?.kind).toBe('strip-suspended');
    expect(next.problem?.message).toMatch(/this strip is now out of service until the director amends the venue/);
  });

  test('when refused, then the item stays with its value and the problem, never dropped', () => {
    const before = item({ step: 'removed' });
    const next = applyOutcome(
      before,
      { kind: 'problem', problem: { kind: 'step-removed', status: 409, code: 'step-removed', message: 'gone' } },
      0,
    )!;
    expect(next).toMatchObject({ id: before.id, status: 'problem', body: before.body, problem: { kind: 'step-removed', message: 'gone' } });
  });

  test('when retried, then it waits longer each time, up to a minute, and at least Retry-After', () => {
    let it = item();
    const waits: number[] = [];
    for (let k = 0; k < 8; k++) {
      it = applyOutcome(it, { kind: 'retry', reason: 'network' }, 1_000)!;
      waits.push(it.nextAttemptAt - 1_000);
    }
    expect(waits).toEqual([2_000, 4_000, 8_000, 16_000, 32_000, 60_000, 60_000, 60_000]);
    expect(it.attempts).toBe(8);
    expect(retryDelayMs(1)).toBe(2_000);
    const busy = applyOutcome(item(), { kind: 'retry', reason: 'busy', retryAfterMs: 45_000 }, 0)!;
    expect(busy.nextAttemptAt).toBe(45_000);
  });
});

describe('addToQueue', () => {
  test('when the same id comes twice, then it is queued once, and the first copy is kept', () => {
    const a = item({ id: 'aaaaaaaa-0000-4000-8000-000000000001' });
    const again = { ...a, attempts: 5, body: { ...a.body, value: '9' } };
    const q = addToQueue(addToQueue([], a), again);
    expect(q).toHaveLength(1);
    expect(q[0]!.body.value).toBe('0.5');
  });

  test('when readings are added out of order, then the queue keeps typing order', () => {
    const first = item({ seq: 1 });
    const second = item({ seq: 2 });
    const third = item({ seq: 3 });
    expect(addToQueue(addToQueue(addToQueue([], third), first), second).map((i) => i.seq)).toEqual([1, 2, 3]);
  });

  test('typing-order numbers grow even within one millisecond', () => {
    const a = makeSeq(1000, 0);
    const b = makeSeq(1000, a);
    const c = makeSeq(999, b);
    expect([a, b, c]).toEqual([1000, 1001, 1002]);
  });
});

describe('planSend', () => {
  test('sends waiting readings in typing order, only the signed-in person’s', () => {
    const q = [item({ seq: 3 }), item({ seq: 1 }), item({ seq: 2, userId: 'someone-else' }), item({ seq: 4, status: 'set-aside' })];
    expect(planSend(q, { userId: SAM, nowMs: 0 }).send.map((i) => i.seq)).toEqual([1, 3]);
  });

  test('a reading waits behind an earlier unsent one of the same step, so the latest stays the latest', () => {
    const problem = item({ step: 'X', seq: 1, status: 'problem' });
    const later = item({ step: 'X', seq: 2 });
    const other = item({ step: 'Y', seq: 3 });
    const plan = planSend([problem, later, other], { userId: SAM, nowMs: 0 });
    expect(plan.send.map((i) => i.seq)).toEqual([3]);
    expect(plan.held.has(later.id)).toBe(true);
  });

  test('a retry not yet due waits, unless forced (the network just came back)', () => {
    const due = item({ seq: 1, nextAttemptAt: 5_000 });
    expect(planSend([due], { userId: SAM, nowMs: 1_000 }).send).toHaveLength(0);
    expect(planSend([due], { userId: SAM, nowMs: 5_000 }).send).toHaveLength(1);
    expect(planSend([due], { userId: SAM, nowMs: 1_000, force: true }).send).toHaveLength(1);
    expect(nextDueAt([due, item({ nextAttemptAt: 9_000 })], SAM)).toBe(5_000);
    expect(nextDueAt([item({ status: 'problem' })], SAM)).toBeNull();
  });
});

describe('answersFromBatch', () => {
  const bodies = [item(), item(), item(), item()].map((i) => i.body);
  const reading = (id: string, stripSuspended?: boolean) =>
    ({ id, verdict: 'pass', ...(stripSuspended ? { stripSuspended } : {}) }) as never;
  const problem = (status: number, code: string, detail: string) => ({ type: `/problems/${code}`, title: 't', status, code, detail });

  test('each result is read as the answer that reading would have had alone, and leads to the same outcome', () => {
    const answers = answersFromBatch(bodies, {
      kind: 'results',
      results: [
        { id: bodies[0].id, status: 201, reading: reading(bodies[0].id) },
        { id: bodies[1].id, status: 200, reading: reading(bodies[1].id, true) },
        { id: bodies[2].id, status: 409, problem: problem(409, 'step-removed', 'This step was taken off the checklist') },
        { id: bodies[3].id, status: 500, problem: problem(500, 'server-error', 'Something went wrong') },
      ],
    });
    expect(answers.map((a) => classifyAnswer(a.answer))).toEqual([
      { kind: 'done', stripSuspended: false },
      { kind: 'done', stripSuspended: true },
      {
        kind: 'problem',
        problem: { kind: 'step-removed', status: 409, code: 'step-removed', message: 'This step was taken off the checklist' },
      },
      { kind: 'retry', reason: 'server' },
    ]);
    expect(answers[0].reading).toMatchObject({ id: bodies[0].id });
    expect(answers[2].reading).toBeUndefined();
  });

  test('when the whole batch got no answer or a refusal, then every reading has that answer', () => {
    expect(answersFromBatch(bodies, { kind: 'network' }).map((a) => classifyAnswer(a.answer).kind)).toEqual([
      'retry',
      'retry',
      'retry',
      'retry',
    ]);
    const refused = answersFromBatch(bodies, { kind: 'http', status: 403, code: 'forbidden', message: 'no' });
    expect(refused.map((a) => classifyAnswer(a.answer))).toEqual(
      bodies.map(() => ({ kind: 'problem', problem: { kind: 'not-assigned', status: 403, code: 'forbidden', message: 'no' } })),
    );
    expect(answersFromBatch(bodies, { kind: 'http', status: 401 }).every((a) => classifyAnswer(a.answer).kind === 'retry')).toBe(true);
  });

  test('when a result is missing or names another reading, then that reading counts as not answered and is sent again', () => {
    const answers = answersFromBatch(bodies.slice(0, 3), {
      kind: 'results',
      results: [
        { id: bodies[0].id, status: 201, reading: reading(bodies[0].id) },
        { id: bodies[2].id, status: 201, reading: reading(bodies[2].id) },
      ],
    });
    expect(answers.map((a) => classifyAnswer(a.answer).kind)).toEqual(['done', 'retry', 'retry']);
  });

  test('readings go in batches of at most 200, in typing order', () => {
    const many = Array.from({ length: 450 }, (_, i) => i);
    const batches = inBatches(many);
    expect(batches.map((b) => b.length)).toEqual([200, 200, 50]);
    expect(batches.flat()).toEqual(many);
  });
});

describe('summarize', () => {
  const q = (status: QueuedReading['status'], k = 1) => Array.from({ length: k }, () => item({ status }));
  test('the indicator says what needs the technician first, then sending, offline, waiting, up to date', () => {
    expect(summarize([], { userId: SAM, online: true, syncing: false })).toEqual({ state: 'up-to-date', waiting: 0, needsYou: 0 });
    expect(summarize(q('waiting', 3), { userId: SAM, online: false, syncing: false })).toEqual({
      state: 'offline',
      waiting: 3,
      needsYou: 0,
    });
    expect(summarize(q('waiting', 2), { userId: SAM, online: true, syncing: true }).state).toBe('syncing');
    expect(summarize(q('waiting', 2), { userId: SAM, online: true, syncing: false }).state).toBe('waiting');
    expect(summarize([...q('waiting', 2), ...q('problem')], { userId: SAM, online: false, syncing: false })).toEqual({
      state: 'needs-you',
      waiting: 2,
      needsYou: 1,
    });
    expect(summarize(q('notice'), { userId: SAM, online: true, syncing: false }).state).toBe('needs-you');
    expect(summarize(q('set-aside'), { userId: SAM, online: true, syncing: false }).state).toBe('up-to-date');
    expect(summarize(q('waiting'), { userId: 'someone-else', online: true, syncing: false }).state).toBe('up-to-date');
  });
});

describe('shouldPersistQueryKey', () => {
  test('keeps what the testing flow needs on the tablet, and nothing else', () => {
    expect(shouldPersistQueryKey(['auth', 'me'])).toBe(true);
    expect(shouldPersistQueryKey(['venues'])).toBe(true);
    expect(shouldPersistQueryKey(['venues', 'v1', 'board'])).toBe(true);
    expect(shouldPersistQueryKey(['strips', 's1'])).toBe(true);
    expect(shouldPersistQueryKey(['venues', 'v1', 'readings'])).toBe(false);
    expect(shouldPersistQueryKey(['venues', 'v1', 'audit'])).toBe(false);
    expect(shouldPersistQueryKey(['faults', 'f1'])).toBe(false);
    expect(shouldPersistQueryKey(['users'])).toBe(false);
  });
});

describe('shouldPersistQuery', () => {
  test('when nobody is signed in, then that answer is not kept on the tablet; a signed-in person is', () => {
    expect(shouldPersistQuery(['auth', 'me'], null)).toBe(false);
    expect(shouldPersistQuery(['auth', 'me'], { id: 'u1', name: 'Sam Reyes' })).toBe(true);
    expect(shouldPersistQuery(['strips', 's1'], { id: 's1' })).toBe(true);
    expect(shouldPersistQuery(['faults', 'f1'], { id: 'f1' })).toBe(false);
  });
});

describe('upgradeLegacyItems', () => {
  test('readings queued with the offset itself get one test-lead null record per person and offset; none is dropped', () => {
    let k = 0;
    const makeId = () => `lead-${++k}`;
    const a = item({ body: { id: 'a', stepId: 's1', value: '0.5', leadOffsetOhm: 0.1 } });
    const b = item({ body: { id: 'b', stepId: 's2', value: '0.6', leadOffsetOhm: 0.1 } });
    const c = item({ body: { id: 'c', stepId: 's3', value: '0.7', leadOffsetOhm: 0.2 } });
    const d = item({ userId: 'user-lee', body: { id: 'd', stepId: 's4', value: '0.8', leadOffsetOhm: 0.1 } });
    const none = item({ body: { id: 'e', stepId: 's5', value: 'OL', leadOffsetOhm: null } });
    const current = item({ body: { id: 'f', stepId: 's6', value: '0.4', leadNullId: 'already' } });
    const out = new Map(upgradeLegacyItems([a, b, c, d, none, current], makeId).map((i) => [i.body.id, i]));
    expect(out.size).toBe(5);
    expect(out.has('f')).toBe(false);
    expect(out.get('a')!.body).toEqual({ id: 'a', stepId: 's1', value: '0.5', leadNullId: 'lead-1' });
    expect(out.get('b')!.leadNull).toEqual(out.get('a')!.leadNull);
    expect(out.get('a')!.leadNull).toMatchObject({ id: 'lead-1', value: '0.1', valueOhm: 0.1, userId: SAM });
    expect(out.get('c')!.body.leadNullId).toBe('lead-2');
    expect(out.get('d')!.body.leadNullId).toBe('lead-3');
    expect(out.get('e')!.body).toEqual({ id: 'e', stepId: 's5', value: 'OL' });
    expect(out.get('e')!.leadNull).toBeUndefined();
    // Upgraded items are left alone the next time.
    expect(upgradeLegacyItems([...out.values()], makeId)).toEqual([]);
  });
});

function incident(over: Partial<QueuedIncident> = {}): QueuedIncident {
  n += 1;
  const id = over.id ?? `00000000-0000-4000-9000-${String(n).padStart(12, '0')}`;
  return {
    id,
    kind: 'incident',
    body: { clientId: id, stripId: 'strip', symptom: 'Touches not showing' },
    userId: SAM,
    venueId: 'venue',
    stripId: 'strip',
    where: 'Strip 4 · Touches not showing',
    createdAt: '2026-11-21T08:00:00.000Z',
    seq: n,
    status: 'waiting',
    attempts: 0,
    nextAttemptAt: 0,
    ...over,
  };
}

describe('incidents in the outbox', () => {
  test('the waiting incidents go in typing order, only the signed-in person’s, and a retry waits unless forced', () => {
    const first = incident();
    const later = incident({ nextAttemptAt: 5_000 });
    const other = incident({ userId: 'user-lee' });
    const refused = incident({ status: 'problem' });
    expect(planIncidentSend([later, other, refused, first], { userId: SAM, nowMs: 1_000 }).map((i) => i.id)).toEqual([first.id]);
    expect(planIncidentSend([later, first], { userId: SAM, nowMs: 1_000, force: true }).map((i) => i.id)).toEqual([first.id, later.id]);
  });

  test('an incident is sent with the time it was typed on the tablet as openedAt, its clientId unchanged', () => {
    const i = incident({ createdAt: '2026-11-21T07:42:10.000Z' });
    expect(incidentRequest(i)).toEqual({
      clientId: i.id,
      stripId: 'strip',
      symptom: 'Touches not showing',
      openedAt: '2026-11-21T07:42:10.000Z',
    });
  });

  test('a replay the server has already (200 with the same incident) leaves the queue, as a first send (201) does: it is kept once', () => {
    for (const status of [200, 201]) expect(applyOutcome(incident(), classifyAnswer({ kind: 'http', status }), 0)).toBeNull();
  });

  test('no answer keeps the incident with the same clientId, to be sent again later; a refusal keeps it for the technician', () => {
    const i = incident();
    const again = applyOutcome(i, classifyAnswer({ kind: 'network' }), 1_000)!;
    expect(again.body.clientId).toBe(i.body.clientId);
    expect(again.nextAttemptAt).toBe(3_000); // the first wait is 2 s, as for a reading (DEVELOPERS.md, offline testing)
    const refused = applyOutcome(i, classifyAnswer({ kind: 'http', status: 409, code: 'not-signed-off', message: 'm' }), 0)!;
    expect(refused.status).toBe('problem');
    expect(refused.body.symptom).toBe('Touches not showing');
  });

  test('a waiting incident counts in the indicator like a reading, and a refused one needs the technician', () => {
    expect(summarize([incident()], { userId: SAM, online: true, syncing: false })).toEqual({ state: 'waiting', waiting: 1, needsYou: 0 });
    expect(summarize([incident({ status: 'problem' })], { userId: SAM, online: true, syncing: false }).state).toBe('needs-you');
  });
});
