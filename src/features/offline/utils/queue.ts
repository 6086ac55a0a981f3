// The rules of the tablet's outbox, without storage or network: what to send next, how to read
// the server's answer, and what the sync indicator says. Pure, so it is tested on its own.
import { READINGS_BATCH_MAX, type ReadingBatchResult, type ReadingDto, type VerdictName } from '@shared/schemas/readings';
import type { LeadNullRecord } from '@shared/schemas/lead-nulls';

export type { LeadNullRecord };

/**
 * waiting: to be sent; problem: the server refused it and the technician decides;
 * notice: recorded, with something the technician should know; set-aside: the technician chose
 * not to send it (kept, with its value, until they send it after all).
 */
export type QueueStatus = 'waiting' | 'problem' | 'notice' | 'set-aside';

export type ProblemKind = 'step-removed' | 'not-assigned' | 'not-found' | 'refused' | 'strip-suspended';

export interface Problem {
  kind: ProblemKind;
  status: number;
  code: string;
  message: string;
  at: string;
}

export interface ReadingBody {
  id: string;
  stepId: string;
  value: string;
  /** The technician's test-lead null (its record travels with the queued reading, see leadNull). */
  leadNullId?: string | null;
  /** Only on readings queued by an older version of the app, which sent the offset itself. */
  leadOffsetOhm?: number | null;
  /** When it was typed (the tablet's clock): a reading sent later still counts at that time. */
  takenAt?: string;
  supersedesId?: string;
  correctionReason?: string;
}

export interface QueuedReading {
  /** The reading's UUID, made once when it was typed: every replay sends the same one. */
  id: string;
  kind: 'reading';
  body: ReadingBody;
  userId: string;
  venueId: string;
  stripId: string;
  /** "Strip 20 · Left reel · Continuity · Line A", for lists away from the strip. */
  where: string;
  /** The browser's verdict from the shared engine at the time it was typed. */
  preview: { verdict: VerdictName; display: string; explanation: string } | null;
  createdAt: string;
  /** Typing order; replays follow it. */
  seq: number;
  status: QueueStatus;
  attempts: number;
  /** Epoch ms before which a retry waits (backoff); 0 = at once. */
  nextAttemptAt: number;
  problem?: Problem;
  /** Where the value was typed first, when the technician moved it to another step. */
  movedFrom?: string;
  /** The test-lead null named by body.leadNullId, set on this tablet: sent before the reading. */
  leadNull?: LeadNullRecord;
}

/** What came back from one send: nothing at all, or an HTTP answer. */
export type Answer =
  { kind: 'network' } | { kind: 'http'; status: number; code?: string; message?: string; stripSuspended?: boolean; retryAfterS?: number };

/** A reading's answer taken out of a batch, with the stored reading when it was recorded. */
export interface BatchAnswer {
  answer: Answer;
  reading?: ReadingDto;
}

/** What came back from one batch: nothing, a refusal of the whole request, or a result per reading. */
export type BatchReply =
  | { kind: 'network' }
  | { kind: 'http'; status: number; code?: string; message?: string }
  | { kind: 'results'; results: ReadingBatchResult[] };

/**
 * One answer per reading sent, as if each had been sent alone: a refusal of the whole batch (or no
 * answer) is that reading's answer too; a result is read like a single reading's answer. A reading
 * the server's results do not account for (they should, in order) is taken as not answered.
 */
export function answersFromBatch(bodies: ReadingBody[], reply: BatchReply): BatchAnswer[] {
  if (reply.kind !== 'results') return bodies.map(() => ({ answer: reply }));
  return bodies.map((body, i) => {
    const r = reply.results[i];
    if (!r || r.id !== body.id) return { answer: { kind: 'network' } };
    if (r.status >= 200 && r.status < 300 && r.reading) {
      return { answer: { kind: 'http', status: r.status, stripSuspended: r.reading.stripSuspended === true }, reading: r.reading };
    }
    return { answer: { kind: 'http', status: r.status, code: r.problem?.code, message: r.problem?.detail } };
  });
}

/** More than one reading to send goes in batches of at most READINGS_BATCH_MAX, in typing order. */
export function inBatches<T>(items: T[], size = READINGS_BATCH_MAX): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < items.length; i += size) out.push(items.slice(i, i + size));
  return out;
}

export type Outcome =
  | { kind: 'done'; stripSuspended: boolean }
  | { kind: 'retry'; reason: 'network' | 'server' | 'busy' | 'signed-out'; retryAfterMs?: number }
  | { kind: 'problem'; problem: Omit<Problem, 'at'> };

