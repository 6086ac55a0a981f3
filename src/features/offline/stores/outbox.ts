// The tablet's outbox: readings typed on the testing screen, kept in IndexedDB until the server
// has them. Written to disk before the screen moves on, so a reload, a crash or a closed browser
// loses nothing; replayed in typing order when the network is there (at start, when the
// server can be reached again, and on a backoff timer). Replays are safe: the server knows a
// reading by its id.
import { createStore, del, delMany, entries, set, setMany } from 'idb-keyval';
import { sendReading, type SentReading } from '../api/send-reading';
import { sendReadingBatch } from '../api/send-reading-batch';
import { sendLeadNull } from '../api/send-lead-null';
import { sendIncident, type SentIncident } from '../api/send-incident';
import { connectionStore, serverAnswered, serverDidNotAnswer, startConnectionWatch } from './connection';
import {
  addToQueue,
  applyOutcome,
  byTypingOrder,
  classifyAnswer,
  inBatches,
  makeSeq,
  nextDueAt,
  planIncidentSend,
  incidentRequest,
  planSend,
  upgradeLegacyItems,
  type Answer,
  type BatchAnswer,
  type IncidentBody,
  type LeadNullRecord,
  type QueuedIncident,
  type QueuedReading,
  type ReadingBody,
} from '../utils/queue';
import { newReadingId } from '../utils/reading-id';

export interface OutboxState {
  loaded: boolean;
  items: QueuedReading[];
  /** Incidents opened on this tablet and not on the server yet (sent before readings). */
  incidents: QueuedIncident[];
  /** A pass is sending right now. */
  syncing: boolean;
  /** The server can be reached (./connection.ts: its answers decide, not navigator.onLine alone). */
  online: boolean;
  userId: string | null;
  /** Why the last pass stopped early, for the list page ("the server did not answer"). */
  lastStop: 'network' | 'server' | 'busy' | 'signed-out' | null;
}

export interface OutboxHandlers {
  /** The server has the reading: put its stored verdict where the preview was. */
  onRecorded?: (reading: SentReading, item: QueuedReading) => void;
  /** The server has the incident: show it where the queued one was. */
  onIncidentRecorded?: (incident: SentIncident, item: QueuedIncident) => void;
  /** A pass recorded readings on these strips and venues: refresh what shows progress. */
  onPassDone?: (touched: { stripIds: string[]; venueIds: string[] }) => void;
  /**
   * Writes the tablet's saved copy of what the screens show, at once. The queue lets a recorded
   * reading or incident go only after it: the copy is otherwise written at most once a second, and
   * a reload with no network in between showed a reading the server has as never measured.
   */
  saveCopy?: () => Promise<void>;
}

/** The saved copy first; a copy that cannot be written must not hold the queue up. */
const saveCopy = () => handlers.saveCopy?.().catch(() => undefined);

const db = typeof indexedDB === 'undefined' ? undefined : createStore('stripwarden-outbox', 'readings');
// A database of its own: idb-keyval keeps one object store per database.
const incidentsDb = typeof indexedDB === 'undefined' ? undefined : createStore('stripwarden-outbox-incidents', 'incidents');
const LOCK = 'stripwarden-outbox';
const PERIODIC_MS = 30_000;

let state: OutboxState = {
  loaded: false,
  items: [],
  incidents: [],
  syncing: false,
  online: connectionStore.getSnapshot(),
  userId: null,
  lastStop: null,
};
const listeners = new Set<() => void>();
let handlers: OutboxHandlers = {};
let lastSeq = 0;
let running: Promise<void> | null = null;
let again = false;
let timer: ReturnType<typeof setTimeout> | undefined;
let channel: BroadcastChannel | null = null;
let started = false;
/** Test-lead nulls the server is known to have (this page's life): readings using them go alone. */
const nullsOnServer = new Set<string>();

function setState(patch: Partial<OutboxState>) {
  state = { ...state, ...patch };
  for (const l of listeners) l();
}

export const outboxStore = {
  subscribe(l: () => void) {
    listeners.add(l);
    return () => listeners.delete(l);
  },
  getSnapshot: () => state,
};

export function setOutboxHandlers(h: OutboxHandlers) {
  handlers = h;
}

async function load() {
  if (!db) return setState({ loaded: true });
  const all = await entries<string, QueuedReading>(db);
  let items = all.map(([, v]) => v).sort(byTypingOrder);
  const upgraded = upgradeLegacyItems(items, newReadingId);
  if (upgraded.length > 0) {
    for (const u of upgraded) await set(u.id, u, db);
    const byId = new Map(upgraded.map((u) => [u.id, u]));
    items = items.map((i) => byId.get(i.id) ?? i);
  }
  const incidents = incidentsDb ? (await entries<string, QueuedIncident>(incidentsDb)).map(([, v]) => v).sort(byTypingOrder) : [];
  lastSeq = Math.max(lastSeq, ...items.map((i) => i.seq), ...incidents.map((i) => i.seq), 0);
  setState({ items, incidents, loaded: true });
}

