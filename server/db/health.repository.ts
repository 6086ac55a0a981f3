import type Database from 'better-sqlite3';

// The health check's own write: one row of its own table rewritten and committed. A database that
// opens and reads but cannot commit (read-only file or mount, disk full, lost lock) fails here.
export function healthRepository(sqlite: Database.Database) {
  let write: Database.Statement | null = null;
  return {
    /** Throws unless a write commits. */
    probeWrite(at: string) {
      write ??= sqlite.prepare(
        'INSERT INTO health_probe (id, checked_at) VALUES (1, ?) ON CONFLICT(id) DO UPDATE SET checked_at = excluded.checked_at',
      );
      // Outside any transaction, so this statement is its own commit (synchronous=FULL: on disk).
      if (sqlite.inTransaction) throw new Error('a transaction is open on this connection');
      write.run(at);
    },
  };
}