/** 2xx done; no answer, 5xx, 408, 429 and a lapsed session later; any other refusal needs the technician. */
export function classifyAnswer(a: Answer): Outcome {
  if (a.kind === 'network') return { kind: 'retry', reason: 'network' };
  const { status } = a;
  const code = a.code ?? 'error';
  const message = a.message ?? `The server answered ${status}.`;
  if (status >= 200 && status < 300) return { kind: 'done', stripSuspended: a.stripSuspended === true };
  if (status === 401) return { kind: 'retry', reason: 'signed-out' };
  if (status === 429 || status === 408 || status === 503) {
    return { kind: 'retry', reason: 'busy', retryAfterMs: a.retryAfterS !== undefined ? a.retryAfterS * 1000 : undefined };
  }
  if (status >= 500) return { kind: 'retry', reason: 'server' };
  if (status === 409 && code === 'step-removed') return { kind: 'problem', problem: { kind: 'step-removed', status, code, message } };
  if (status === 403) return { kind: 'problem', problem: { kind: 'not-assigned', status, code, message } };
  if (status === 404) return { kind: 'problem', problem: { kind: 'not-found', status, code, message } };
  return { kind: 'problem', problem: { kind: 'refused', status, code, message } };
}

export const RETRY_BASE_MS = 2_000;
export const RETRY_MAX_MS = 60_000;

/** 2 s, 4 s, 8 s … at most a minute between tries. */
export function retryDelayMs(attempts: number): number {
  return Math.min(RETRY_MAX_MS, RETRY_BASE_MS * 2 ** Math.max(0, attempts - 1));
}

/**
 * The item after an outcome, or null when it leaves the queue (recorded, nothing to tell).
 * Nothing the technician typed leaves the queue on a refusal.
 */
export function applyOutcome<T extends QueuedReading | QueuedIncident>(item: T, outcome: Outcome, nowMs: number): T | null {
  const at = new Date(nowMs).toISOString();
  switch (outcome.kind) {
    case 'done':
      if (!outcome.stripSuspended) return null;
      // A change on a signed-off venue suspends its strip only (the venue certificate stays valid).
      return {
        ...item,
        status: 'notice',
        problem: {
          kind: 'strip-suspended',
          status: 201,
          code: 'strip-suspended',
          message:
            'The venue was signed off; your reading is recorded and this strip is now out of service until the director amends the venue.',
          at,
        },
      };
    case 'retry': {
      const attempts = item.attempts + 1;
      const wait = Math.max(retryDelayMs(attempts), outcome.retryAfterMs ?? 0);
      return { ...item, attempts, nextAttemptAt: nowMs + wait };
    }
    case 'problem':
      return { ...item, attempts: item.attempts + 1, status: 'problem', problem: { ...outcome.problem, at } };
  }
}

export function byTypingOrder(a: { seq: number; id: string }, b: { seq: number; id: string }): number {
  return a.seq - b.seq || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
}

/** Adds an item unless one with the same id is there already (the id is made once, when typed). */
export function addToQueue(items: QueuedReading[], item: QueuedReading): QueuedReading[] {
  if (items.some((i) => i.id === item.id)) return items;
  return [...items, item].sort(byTypingOrder);
}

/**
 * What to send now, in typing order. A reading waits behind an earlier one of the same step that
 * is not sent yet (a problem, or a retry not due): the latest reading of a step is the one that
 * counts, so their order must hold.
 */
export function planSend(
  items: QueuedReading[],
  opts: { userId: string; nowMs: number; force?: boolean },
): { send: QueuedReading[]; held: Set<string> } {
  const blocked = new Set<string>();
  const send: QueuedReading[] = [];
  const held = new Set<string>();
  for (const item of [...items].sort(byTypingOrder)) {
    if (item.userId !== opts.userId) continue;
    const step = item.body.stepId;
    if (item.status === 'problem') {
      blocked.add(step);
      continue;
    }
    if (item.status !== 'waiting') continue;
    if (blocked.has(step)) {
      held.add(item.id);
      continue;
    }
    if (!opts.force && item.nextAttemptAt > opts.nowMs) {
      blocked.add(step);
      continue;
    }
    send.push(item);
  }
  return { send, held };
}

