import type Database from 'better-sqlite3';

// Group commit (as databases do for their log): writes that arrive together share one COMMIT, so
// one fsync makes a whole group durable instead of one each. Each write still runs in its own
// savepoint, in arrival order, so a write that fails is rolled back alone and every write sees the
// ones before it exactly as if they had been committed one by one. A write's promise settles only
// after the COMMIT holding it has returned (synchronous=FULL: on disk), so nothing is acknowledged
// before it is durable. The group is run in one synchronous block: no other request can see it
// half-done.

interface Pending {
  work: () => unknown;
  resolve: (value: unknown) => void;
  reject: (error: unknown) => void;
}

/** Writes that go into one group together: one alone, or a batch that is never split. */
interface Unit {
  writes: Pending[];
  committed?: () => void;
  failed?: (error: unknown) => void;
}

const MAX_GROUP = 256;
const queues = new WeakMap<Database.Database, GroupCommit>();

/** Where a write is queued: the group commit itself, or a batch of it. */
export interface WriteQueue {
  /**
   * Runs `work` in a transaction shared with the other writes of this turn of the event loop, in a
   * savepoint of its own. `work` runs on the same connection: it uses the database handle itself,
   * not a transaction of its own, and must be synchronous.
   */
  run<T>(work: () => T): Promise<T>;
}

export interface GroupCommit extends WriteQueue {
  /**
   * Writes that must share one COMMIT: each `run` on the batch is a write as above (its own
   * savepoint, its own outcome), kept until `submit()`, which queues them all at once, in order,
   * in one group that is never split.
   */
  batch(): WriteBatch;
}

export interface WriteBatch extends WriteQueue {
  /** Resolves once the COMMIT holding the batch has returned; rejects when that group failed (then every write of it failed too). */
  submit(): Promise<void>;
}

export function groupCommit(sqlite: Database.Database): GroupCommit {
  let q = queues.get(sqlite);
  if (!q) queues.set(sqlite, (q = makeQueue(sqlite)));
  return q;
}

function makeQueue(sqlite: Database.Database): GroupCommit {
  const pending: Unit[] = [];
  let scheduled = false;
  // Prepared once: better-sqlite3's db.transaction() builds five wrapper functions per call, which
  // showed in the write profile when made for every write and every group.
  const begin = sqlite.prepare('BEGIN');
  const commit = sqlite.prepare('COMMIT');
  const rollback = sqlite.prepare('ROLLBACK');
  const savepoint = sqlite.prepare('SAVEPOINT group_write');
  const release = sqlite.prepare('RELEASE group_write');
  const rollbackTo = sqlite.prepare('ROLLBACK TO group_write');

  function flush() {
    scheduled = false;
    // Whole units up to MAX_GROUP writes (always at least one unit, however large).
    let take = 1;
    let count = pending[0].writes.length;
    while (take < pending.length && count + pending[take].writes.length <= MAX_GROUP) count += pending[take++].writes.length;
    const units = pending.splice(0, take);
    const group = units.flatMap((u) => u.writes);
    if (pending.length > 0) schedule();
    const outcomes: { ok: boolean; value: unknown }[] = [];
    try {
      begin.run();
      for (const p of group) {
        savepoint.run();
        try {
          const value = p.work();
          release.run();
          outcomes.push({ ok: true, value });
        } catch (error) {
          // Some SQLite errors (disk full, I/O) end the whole transaction: then nothing of the
          // group is stored, and every write of it must fail.
          if (!sqlite.inTransaction) throw error;
          rollbackTo.run();
          release.run();
          outcomes.push({ ok: false, value: error });
        }
      }
      commit.run();
    } catch (error) {
      if (sqlite.inTransaction) rollback.run();
      for (const p of group) p.reject(error);
      for (const u of units) u.failed?.(error);
      return;
    }
    group.forEach((p, i) => (outcomes[i].ok ? p.resolve(outcomes[i].value) : p.reject(outcomes[i].value)));
    for (const u of units) u.committed?.();
  }

  function schedule() {
    scheduled = true;
    setImmediate(flush);
  }

  const enqueue = (unit: Unit) => {
    pending.push(unit);
    if (!scheduled) schedule();
  };
  const write = <T>(work: () => T, into: (p: Pending) => void) =>
    new Promise<T>((resolve, reject) => into({ work, resolve: resolve as (v: unknown) => void, reject }));

  return {
    run: (work) => write(work, (p) => enqueue({ writes: [p] })),
    batch() {
      const writes: Pending[] = [];
      let submitted = false;
      return {
        run: (work) => {
          if (submitted) throw new Error('This batch was submitted already.');
          return write(work, (p) => writes.push(p));
        },
        submit: () => {
          submitted = true;
          if (writes.length === 0) return Promise.resolve();
          return new Promise<void>((committed, failed) => enqueue({ writes, committed, failed }));
        },
      };
    },
  };
}
