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

const MAX_GROUP = 256;
const queues = new WeakMap<Database.Database, GroupCommit>();

export interface GroupCommit {
  /**
   * Runs `work` in a transaction shared with the other writes of this turn of the event loop, in a
   * savepoint of its own. `work` runs on the same connection: it uses the database handle itself,
   * not a transaction of its own, and must be synchronous.
   */
  run<T>(work: () => T): Promise<T>;
}

export function groupCommit(sqlite: Database.Database): GroupCommit {
  let q = queues.get(sqlite);
  if (!q) queues.set(sqlite, (q = makeQueue(sqlite)));
  return q;
}

function makeQueue(sqlite: Database.Database): GroupCommit {
  const pending: Pending[] = [];
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
    const group = pending.splice(0, MAX_GROUP);
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
      return;
    }
    group.forEach((p, i) => (outcomes[i].ok ? p.resolve(outcomes[i].value) : p.reject(outcomes[i].value)));
  }

  function schedule() {
    scheduled = true;
    setImmediate(flush);
  }

  return {
    run<T>(work: () => T): Promise<T> {
      return new Promise<T>((resolve, reject) => {
        pending.push({ work, resolve: resolve as (v: unknown) => void, reject });
        if (!scheduled) schedule();
      });
    },
  };
}