/** When the next retry is due, or null if nothing waits on a timer. */
export function nextDueAt(items: Pick<QueuedReading, 'userId' | 'status' | 'nextAttemptAt'>[], userId: string): number | null {
  const due = items.filter((i) => i.userId === userId && i.status === 'waiting').map((i) => i.nextAttemptAt);
  return due.length ? Math.min(...due) : null;
}

export type SyncState = 'up-to-date' | 'offline' | 'waiting' | 'syncing' | 'needs-you';

export interface SyncSummary {
  state: SyncState;
  waiting: number;
  needsYou: number;
}

/** The indicator's state: what needs the technician first, then sending, offline, waiting, up to date. */
export function summarize(
  items: Pick<QueuedReading, 'userId' | 'status'>[],
  opts: { userId: string | null; online: boolean; syncing: boolean },
): SyncSummary {
  const mine = opts.userId ? items.filter((i) => i.userId === opts.userId) : [];
  const waiting = mine.filter((i) => i.status === 'waiting').length;
  const needsYou = mine.filter((i) => i.status === 'problem' || i.status === 'notice').length;
  const state: SyncState =
    needsYou > 0
      ? 'needs-you'
      : opts.syncing && waiting > 0
        ? 'syncing'
        : !opts.online
          ? 'offline'
          : waiting > 0
            ? 'waiting'
            : 'up-to-date';
  return { state, waiting, needsYou };
}

/** Makes a typing-order number that grows even for two readings in the same millisecond. */
export function makeSeq(nowMs: number, last: number): number {
  return Math.max(nowMs, last + 1);
}

/**
 * Readings queued by an older version of the app carry the lead offset itself, which the server
 * no longer takes. Each distinct offset of a person becomes a test-lead null record (sent before
 * the readings, as any queued null), so no queued reading is lost to the change. Pure: returns
 * the items that changed.
 */
export function upgradeLegacyItems(items: QueuedReading[], makeId: () => string): QueuedReading[] {
  const made = new Map<string, LeadNullRecord>();
  const changed: QueuedReading[] = [];
  for (const item of [...items].sort(byTypingOrder)) {
    if (!('leadOffsetOhm' in item.body)) continue;
    const { leadOffsetOhm, ...body } = item.body;
    if (leadOffsetOhm === null || leadOffsetOhm === undefined || body.leadNullId) {
      changed.push({ ...item, body });
      continue;
    }
    const key = `${item.userId}|${leadOffsetOhm}`;
    let record = made.get(key);
    if (!record) {
      record = {
        id: makeId(),
        value: String(leadOffsetOhm),
        valueOhm: leadOffsetOhm,
        meter: null,
        takenAt: item.createdAt,
        userId: item.userId,
      };
      made.set(key, record);
    }
    changed.push({ ...item, body: { ...body, leadNullId: record.id }, leadNull: record });
  }
  return changed;
}

// ---------- incidents opened on this tablet ----------

/** POST /api/venues/:id/incidents as the outbox sends it: clientId makes a replay answer the same incident. */
export interface IncidentBody {
  clientId: string;
  stripId: string;
  positionId?: string | null;
  symptom: string;
  /** When the technician tapped the symptom: the server counts the incident from then. */
  openedAt?: string | null;
}

/** An incident typed on the tablet and not on the server yet; the same rules as a reading's. */
export interface QueuedIncident {
  /** The clientId, made once when the incident was opened. */
  id: string;
  kind: 'incident';
  body: IncidentBody;
  userId: string;
  venueId: string;
  stripId: string;
  /** "Strip 4 · Touches not showing", for lists away from the strip. */
  where: string;
  createdAt: string;
  seq: number;
  status: QueueStatus;
  attempts: number;
  nextAttemptAt: number;
  problem?: Problem;
}

/**
 * What is sent for a queued incident: its body with the time it was typed here, so one sent
 * much later still counts from then (and a retest typed after it counts as after it).
 */
export function incidentRequest(item: QueuedIncident): IncidentBody {
  return { ...item.body, openedAt: item.createdAt };
}

/**
 * The incidents to send now, in typing order: each waiting one whose retry is due. They go before
 * any reading, so a retest typed offline after the incident reaches the server after it.
 */
export function planIncidentSend(items: QueuedIncident[], opts: { userId: string; nowMs: number; force?: boolean }): QueuedIncident[] {
  return [...items]
    .sort(byTypingOrder)
    .filter((i) => i.userId === opts.userId && i.status === 'waiting' && (opts.force || i.nextAttemptAt <= opts.nowMs));
}