function changed() {
  channel?.postMessage('changed');
}

async function put(item: QueuedReading) {
  if (db) await set(item.id, item, db);
  setState({ items: [...state.items.filter((i) => i.id !== item.id), item].sort(byTypingOrder) });
  changed();
}

async function remove(id: string) {
  if (db) await del(id, db);
  setState({ items: state.items.filter((i) => i.id !== id) });
  changed();
}

/** The answers of one send, on disk in one go (a batch is hundreds of readings). */
async function putAndRemove(keep: QueuedReading[], gone: string[]) {
  if (db) {
    if (keep.length)
      await setMany(
        keep.map((i) => [i.id, i] as [string, QueuedReading]),
        db,
      );
    if (gone.length) await delMany(gone, db);
  }
  const replaced = new Set([...gone, ...keep.map((i) => i.id)]);
  setState({ items: [...state.items.filter((i) => !replaced.has(i.id)), ...keep].sort(byTypingOrder) });
  changed();
}

async function putIncident(item: QueuedIncident | null, goneId?: string) {
  if (incidentsDb) {
    if (item) await set(item.id, item, incidentsDb);
    if (goneId) await del(goneId, incidentsDb);
  }
  const replaced = new Set([goneId, item?.id]);
  setState({ incidents: [...state.incidents.filter((i) => !replaced.has(i.id)), ...(item ? [item] : [])].sort(byTypingOrder) });
  changed();
}

/** Asks the browser not to clear our storage under pressure (readings live there until sent). */
function askForPersistentStorage() {
  void navigator.storage?.persist?.().catch(() => undefined);
}

export interface NewQueuedReading {
  body: ReadingBody;
  userId: string;
  venueId: string;
  stripId: string;
  where: string;
  preview: QueuedReading['preview'];
  /** The null named by body.leadNullId: sent first unless the server is known to have it. */
  leadNull?: LeadNullRecord;
}

/** Keeps a typed reading on the tablet (on disk before it resolves), then tries to send it. */
export async function enqueueReading(r: NewQueuedReading): Promise<QueuedReading> {
  const existing = state.items.find((i) => i.id === r.body.id);
  if (existing) return existing;
  const now = Date.now();
  lastSeq = makeSeq(now, lastSeq);
  const item: QueuedReading = {
    id: r.body.id,
    kind: 'reading',
    body: r.body,
    userId: r.userId,
    venueId: r.venueId,
    stripId: r.stripId,
    where: r.where,
    preview: r.preview,
    createdAt: new Date(now).toISOString(),
    seq: lastSeq,
    status: 'waiting',
    attempts: 0,
    nextAttemptAt: 0,
    ...(r.leadNull ? { leadNull: r.leadNull } : {}),
  };
  if (db) await set(item.id, item, db);
  setState({ items: addToQueue(state.items, item) });
  changed();
  askForPersistentStorage();
  void flush();
  return item;
}

export interface NewQueuedIncident {
  body: IncidentBody;
  userId: string;
  venueId: string;
  where: string;
}

/**
 * Keeps an incident opened on the tablet (on disk before it resolves), then tries to send it. Its
 * clientId is made once, so however often it is sent the server keeps one incident.
 */
export async function enqueueIncident(r: NewQueuedIncident): Promise<QueuedIncident> {
  const existing = state.incidents.find((i) => i.id === r.body.clientId);
  if (existing) return existing;
  const now = Date.now();
  lastSeq = makeSeq(now, lastSeq);
  const item: QueuedIncident = {
    id: r.body.clientId,
    kind: 'incident',
    body: r.body,
    userId: r.userId,
    venueId: r.venueId,
    stripId: r.body.stripId,
    where: r.where,
    createdAt: new Date(now).toISOString(),
    seq: lastSeq,
    status: 'waiting',
    attempts: 0,
    nextAttemptAt: 0,
  };
  await putIncident(item);
  askForPersistentStorage();
  void flush();
  return item;
}

/** The browser's "offline" is taken at its word (./connection.ts); its "online" is only a guess. */
const browserSaysOffline = () => typeof navigator !== 'undefined' && navigator.onLine === false;

