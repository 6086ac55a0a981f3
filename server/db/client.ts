import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import * as schema from './schema';
import { PRIVATE_DIR_MODE, PRIVATE_FILE_MODE, tighten, touchPrivateFile } from '../storage/private-files';

export type Db = BetterSQLite3Database<typeof schema>;
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
export interface Database_ {
  sqlite: Database.Database;
  db: Db;
}

const migrationsFolder = resolve(dirname(fileURLToPath(import.meta.url)), '../../migrations');

export function openDatabase(path: string, opts: { migrate?: boolean } = {}): Database_ {
  if (path !== ':memory:') {
    const file = resolve(path);
    mkdirSync(dirname(file), { recursive: true, mode: PRIVATE_DIR_MODE });
    // SQLite creates the -wal and -shm files with the database file's own permissions
    // (os_unix.c, findCreateFileMode), so a 0600 database keeps them private too.
    touchPrivateFile(file);
    tighten(`${file}-wal`, PRIVATE_FILE_MODE);
    tighten(`${file}-shm`, PRIVATE_FILE_MODE);
  }
  const sqlite = new Database(path);
  sqlite.pragma('journal_mode = WAL');
  // WAL with NORMAL can lose a committed transaction on power loss (sqlite.org, PRAGMA synchronous).
  sqlite.pragma('synchronous = FULL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  const db = drizzle(sqlite, { schema });
  // The folder is resolved from this file, not the working directory, so any cwd works.
  if (opts.migrate !== false) migrate(db, { migrationsFolder });
  return { sqlite, db };
}
