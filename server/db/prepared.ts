import { sql, type Placeholder } from 'drizzle-orm';
import type { Db, Tx } from './client';

// Prepared statements made once per connection for the queries every reading write runs: building
// a Drizzle query and preparing its SQL cost several times more than running it (profiled under
// `npm run bench writes`). A statement prepared through the database or any of its transactions
// runs on the same connection, so one made outside a transaction is safe to run inside one.
const caches = new WeakMap<object, Map<string, unknown>>();

function connectionOf(db: Db | Tx): object {
  // Drizzle keeps the connection's session on every database and transaction object.
  return (db as unknown as { session: object }).session;
}

export function prepared<T>(db: Db | Tx, key: string, make: (db: Db) => T): T {
  const conn = connectionOf(db);
  let cache = caches.get(conn);
  if (!cache) caches.set(conn, (cache = new Map()));
  let stmt = cache.get(key) as T | undefined;
  if (stmt === undefined) cache.set(key, (stmt = make(db as Db)));
  return stmt;
}

/**
 * A cache key for the set of columns a row sets: an insert prepared for it leaves out the same
 * columns (their SQL defaults apply). Cheap, because it runs on every insert.
 */
export function columnsKey(row: Record<string, unknown>): string {
  let key = '';
  for (const k in row) if (row[k] !== undefined) key += key ? `,${k}` : k;
  return key;
}

/** The values of a row as named placeholders, for preparing its insert once (see columnsKey). */
export function placeholdersOf<R extends Record<string, unknown>>(row: R): Record<keyof R, Placeholder> {
  const values = {} as Record<keyof R, Placeholder>;
  for (const k in row) if (row[k] !== undefined) values[k as keyof R] = sql.placeholder(k);
  return values;
}