/** Sends the incidents that are due, one at a time in typing order; says why it stopped, or null. */
async function sendIncidents(userId: string, force: boolean, touched: { stripIds: Set<string>; venueIds: Set<string> }) {
  for (const item of planIncidentSend(state.incidents, { userId, nowMs: Date.now(), force })) {
    if (browserSaysOffline()) return 'network';
    setState({ syncing: true });
    const { answer, incident } = await sendIncident(item.venueId, incidentRequest(item));
    if (answer.kind === 'network') serverDidNotAnswer();
    else serverAnswered();
    const outcome = classifyAnswer(answer);
    const next = applyOutcome(item, outcome, Date.now());
    if (outcome.kind === 'done' && incident) {
      touched.stripIds.add(item.stripId);
      touched.venueIds.add(item.venueId);
      handlers.onIncidentRecorded?.(incident, item);
      await saveCopy();
    }
    await putIncident(next, next ? undefined : item.id);
    if (outcome.kind === 'retry') return outcome.reason;
  }
  return null;
}

function withLock(fn: () => Promise<void>): Promise<void> {
  // One sender across the tablet's tabs; a second tab would only replay (harmless, but wasteful).
  const locks = typeof navigator !== 'undefined' ? navigator.locks : undefined;
  return locks ? locks.request(LOCK, fn) : fn();
}

function schedule() {
  clearTimeout(timer);
  if (!state.userId) return;
  const due = nextDueAt([...state.items, ...state.incidents], state.userId);
  if (due === null) return;
  timer = setTimeout(() => void flush(), Math.max(0, due - Date.now()) + 50);
}

/**
 * Applies each reading's answer by the queue's rules and stores the result; says why sending must
 * stop (no answer, the server busy or failing, the session lapsed), or null to go on.
 */
async function settle(items: QueuedReading[], answers: BatchAnswer[], touched: { stripIds: Set<string>; venueIds: Set<string> }) {
  const now = Date.now();
  const keep: QueuedReading[] = [];
  const gone: string[] = [];
  const recorded: [SentReading, QueuedReading][] = [];
  let stop: OutboxState['lastStop'] = null;
  items.forEach((item, i) => {
    const { answer, reading } = answers[i];
    const outcome = classifyAnswer(answer);
    const next = applyOutcome(item, outcome, now);
    if (next) keep.push(next);
    else gone.push(item.id);
    if (outcome.kind === 'done' && reading) recorded.push([reading, item]);
    if (outcome.kind === 'retry') stop ??= outcome.reason;
  });
  for (const [reading, item] of recorded) {
    touched.stripIds.add(item.stripId);
    touched.venueIds.add(item.venueId);
    handlers.onRecorded?.(reading, item);
  }
  if (recorded.length > 0) await saveCopy();
  await putAndRemove(keep, gone);
  return stop;
}

/**
 * Sends the test-lead nulls these readings use that the server may not have yet (a replay when it
 * has), in typing order. Answers the refusal, or the missing answer, of each null that did not go.
 */
async function sendNullsOf(chunk: QueuedReading[]): Promise<Map<string, Answer>> {
  const failed = new Map<string, Answer>();
  const tried = new Set<string>();
  for (const { leadNull: n } of chunk) {
    if (!n || nullsOnServer.has(n.id) || tried.has(n.id)) continue;
    tried.add(n.id);
    const answer = await sendLeadNull(n);
    if (answer.kind === 'http' && answer.status < 300) nullsOnServer.add(n.id);
    else {
      failed.set(n.id, answer);
      if (classifyAnswer(answer).kind === 'retry') break;
    }
  }
  return failed;
}

async function pass(force: boolean) {
  const userId = state.userId;
  if (!userId) return;
  await load(); // another tab may have sent or added some
  const touched = { stripIds: new Set<string>(), venueIds: new Set<string>() };
  // Incidents first: readings typed after one (its retest) must not reach the server before it.
  let stop: OutboxState['lastStop'] = await sendIncidents(userId, force, touched);
  let first = true;
  for (;;) {
    // The browser may have said offline while this pass was under way: nothing more is tried.
    if (!stop && browserSaysOffline()) stop = 'network';
    if (stop) break;
    const { send } = planSend(state.items, { userId, nowMs: Date.now(), force: force && first });
    first = false;
    if (send.length === 0) break;
    setState({ syncing: true });
    let progressed = false;
    // One reading alone as before; more go in batches, each result read by the same rules.
    for (const chunk of send.length === 1 ? [send] : inBatches(send)) {
      // The test-lead nulls the readings use go first; a reading whose null is refused is refused too.
      const failed = await sendNullsOf(chunk);
      const lost = [...failed.values()].find((a) => classifyAnswer(a).kind === 'retry');
      if (lost) {
        if (lost.kind === 'network') serverDidNotAnswer();
        stop = await settle(
          chunk,
          chunk.map(() => ({ answer: lost })),
          touched,
        );
        break;
      }
      const blocked = chunk.filter((i) => i.leadNull && failed.has(i.leadNull.id));
      const ready = chunk.filter((i) => !blocked.includes(i));
      const answers: BatchAnswer[] =
        ready.length === 0
          ? []
          : ready.length === 1
            ? [await sendReading(ready[0].body)]
            : await sendReadingBatch(ready.map((i) => i.body));
      // No answer at all means offline, whatever the browser says (./connection.ts).
      if (answers.some((a) => a.answer.kind === 'network')) serverDidNotAnswer();
      else serverAnswered();
      stop = await settle([...blocked, ...ready], [...blocked.map((i) => ({ answer: failed.get(i.leadNull!.id)! })), ...answers], touched);
      if (stop) break;
      progressed = true;
    }
    if (stop || !progressed) break;
  }
  setState({ syncing: false, lastStop: stop });
  if (touched.stripIds.size > 0) handlers.onPassDone?.({ stripIds: [...touched.stripIds], venueIds: [...touched.venueIds] });
}

/**
 * Sends what is due, in typing order; `force` ignores the backoff (the network just came back).
 * Offline nothing is tried, unless `evenOffline`: the browser just said it has a network again, and
 * the readings' own answers tell as soon as a check would.
 */
export function flush(opts: { force?: boolean; evenOffline?: boolean } = {}): Promise<void> {
  if (!state.userId || !state.loaded || (!state.online && !opts.evenOffline)) return Promise.resolve();
  if (running) {
    again = true;
    return running;
  }
  running = withLock(() => pass(opts.force ?? false))
    .catch(() => setState({ syncing: false }))
    .finally(() => {
      running = null;
      schedule();
      if (again) {
        again = false;
        void flush();
      }
    });
  return running;
}

/**
 * A test-lead null was just set: send it at once when the network is there, so it is on record
 * even before a reading uses it. If it cannot go now, the readings that use it carry it.
 */
export async function recordLeadNull(n: LeadNullRecord): Promise<void> {
  if (typeof navigator !== 'undefined' && !navigator.onLine) return;
  const sent = await sendLeadNull(n);
  if (sent.kind === 'http' && sent.status < 300) nullsOnServer.add(n.id);
}

/** Whose readings to send: only the signed-in person's own (a shared tablet keeps the others'). */
export function setOutboxUser(userId: string | null) {
  if (state.userId === userId) return;
  setState({ userId });
  void flush({ force: true });
}

/** Loads the outbox and listens for the network; once per page. */
export function startOutbox() {
  if (started || typeof window === 'undefined') return;
  started = true;
  setState({ online: connectionStore.getSnapshot() });
  connectionStore.subscribe(() => {
    const online = connectionStore.getSnapshot();
    if (online === state.online) return;
    setState({ online });
    if (online) void flush({ force: true });
  });
  startConnectionWatch();
  window.addEventListener('online', () => void flush({ force: true, evenOffline: true }));
  if ('BroadcastChannel' in window) {
    channel = new BroadcastChannel(LOCK);
    channel.onmessage = () => void load();
  }
  setInterval(() => void flush(), PERIODIC_MS);
  void load().then(() => flush({ force: true }));
}

// The technician's choices for a reading the server refused. None of them loses the value.

/** Send it again as it is (e.g. after the director re-assigned the venue). */
export async function tryAgain(id: string) {
  const incident = state.incidents.find((i) => i.id === id);
  if (incident) {
    await putIncident({ ...incident, status: 'waiting', nextAttemptAt: 0, problem: undefined });
    return void flush({ force: true });
  }
  const item = state.items.find((i) => i.id === id);
  if (!item) return;
  await put({ ...item, status: 'waiting', nextAttemptAt: 0, problem: undefined });
  void flush({ force: true });
}

/** Do not send it; it stays in the list with its value, and can be sent after all. */
export async function setAside(id: string) {
  const incident = state.incidents.find((i) => i.id === id);
  if (incident) return putIncident({ ...incident, status: 'set-aside' });
  const item = state.items.find((i) => i.id === id);
  if (item) await put({ ...item, status: 'set-aside' });
}

/** The notice was read: the reading is on the server, the item may go. */
export async function acknowledge(id: string) {
  const item = state.items.find((i) => i.id === id);
  if (item?.status === 'notice') await remove(id);
}

/**
 * Records the value on another step instead (its step was taken off the checklist). A new id:
 * it is a different reading now. The new item is on disk before the old one goes.
 */
export async function moveToStep(id: string, to: { stepId: string; where: string; preview: QueuedReading['preview'] }) {
  const item = state.items.find((i) => i.id === id);
  if (!item) return;
  const moved: QueuedReading = {
    ...item,
    id: newReadingId(),
    body: { ...item.body, id: '', stepId: to.stepId, supersedesId: undefined, correctionReason: undefined },
    where: to.where,
    preview: to.preview,
    movedFrom: item.where,
    status: 'waiting',
    attempts: 0,
    nextAttemptAt: 0,
    problem: undefined,
  };
  moved.body.id = moved.id;
  await put(moved);
  await remove(item.id);
  void flush({ force: true });
}
